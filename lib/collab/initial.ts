/**
 * The first content of a new room. The page that created the room keeps the starting section in
 * sessionStorage under the edit key; the edit page writes it once the document has synced with the
 * server, only if the shared document is still empty, and then forgets it. So a reload, a second
 * tab or a second person never writes it twice.
 */
import type * as Y from 'yjs';
import { docMaps, writeSnapshot } from '@/lib/section/doc';
import type { SectionSnapshot } from '@/lib/section/schema';

export const PENDING_PREFIX = 'dewline:room-start:';

export const pendingKey = (editKey: string) => PENDING_PREFIX + editKey;

/** True when nobody has written the section yet: no name, no parts, no zones. */
export function isEmptyRoom(doc: Y.Doc): boolean {
  const m = docMaps(doc);
  return m.section.size === 0 && m.parts.size === 0 && m.zones.size === 0 && m.materials.size === 0;
}

/**
 * Writes `start` into `doc` (one transaction with `origin`) when the room is still empty, and says
 * whether it did. Call only after the document synced with the server.
 */
export function initialiseRoom(doc: Y.Doc, start: SectionSnapshot, origin: unknown): boolean {
  if (!isEmptyRoom(doc)) return false;
  writeSnapshot(doc, start, origin);
  return true;
}
