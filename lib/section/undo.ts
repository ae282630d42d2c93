/** Per-person undo: a Y.UndoManager over the section's maps that tracks only the given origin. */
import * as Y from 'yjs';
import { docMaps } from './doc';

export function createUndoManager(doc: Y.Doc, origin: unknown, captureTimeout = 400): Y.UndoManager {
  const m = docMaps(doc);
  return new Y.UndoManager([m.section, m.parts, m.zones, m.materials, m.cuts], { trackedOrigins: new Set([origin]), captureTimeout });
}
