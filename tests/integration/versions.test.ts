/**
 * Named versions on the real sync server: saved from the server's copy of the document, listed,
 * fetched, and restored by a client as a forward change that reaches the other clients.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as Y from 'yjs';
import { writeSnapshot, readSection } from '../../lib/section/doc';
import { deleteParts, renameSection } from '../../lib/section/ops';
import { templateByName } from '../../lib/section/templates/index';
import { createUndoManager } from '../../lib/section/undo';
import { fetchVersion, listVersions, RoomApiError, saveVersion } from '../../lib/collab/api';
import { restoreVersion, sectionOfVersion } from '../../lib/collab/versions';
import { hashKey } from '../../server/sync/keys';
import { connectClient, createRoom, startTestServer, waitFor, type TestClient } from './helpers';

let srv: Awaited<ReturnType<typeof startTestServer>>;
const clients: TestClient[] = [];
const client = (key: string) => {
  const c = connectClient(srv.wsBase, key);
  clients.push(c);
  return c;
};

beforeAll(async () => {
  srv = await startTestServer();
});
afterAll(async () => {
  for (const c of clients) c.destroy();
  await srv.close();
});

const partIds = (doc: Y.Doc) => {
  const v = readSection(doc);
  if (!v.ok) throw new Error('invalid section');
  return v.section.parts.map((p) => p.id).sort();
};

async function status(p: Promise<unknown>): Promise<number> {
  try {
    await p;
    return 200;
  } catch (err) {
    if (err instanceof RoomApiError) return err.status;
    throw err;
  }
}

describe('named versions', () => {
  it('a saved version restores a deleted part as a new change that reaches the other client', async () => {
    const { editKey } = await createRoom(srv.base);
    const a = client(editKey);
    const b = client(editKey);
    await Promise.all([a.synced(), b.synced()]);
    const tpl = templateByName('slab-edge-break')!.build();
    writeSnapshot(a.doc, tpl, 'init');
    const allIds = tpl.parts.map((p) => p.id).sort();
    await waitFor('b has the section', () => b.doc.getMap('parts').size === tpl.parts.length);

    const v1 = await saveVersion(editKey, '  before   the review ', srv.base);
    expect(v1.name).toBe('before the review');
    expect(v1.bytes).toBeGreaterThan(100);
    // the stored version is the server's document at that moment
    expect(sectionOfVersion(await fetchVersion(editKey, v1.id, srv.base)).parts.map((p) => p.id).sort()).toEqual(allIds);

    // someone else deletes a part and renames the section
    const victim = tpl.parts[tpl.parts.length - 1].id;
    const bOrigin = { who: 'b' };
    deleteParts(b.doc, bOrigin, [victim]);
    renameSection(b.doc, bOrigin, 'Renamed by mistake');
    await waitFor('a sees the delete', () => !a.doc.getMap('parts').has(victim));
    const v2 = await saveVersion(editKey, 'after the delete', srv.base);
    const listed = await listVersions(editKey, srv.base);
    expect(listed.map((v) => v.name)).toEqual(['after the delete', 'before the review']);
    expect(listed.map((v) => v.id)).toEqual([v2.id, v1.id]);

    // a restores the first version: a forward change, undoable by a alone
    const aOrigin = { who: 'a' };
    const undo = createUndoManager(a.doc, aOrigin);
    const clockBefore = Y.encodeStateVector(a.doc);
    const changed = restoreVersion(a.doc, await fetchVersion(editKey, v1.id, srv.base), aOrigin);
    expect(changed).toBe(2); // the deleted part and the section name
    expect(partIds(a.doc)).toEqual(allIds);
    expect(Y.encodeStateVector(a.doc)).not.toEqual(clockBefore);
    await waitFor('b sees the restore', () => b.doc.getMap('parts').has(victim) && b.doc.getMap('section').get('name') === tpl.name);
    expect(partIds(b.doc)).toEqual(allIds);
    expect(undo.undoStack.length).toBe(1);
    undo.undo();
    expect(a.doc.getMap('parts').has(victim)).toBe(false);
    await waitFor('b sees the undo of the restore', () => !b.doc.getMap('parts').has(victim));
    // the later version is untouched by all this
    expect(sectionOfVersion(await fetchVersion(editKey, v2.id, srv.base)).parts.some((p) => p.id === victim)).toBe(false);
  });

  it('a version of an unloaded room is taken from storage', async () => {
    const { editKey } = await createRoom(srv.base);
    const a = client(editKey);
    await a.synced();
    writeSnapshot(a.doc, templateByName('basement-outside')!.build(), 'init');
    const n = a.doc.getMap('parts').size;
    a.provider.disconnect();
    const roomId = srv.sync.storage.findKey(hashKey(editKey))!.roomId;
    await waitFor('room unloaded', () => srv.sync.rooms.loadedRoom(roomId) === undefined);
    const v = await saveVersion(editKey, 'from storage', srv.base);
    expect(sectionOfVersion(await fetchVersion(editKey, v.id, srv.base)).parts.length).toBe(n);
  });

  it('refuses bad names, view keys, unknown keys and other rooms\' versions', async () => {
    const r1 = await createRoom(srv.base);
    const r2 = await createRoom(srv.base);
    const v = await saveVersion(r1.editKey, 'one', srv.base);
    expect(await status(saveVersion(r1.editKey, '   ', srv.base))).toBe(400);
    expect(await status(saveVersion(r1.editKey, 'x'.repeat(81), srv.base))).toBe(400);
    const raw = await fetch(`${srv.base}/api/rooms/${r1.editKey}/versions`, { method: 'POST', body: '{"name": 5}' });
    expect(raw.status).toBe(400);
    expect(((await raw.json()) as { error: string }).error).toContain('"name"');
    expect(await status(saveVersion(r1.viewKey, 'by a viewer', srv.base))).toBe(403);
    expect(await status(listVersions(r1.viewKey, srv.base))).toBe(403);
    expect(await status(fetchVersion(r1.viewKey, v.id, srv.base))).toBe(403);
    expect(await status(listVersions('A'.repeat(22), srv.base))).toBe(404);
    expect(await status(fetchVersion(r2.editKey, v.id, srv.base))).toBe(404);
    expect(await listVersions(r2.editKey, srv.base)).toEqual([]);
    expect((await listVersions(r1.editKey, srv.base)).length).toBe(1);
  });
});
