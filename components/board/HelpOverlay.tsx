'use client';
/** The list of the board's keyboard shortcuts (from the same table the key handler follows). */
import { useEffect, useRef } from 'react';
import { SHORTCUTS } from './shortcuts';
import css from './board.module.css';

export function HelpOverlay({ onClose }: { onClose: () => void }) {
  const ref = useRef<HTMLButtonElement>(null);
  useEffect(() => ref.current?.focus(), []);
  return (
    <div className={css.modalBack} onClick={onClose}>
      <div className={`${css.modal} ${css.helpModal}`} role="dialog" aria-label="Keyboard shortcuts" data-testid="help-overlay" onClick={(e) => e.stopPropagation()}>
        <h2>Keyboard shortcuts</h2>
        <div className={css.helpCols}>
          {SHORTCUTS.map((g) => (
            <section key={g.group}>
              <h3>{g.group}</h3>
              <dl>
                {g.items.map((s) => (
                  <div key={s.keys} className={css.helpRow}>
                    <dt><kbd>{s.keys}</kbd></dt>
                    <dd>{s.what}</dd>
                  </div>
                ))}
              </dl>
            </section>
          ))}
        </div>
        <p className={css.muted}>On a tablet: tap a part to pick it, drag to move it, drag with two fingers to pan, pinch to zoom.</p>
        <button ref={ref} type="button" onClick={onClose} onKeyDown={(e) => (e.key === 'Escape' || e.key === '?') && onClose()}>Close</button>
      </div>
    </div>
  );
}
