'use client';
/** The palette: every part kind and zone kind; click to arm the tool, or drag onto the board. */
import { libraryMaterial } from '@/lib/materials/library';
import { PART_KINDS } from '@/lib/section/registry';
import { ZONE_KINDS } from '@/lib/section/schema';
import { useBoard } from './Canvas';
import { ZONE_TITLES } from './controller';
import { fillStyle, ZONE_STYLES } from './fills';
import { useStore } from './store';
import css from './board.module.css';

export function Palette({ className }: { className?: string }) {
  const c = useBoard();
  const { tool, readOnly } = useStore(c.ui);
  if (readOnly) return <nav className={className} aria-label="Palette" />;
  return (
    <nav className={className} aria-label="Palette" data-testid="palette">
      <h3>Parts</h3>
      {PART_KINDS.map((k) => {
        const armed = (tool.type === 'place-part' && tool.kind === k.kind) || (k.kind === 'polygon' && tool.type === 'polygon');
        const st = fillStyle(libraryMaterial(k.defaultMaterial)?.pattern);
        return (
          <button
            key={k.kind}
            type="button"
            className={`${css.tile} ${armed ? css.armed : ''}`}
            draggable
            data-testid={`palette-${k.kind}`}
            title={k.description}
            onDragStart={(e) => {
              e.dataTransfer.setData('application/x-dewline-kind', k.kind);
              e.dataTransfer.effectAllowed = 'copy';
            }}
            onClick={() => c.setTool(k.kind === 'polygon' ? { type: 'polygon' } : armed ? { type: 'select' } : { type: 'place-part', kind: k.kind })}
          >
            <span className={css.swatch} style={{ background: st.base, borderColor: st.edge }} />
            {k.title}
          </button>
        );
      })}
      <h3>Zones</h3>
      {ZONE_KINDS.map((z) => {
        const armed = tool.type === 'place-zone' && tool.kind === z;
        const zs = ZONE_STYLES[z];
        return (
          <button
            key={z}
            type="button"
            className={`${css.tile} ${armed ? css.armed : ''}`}
            draggable
            data-testid={`palette-zone-${z}`}
            onDragStart={(e) => {
              e.dataTransfer.setData('application/x-dewline-kind', `zone:${z}`);
              e.dataTransfer.effectAllowed = 'copy';
            }}
            onClick={() => c.setTool(armed ? { type: 'select' } : { type: 'place-zone', kind: z })}
          >
            <span className={css.swatch} style={{ background: zs.fill, borderColor: zs.edge, borderStyle: 'dashed' }} />
            {ZONE_TITLES[z]}
          </button>
        );
      })}
    </nav>
  );
}
