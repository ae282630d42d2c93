/** The templates: scenarios of our own, each a complete section with soil and zones. */
import type { SectionSnapshot } from '../schema';
import { basementExterior } from './basement-exterior';
import { basementInteriorFramed } from './basement-interior-framed';
import { crawlspaceUnvented } from './crawlspace-unvented';
import { slabEdgeBreak } from './slab-edge-break';

export interface Template {
  name: string;
  description: string;
  build(): SectionSnapshot;
}

export const TEMPLATES: readonly Template[] = [
  { name: 'slab-edge-break', description: 'Slab on ground with a slab-edge break and sub-slab foam', build: slabEdgeBreak },
  { name: 'basement-inside-framed', description: 'Full-height basement insulated inside with a framed wall', build: basementInteriorFramed },
  { name: 'crawlspace-unvented', description: 'Unvented crawl space with insulated walls and a ground cover on bare soil', build: crawlspaceUnvented },
  { name: 'basement-outside', description: 'Basement insulated outside, with sub-slab foam', build: basementExterior },
];

export function templateByName(name: string): Template | undefined {
  return TEMPLATES.find((t) => t.name === name);
}

/** An empty section (no parts, no zones) to start drawing on. */
export function blankSection(name = 'Untitled section'): SectionSnapshot {
  return { format: 'dewline-section', version: 1, name, description: '', materials: [], parts: [], zones: [], cuts: [], analysis: { rsiSurface: 0.25, convention: 'internal', flanking: [], ground: null } };
}
