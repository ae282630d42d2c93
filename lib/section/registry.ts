/** The part kinds. Adding a kind: one module in ./parts and one line here. Nothing else switches on the kind. */
import type { PartKind } from './kind';
import { board } from './parts/board';
import { drainageBoard } from './parts/drainage-board';
import { footing } from './parts/footing';
import { foundationWall } from './parts/foundation-wall';
import { framedWall } from './parts/framed-wall';
import { gravel } from './parts/gravel';
import { membrane } from './parts/membrane';
import { plate } from './parts/plate';
import { polygon } from './parts/polygon';
import { rim } from './parts/rim';
import { slab } from './parts/slab';
import { soil } from './parts/soil';

export const PART_KINDS: readonly PartKind[] = [
  footing,
  foundationWall,
  slab,
  board,
  framedWall,
  plate,
  rim,
  membrane,
  gravel,
  soil,
  drainageBoard,
  polygon,
] as unknown as readonly PartKind[];

const BY_KIND = new Map(PART_KINDS.map((k) => [k.kind, k]));

export function partKind(kind: string): PartKind | undefined {
  return BY_KIND.get(kind);
}

export const PART_KIND_NAMES: readonly string[] = PART_KINDS.map((k) => k.kind);
