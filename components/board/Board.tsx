'use client';
/**
 * The board: palette, canvas, side panel and the bar above them, on any Y.Doc holding a section.
 * It knows nothing of how the document is synced: the local page gives it a fresh doc, the rooms
 * give it a shared one. Every change goes through lib/section/ops with `origin`.
 *
 * Slots: `overlay` is rendered inside the Konva stage above the parts (use <WorldLayer> to draw in
 * metres, y up); `aside` is rendered in the side column under the panel (a readout).
 */
import type { ReactNode } from 'react';
import { useEffect, useMemo, useRef, useState } from 'react';
import type * as Y from 'yjs';
import type { UnitSystem } from '@/lib/units';
import { formatLength } from '@/lib/units';
import { BoardCanvas, BoardContext, useBoard } from './Canvas';
import { renameSection } from '@/lib/section/ops';
import type { SectionState } from './controller';
import { BoardController } from './controller';
import { HelpOverlay } from './HelpOverlay';
import { Palette } from './Palette';
import { SidePanel } from './SidePanel';
import { useStore } from './store';
import { scaleBar } from './view';
import css from './board.module.css';

export interface BoardProps {
  doc: Y.Doc;
  /** The local origin of every change (Y.UndoManager tracks it; the rooms tell people apart by it). */
  origin: object;
  readOnly?: boolean;
  /** Extra Konva layers over the parts (a temperature field, isotherms, marks). */
  overlay?: ReactNode;
  /** Extra content in the side column under the panel (a readout). */
  aside?: ReactNode;
  /** Display units at start. */
  system?: UnitSystem;
  /** Called with the controller once, for the page (tests, file menu) and live work. */
  onReady?: (c: BoardController) => void;
  /** Every drawn state of the section, also during a drag (for a live preview solve). */
  onPreview?: (s: SectionState) => void;
}

export default function Board({ doc, origin, readOnly = false, overlay, aside, system, onReady, onPreview }: BoardProps) {
  const previewRef = useRef(onPreview);
  previewRef.current = onPreview;
  const controller = useMemo(() => new BoardController(doc, origin, { readOnly, system, onPreview: (s) => previewRef.current?.(s) }), [doc, origin]); // eslint-disable-line react-hooks/exhaustive-deps
  useEffect(() => () => controller.dispose(), [controller]);
  useEffect(() => controller.patchUi({ readOnly }), [controller, readOnly]);
  useEffect(() => onReady?.(controller), [controller]); // eslint-disable-line react-hooks/exhaustive-deps

  return (
    <BoardContext.Provider value={controller}>
      <BoardShell overlay={overlay} aside={aside} />
    </BoardContext.Provider>
  );
}

