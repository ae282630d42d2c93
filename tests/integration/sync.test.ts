import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as Y from 'yjs';
import { hashKey } from '../../server/sync/keys';
import { connectClient, createRoom, docFromStored, frameType, mapSetUpdate, rawSocket, roleOfFrame, startTestServer, syncFrame, waitFor, type TestClient } from './helpers';
import * as decoding from 'lib0/decoding';

let srv: Awaited<ReturnType<typeof startTestServer>>;
const clients: TestClient[] = [];
const keysSeen: string[] = [];
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
  // no log line ever holds a room key
  for (const key of keysSeen) for (const line of srv.logLines) expect(line).not.toContain(key);
  expect(srv.logLines.length).toBeGreaterThan(0);
});

describe('shared rooms over the stock y-websocket client', () => {
  it('two edit clients converge after concurrent edits', async () => {
    const { editKey } = await createRoom(srv.base);
    keysSeen.push(editKey);
    const a = client(editKey);
    const b = client(editKey);
    await Promise.all([a.synced(), b.synced()]);
    expect(a.role()).toBe('edit');
    expect(b.role()).toBe('edit');
    // concurrent: both edit before either sees the other
    for (let i = 0; i < 20; i++) {
      a.doc.getMap('parts').set(`a${i}`, { x: i });
      b.doc.getMap('parts').set(`b${i}`, { x: -i });
      a.doc.getArray('log').push([`a${i}`]);
      b.doc.getArray('log').push([`b${i}`]);
    }
    a.doc.getMap('parts').set('shared', 'from a');
    b.doc.getMap('parts').set('shared', 'from b');
    await waitFor('convergence', () => a.doc.getMap('parts').size === 41 && b.doc.getMap('parts').size === 41 && a.doc.getArray('log').length === 40 && b.doc.getArray('log').length === 40);
    expect(a.doc.getMap('parts').toJSON()).toEqual(b.doc.getMap('parts').toJSON());
    expect(a.doc.getArray('log').toJSON()).toEqual(b.doc.getArray('log').toJSON());
    expect(Y.encodeStateVector(a.doc)).toEqual(Y.encodeStateVector(b.doc));
    // a third client joining later gets the same document from the server
    const c = client(editKey);
    await c.synced();
    await waitFor('late joiner', () => c.doc.getMap('parts').size === 41);
    expect(c.doc.getMap('parts').toJSON()).toEqual(a.doc.getMap('parts').toJSON());
    // and storage holds it too
    const roomId = srv.sync.storage.findKey(hashKey(editKey))!.roomId;
    expect(docFromStored(srv.sync.storage.loadRoom(roomId)).getMap('parts').toJSON()).toEqual(a.doc.getMap('parts').toJSON());
  });

  it('view-key updates reach neither other clients nor storage, while the viewer still receives updates and its awareness is relayed', async () => {
    const { editKey, viewKey } = await createRoom(srv.base);
    keysSeen.push(editKey, viewKey);
    const editor = client(editKey);
    const viewer = client(viewKey);
    await Promise.all([editor.synced(), viewer.synced()]);
    expect(viewer.role()).toBe('view');
    const droppedBefore = srv.sync.stats().viewUpdatesDropped;
    viewer.doc.getMap('parts').set('sneaky', 'viewer edit');
    await waitFor('server dropped the view update', () => srv.sync.stats().viewUpdatesDropped > droppedBefore);
    editor.doc.getMap('parts').set('real', 'editor edit');
    await waitFor('viewer receives the editor edit', () => viewer.doc.getMap('parts').get('real') === 'editor edit');
    // the viewer's pointer shows for the editor
    viewer.provider.awareness.setLocalStateField('pointer', { x: 1.5, y: -0.25 });
    await waitFor('viewer awareness relayed', () => (editor.provider.awareness.getStates().get(viewer.doc.clientID) as { pointer?: unknown } | undefined)?.pointer !== undefined);
    expect(editor.doc.getMap('parts').has('sneaky')).toBe(false);
    const roomId = srv.sync.storage.findKey(hashKey(editKey))!.roomId;
    const stored = docFromStored(srv.sync.storage.loadRoom(roomId));
    expect(stored.getMap('parts').get('real')).toBe('editor edit');
    expect(stored.getMap('parts').has('sneaky')).toBe(false);
    // a fresh client sees only the editor's edit
    const fresh = client(editKey);
    await fresh.synced();
    await waitFor('fresh client has the edit', () => fresh.doc.getMap('parts').get('real') === 'editor edit');
    expect(fresh.doc.getMap('parts').has('sneaky')).toBe(false);
  });

  it('a hand-encoded update frame on a raw websocket with the view key changes nothing', async () => {
    const { editKey, viewKey } = await createRoom(srv.base);
    keysSeen.push(editKey, viewKey);
    const editor = client(editKey);
    await editor.synced();
    editor.doc.getMap('parts').set('wall', 'concrete');
    const roomId = srv.sync.storage.findKey(hashKey(editKey))!.roomId;
    await waitFor('edit stored', () => docFromStored(srv.sync.storage.loadRoom(roomId)).getMap('parts').get('wall') === 'concrete');
    const storedBefore = srv.sync.storage.loadRoom(roomId);
    const editorFrames: number[] = [];
    editor.doc.on('update', (_u: Uint8Array, origin: unknown) => {
      if (origin === editor.provider) editorFrames.push(1);
    });

    const raw = rawSocket(srv.wsBase, viewKey);
    await raw.opened();
    await waitFor('role frame', () => raw.frames.length >= 1);
    expect(roleOfFrame(raw.frames[0])).toBe('view');
    // sync update (type 0, step 2 = update) and sync step 2 (step 1), both with a real Yjs update
    raw.ws.send(syncFrame(2, mapSetUpdate('parts', 'wall', 'deleted by viewer')));
    raw.ws.send(syncFrame(1, mapSetUpdate('parts', 'intruder', true)));
    // barrier: ask for the document (sync step 1 with an empty state vector) on the same socket;
    // the server handles one socket's frames in order, so the reply comes after both updates were handled
    const before = raw.frames.length;
    raw.ws.send(syncFrame(0, Y.encodeStateVector(new Y.Doc())));
    await waitFor('sync step 2 reply', () => raw.frames.slice(before).some((f) => frameType(f) === 0));
    const reply = raw.frames.slice(before).find((f) => frameType(f) === 0)!;
    const d = decoding.createDecoder(reply);
    decoding.readVarUint(d);
    expect(decoding.readVarUint(d)).toBe(1);
    const fromServer = new Y.Doc();
    Y.applyUpdate(fromServer, decoding.readVarUint8Array(d));
    expect(fromServer.getMap('parts').toJSON()).toEqual({ wall: 'concrete' });
    // socket still open: read-only, not malformed
    expect(raw.state.close).toBeUndefined();
    // nothing reached the editor, nothing reached storage
    editor.doc.getMap('parts').set('after', 1);
    await waitFor('after stored', () => srv.sync.storage.loadRoom(roomId).updates.length > storedBefore.updates.length);
    expect(editorFrames).toEqual([]);
    expect(editor.doc.getMap('parts').toJSON()).toEqual({ wall: 'concrete', after: 1 });
    const stored = srv.sync.storage.loadRoom(roomId);
    expect(docFromStored(stored).getMap('parts').toJSON()).toEqual({ wall: 'concrete', after: 1 });
    expect(stored.updates.length).toBe(storedBefore.updates.length + 1);
    raw.ws.close();
  });

  it('the server sends the role message first, and sync step 1 only to edit connections', async () => {
    const { editKey, viewKey } = await createRoom(srv.base);
    keysSeen.push(editKey, viewKey);
    const e = rawSocket(srv.wsBase, editKey);
    const v = rawSocket(srv.wsBase, viewKey);
    await Promise.all([e.opened(), v.opened()]);
    await waitFor('edit frames', () => e.frames.length >= 2);
    expect(roleOfFrame(e.frames[0])).toBe('edit');
    expect(frameType(e.frames[1])).toBe(0);
    await waitFor('view role', () => v.frames.length >= 1);
    expect(roleOfFrame(v.frames[0])).toBe('view');
    const stepOf = (f: Uint8Array) => {
      const d = decoding.createDecoder(f);
      decoding.readVarUint(d);
      return decoding.readVarUint(d);
    };
    expect(stepOf(e.frames[1])).toBe(0); // sync step 1: the server asks the editor for what it lacks
    // the viewer asks for the document; the only sync frame it ever gets is that answer (step 2)
    const before = v.frames.length;
    v.ws.send(syncFrame(0, Y.encodeStateVector(new Y.Doc())));
    await waitFor('reply', () => v.frames.length > before);
    const syncFrames = v.frames.filter((f) => frameType(f) === 0);
    expect(syncFrames.length).toBe(1);
    expect(stepOf(syncFrames[0])).toBe(1);
    expect(v.state.close).toBeUndefined();
    e.ws.close();
    v.ws.close();
  });
});
