/**
 * The board's test hook: what browser tests read and drive through `window.__dewline` on every page
 * that shows a board (the private section page and the room pages).
 */
import * as Y from 'yjs';
import { readSection } from '@/lib/section/doc';
import type { BoardController } from './controller';

declare global {
  interface Window {
    __dewline?: Record<string, unknown>;
  }
}

export function boardTestHook(doc: Y.Doc, c: BoardController): Record<string, unknown> {
  return {
    doc,
    Y,
    controller: c,
    /** The section itself when the document is valid, else its problems. */
    snapshot: () => {
      const v = readSection(doc);
      return v.ok ? v.section : { problems: v.problems };
    },
    undo: () => c.undo(),
    redo: () => c.redo(),
    select: (parts: string[], zones: string[] = []) => c.select({ parts, zones }),
    selection: () => c.ui.get().selection,
    view: () => c.view.get(),
    /** Page (client) coordinates of a world point, for tests that click on the drawing. */
    toClient: (x: number, y: number) => {
      const el = document.querySelector('[data-testid="board-canvas"]') as HTMLElement;
      const r = el.getBoundingClientRect();
      const [sx, sy] = c.toScreen([x, y]);
      return { x: r.left + sx, y: r.top + sy };
    },
    partBox: (id: string) => c.section.get().resolved.parts.get(id)?.box ?? null,
    canUndo: () => c.undoManager.undoStack.length,
  };
}
