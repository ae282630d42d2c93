'use client';
/**
 * "Sheet" link for a page that holds a live document: leaves the current section in sessionStorage
 * (as the home page does for an opened file) and opens /sheet?open=1 in a new tab, or links to
 * /sheet?key=<key> when the page belongs to a shared room.
 */
import type * as Y from 'yjs';
import { readSection } from '@/lib/section/doc';

export const SHEET_OPEN_KEY = 'dewline:open';

export function SheetLink({ doc, roomKey, style }: { doc?: Y.Doc; roomKey?: string; style?: React.CSSProperties }) {
  const css: React.CSSProperties = { position: 'fixed', right: 12, bottom: 12, zIndex: 50, padding: '4px 10px', border: '1px solid #777', borderRadius: 3, background: '#fff', color: '#111', font: '13px Helvetica, Arial, sans-serif', textDecoration: 'none', cursor: 'pointer', ...style };
  if (roomKey) return <a href={`/sheet?key=${encodeURIComponent(roomKey)}`} target="_blank" rel="opener" style={css} data-testid="sheet-link">Sheet</a>;
  return (
    <button
      type="button"
      style={css}
      data-testid="sheet-link"
      title="The printable sheet of this section, with PDF, PNG and SVG downloads"
      onClick={() => {
        if (!doc) return;
        const v = readSection(doc);
        if (!v.ok) { alert(`The section has problems and cannot be put on a sheet yet:\n${v.problems.map((p) => `${p.path}: ${p.message}`).join('\n')}`); return; }
        sessionStorage.setItem(SHEET_OPEN_KEY, JSON.stringify(v.section));
        window.open('/sheet?open=1', '_blank');
      }}
    >
      Sheet
    </button>
  );
}
