/**
 * Group commit: updates that arrive in the same turn of the server's event loop are stored in one
 * SQLite transaction before any of them is broadcast; every one is stored and delivered in order.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashKey } from '../../server/sync/keys';
import { connectClient, createRoom, docFromStored, startTestServer, waitFor, type TestClient } from './helpers';

let srv: Awaited<ReturnType<typeof startTestServer>>;
const clients: TestClient[] = [];
beforeAll(async () => {
  srv = await startTestServer();
});
afterAll(async () => {
  for (const c of clients) c.destroy();
  await srv.close();
});

describe('group commit of updates', () => {
  it('a burst from three clients is stored in fewer commits than updates, and everyone gets every update', async () => {
    const { editKey } = await createRoom(srv.base);
    const roomId = srv.sync.storage.findKey(hashKey(editKey))!.roomId;
    const cs = [0, 1, 2].map(() => connectClient(srv.wsBase, editKey));
    clients.push(...cs);
    await Promise.all(cs.map((c) => c.synced()));
    const before = srv.sync.stats();
    // each set is its own transaction, so its own update message
    for (let i = 0; i < 40; i++) for (const [k, c] of cs.entries()) c.doc.getArray(`log${k}`).push([i]);
    await waitFor('all updates everywhere', () => cs.every((c) => [0, 1, 2].every((k) => c.doc.getArray(`log${k}`).length === 40)));
    const after = srv.sync.stats();
    const stored = after.updatesStored - before.updatesStored;
    const commits = after.commits - before.commits;
    expect(stored).toBe(120);
    expect(commits).toBeGreaterThan(0);
    expect(commits).toBeLessThan(stored);
    // order within each client's stream is kept, and storage rebuilds the same document
    for (const c of cs) for (const k of [0, 1, 2]) expect(c.doc.getArray(`log${k}`).toJSON()).toEqual(Array.from({ length: 40 }, (_, i) => i));
    const fromStore = docFromStored(srv.sync.storage.loadRoom(roomId));
    for (const k of [0, 1, 2]) expect(fromStore.getArray(`log${k}`).toJSON()).toEqual(cs[0].doc.getArray(`log${k}`).toJSON());
  });

  it('a batch reaches a listener as fewer frames than updates, each stored before it is sent', async () => {
    const { editKey } = await createRoom(srv.base);
    const roomId = srv.sync.storage.findKey(hashKey(editKey))!.roomId;
    const writer = connectClient(srv.wsBase, editKey);
    const listener = connectClient(srv.wsBase, editKey);
    clients.push(writer, listener);
    await Promise.all([writer.synced(), listener.synced()]);
    // count the listener's incoming sync frames, and check storage already holds each one's content
    let frames = 0;
    let ahead = 0;
    listener.provider.ws!.addEventListener('message', () => {
      frames++;
      const stored = docFromStored(srv.sync.storage.loadRoom(roomId)).getArray('burst').length;
      if (stored < listener.doc.getArray('burst').length) ahead++;
    });
    const before = srv.sync.stats().mergedBroadcasts;
    for (let i = 0; i < 60; i++) writer.doc.getArray('burst').push([i]);
    await waitFor('listener has the burst', () => listener.doc.getArray('burst').length === 60);
    expect(listener.doc.getArray('burst').toJSON()).toEqual(Array.from({ length: 60 }, (_, i) => i));
    expect(srv.sync.stats().mergedBroadcasts).toBeGreaterThan(before);
    expect(frames).toBeLessThan(60);
    expect(ahead).toBe(0);
  });
});
