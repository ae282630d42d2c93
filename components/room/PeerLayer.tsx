'use client';
/**
 * Other people on the board: their pointers (an arrow with their name) and the outlines of what they
 * have selected, in their colour. An SVG laid over the board's canvas, so the board itself is untouched.
 */
import { createPortal } from 'react-dom';
import type { BoardController } from '@/components/board/controller';
import { useStore } from '@/components/board/store';
import type { Peer } from '@/lib/collab/presence';
import type { Box } from '@/lib/section/geometry';
import type { SectionSnapshot } from '@/lib/section/schema';

/** World box of a zone's shape. */
function zoneBox(s: SectionSnapshot, id: string): Box | null {
  const z = s.zones.find((x) => x.id === id);
  if (!z) return null;
  const sh = z.shape;
  if (sh.type === 'rect') return { minX: sh.x, minY: sh.y, maxX: sh.x + sh.width, maxY: sh.y + sh.height };
  if (sh.points.length === 0) return null;
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const [x, y] of sh.points) {
    minX = Math.min(minX, x);
    minY = Math.min(minY, y);
    maxX = Math.max(maxX, x);
    maxY = Math.max(maxY, y);
  }
  return { minX, minY, maxX, maxY };
}

export function PeerLayer({ controller: c, peers, container }: { controller: BoardController; peers: readonly Peer[]; container: HTMLElement }) {
  useStore(c.view);
  const st = useStore(c.section);
  const rect = (b: Box, key: string, colour: string, testid: string) => {
    const [x0, y0] = c.toScreen([b.minX, b.maxY]);
    const [x1, y1] = c.toScreen([b.maxX, b.minY]);
    return <rect key={key} data-testid={testid} x={Math.min(x0, x1) - 3} y={Math.min(y0, y1) - 3} width={Math.abs(x1 - x0) + 6} height={Math.abs(y1 - y0) + 6} fill="none" stroke={colour} strokeWidth={2} strokeDasharray="6 3" rx={3} />;
  };
  return createPortal(
    <svg data-testid="peer-layer" style={{ position: 'absolute', inset: 0, width: '100%', height: '100%', pointerEvents: 'none', overflow: 'hidden' }}>
      {peers.map((p) => (
        <g key={p.clientId} data-peer={p.user.name}>
          {p.selection.parts.map((id) => {
            const b = st.resolved.parts.get(id)?.box;
            return b ? rect(b, `p:${id}`, p.user.colour, `peer-selection-${id}`) : null;
          })}
          {p.selection.zones.map((id) => {
            const b = zoneBox(st.snapshot, id);
            return b ? rect(b, `z:${id}`, p.user.colour, `peer-selection-${id}`) : null;
          })}
          {p.pointer && <Pointer at={c.toScreen(p.pointer)} name={p.user.name} colour={p.user.colour} />}
        </g>
      ))}
    </svg>,
    container,
  );
}

function Pointer({ at, name, colour }: { at: [number, number]; name: string; colour: string }) {
  const [x, y] = at;
  const w = Math.min(200, 14 + name.length * 7);
  return (
    <g transform={`translate(${x} ${y})`} data-testid="peer-pointer" data-name={name}>
      <path d="M0 0 L0 16 L4.5 12 L8 19 L10.5 18 L7 11 L13 11 Z" fill={colour} stroke="#fff" strokeWidth={1.2} />
      <rect x={12} y={14} width={w} height={18} rx={4} fill={colour} />
      <text x={19} y={27} fontSize={12} fill="#fff" fontFamily="system-ui, sans-serif">{name}</text>
    </g>
  );
}