function download(name: string, text: string) {
  const blob = new Blob([text], { type: 'application/json' });
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

export function fileNameFor(name: string): string {
  const slug = name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'section';
  return `${slug}.dewline.json`;
}

function BoardShell({ overlay, aside }: { overlay?: ReactNode; aside?: ReactNode }) {
  const c = useBoard();
  const ui = useStore(c.ui);
  const fileInput = useRef<HTMLInputElement>(null);
  const save = () => download(fileNameFor(c.snapshot().name), c.saveText());
  const open = () => fileInput.current?.click();
  c.onSaveRequest = save;
  c.onOpenRequest = open;

  useEffect(() => {
    const typing = (t: EventTarget | null) => t instanceof HTMLElement && (t.tagName === 'INPUT' || t.tagName === 'TEXTAREA' || t.tagName === 'SELECT' || t.isContentEditable);
    const down = (e: KeyboardEvent) => {
      if (typing(e.target)) return;
      if (c.keyDown({ key: e.key, shift: e.shiftKey, ctrl: e.ctrlKey || e.metaKey, alt: e.altKey })) e.preventDefault();
    };
    const up = (e: KeyboardEvent) => c.keyUp({ key: e.key, shift: e.shiftKey, ctrl: e.ctrlKey || e.metaKey, alt: e.altKey });
    window.addEventListener('keydown', down);
    window.addEventListener('keyup', up);
    return () => {
      window.removeEventListener('keydown', down);
      window.removeEventListener('keyup', up);
    };
  }, [c]);

  return (
    <div className={css.board} data-testid="board">
      <header className={css.bar}>
        <SectionTitle />
        <div className={css.group}>
          {!ui.readOnly && <button type="button" onClick={open} title="Open a section file (Ctrl+O)" data-testid="open">Open…</button>}
          <button type="button" onClick={save} title="Save to a file (Ctrl+S)" data-testid="save">Save</button>
        </div>
        <div className={css.group}>
          <button type="button" onClick={() => c.undo()} disabled={!ui.canUndo || ui.readOnly} title="Undo (Ctrl+Z)" data-testid="undo">Undo</button>
          <button type="button" onClick={() => c.redo()} disabled={!ui.canRedo || ui.readOnly} title="Redo (Ctrl+Shift+Z)" data-testid="redo">Redo</button>
        </div>
        <div className={css.group}>
          <button type="button" onClick={() => c.fitAll()} title="Show the whole section (0)">Whole section</button>
          <button type="button" onClick={() => c.fitSelection()} title="Show the selection (F)">Selection</button>
          <button type="button" onClick={() => c.zoomBy(0.8)} title="Zoom out (-)" aria-label="Zoom out">−</button>
          <button type="button" onClick={() => c.zoomBy(1.25)} title="Zoom in (+)" aria-label="Zoom in">+</button>
        </div>
        <div className={css.group}>
          <button type="button" aria-pressed={ui.grid} className={ui.grid ? css.on : ''} onClick={() => c.patchUi({ grid: !ui.grid })} title="Grid (G)">Grid</button>
          <button type="button" aria-pressed={ui.snap} className={ui.snap ? css.on : ''} onClick={() => c.patchUi({ snap: !ui.snap })} title="Snapping (M)">Snap</button>
          <button type="button" onClick={() => c.patchUi({ system: ui.system === 'si' ? 'ip' : 'si' })} title="Units (U)" data-testid="units">{ui.system === 'si' ? 'mm' : 'in'}</button>
        </div>
        <button type="button" className={css.help} onClick={() => c.patchUi({ help: true })} title="Keyboard shortcuts (?)" data-testid="help">Keys ?</button>
        <input
          ref={fileInput}
          type="file"
          accept=".json,application/json"
          hidden
          data-testid="file-input"
          onChange={async (e) => {
            const f = e.target.files?.[0];
            e.target.value = '';
            if (f) c.openText(await f.text());
          }}
        />
      </header>
      <Palette className={css.palette} />
      <main className={css.stage}>
        <BoardCanvas overlay={overlay} className={css.canvas} />
        <ScaleBar />
        <StatusLine />
      </main>
      <aside className={css.side}>
        <SidePanel />
        {aside}
      </aside>
      {ui.help && <HelpOverlay onClose={() => c.patchUi({ help: false })} />}
      {ui.fileProblems && <FileProblems lines={ui.fileProblems} onClose={() => c.patchUi({ fileProblems: null })} />}
    </div>
  );
}


function SectionTitle() {
  const c = useBoard();
  const st = useStore(c.settled);
  const [text, setText] = useState(st.snapshot.name);
  useEffect(() => setText(st.snapshot.name), [st.snapshot.name]);
  return (
    <input
      className={css.title}
      aria-label="Section name"
      value={text}
      onChange={(e) => setText(e.target.value)}
      onBlur={() => {
        if (text !== st.snapshot.name && c.action(() => renameSection(c.doc, c.origin, text))) setText(st.snapshot.name);
      }}
      onKeyDown={(e) => e.key === 'Enter' && (e.target as HTMLInputElement).blur()}
    />
  );
}

function ScaleBar() {
  const c = useBoard();
  const v = useStore(c.view);
  const { system } = useStore(c.ui);
  const bar = scaleBar(v.k, system);
  return (
    <div className={css.scale} data-testid="scale-bar" aria-label={`Scale: the bar is ${formatLength(bar.metres, system)}`}>
      <div className={css.scaleBar} style={{ width: bar.pixels }} />
      <span>{formatLength(bar.metres, system)}</span>
    </div>
  );
}

function StatusLine() {
  const c = useBoard();
  const { message, readOnly } = useStore(c.ui);
  if (!message && !readOnly) return null;
  return (
    <div className={`${css.status} ${message?.tone === 'error' ? css.error : ''}`} role="status" data-testid="status">
      {readOnly && <strong>View only. </strong>}
      {message?.text}
      {message && (
        <button type="button" className={css.close} onClick={() => c.patchUi({ message: null })} aria-label="Dismiss">
          ×
        </button>
      )}
    </div>
  );
}

function FileProblems({ lines, onClose }: { lines: string[]; onClose: () => void }) {
  return (
    <div className={css.modalBack} onClick={onClose}>
      <div className={css.modal} role="alertdialog" aria-label="The file cannot be opened" data-testid="file-problems" onClick={(e) => e.stopPropagation()}>
        <h2>This file cannot be opened</h2>
        <p>The document on the board is unchanged. What is wrong, field by field:</p>
        <pre>{lines.join('\n')}</pre>
        <button type="button" onClick={onClose}>Close</button>
      </div>
    </div>
  );
}
