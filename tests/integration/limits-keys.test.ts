import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as Y from 'yjs';
import { hashKey } from '../../server/sync/keys';
import { connectClient, createRoom, docFromStored, mapSetUpdate, rawSocket, startTestServer, syncFrame, waitFor, type TestClient } from './helpers';

let srv: Awaited<ReturnType<typeof startTestServer>>;
const clients: TestClient[] = [];
const client = (key: string) => {
  const c = connectClient(srv.wsBase, key);
  clients.push(c);
  return c;
};
beforeAll(async () => {
  srv = await startTestServer({ limits: { maxMessageBytes: 64 * 1024, maxDocBytes: 256 * 1024, compactEveryUpdates: 10 } });
});
afterAll(async () => {
  for (const c of clients) c.destroy();
  await srv.close();
});

describe('limits', () => {
  it('a malformed frame closes only that socket; an oversize frame is refused', async () => {
    const { editKey } = await createRoom(srv.base);
    const a = client(editKey);
    const b = client(editKey);
    await Promise.all([a.synced(), b.synced()]);
    const bad = [new Uint8Array([7, 1, 2]), new Uint8Array([0, 2, 50, 1]), syncFrame(2, new Uint8Array([255, 255, 255, 1, 9])), new Uint8Array([0, 9, 0])];
    for (const frame of bad) {
      const raw = rawSocket(srv.wsBase, editKey);
      await raw.opened();
      raw.ws.send(frame);
      expect((await raw.closed()).code).toBe(4400);
    }
    const big = rawSocket(srv.wsBase, editKey);
    await big.opened();
    big.ws.send(syncFrame(2, mapSetUpdate('parts', 'huge', 'x'.repeat(100 * 1024))));
    expect((await big.closed()).code).toBe(1009);
    a.doc.getMap('parts').set('still', 'syncing');
    await waitFor('others keep syncing', () => b.doc.getMap('parts').get('still') === 'syncing');
    expect(b.doc.getMap('parts').has('huge')).toBe(false);
    expect(srv.sync.health().ok).toBe(true);
  });

  it('unknown keys and foreign origins are refused', async () => {
    const raw = rawSocket(srv.wsBase, 'AAAAAAAAAAAAAAAAAAAAAA');
    expect((await raw.closed()).code).toBe(4404);
    const { editKey } = await createRoom(srv.base);
    const foreign = rawSocket(srv.wsBase, editKey, { origin: 'https://elsewhere.example' });
    await foreign.opened();
    expect(foreign.state.open).toBe(false);
    expect(String(foreign.state.error?.message)).toContain('403');
  });
});

describe('keys', () => {
  it('rotation locks out old links and closes their connections', async () => {
    const { editKey, viewKey } = await createRoom(srv.base);
    expect(await (await fetch(`${srv.base}/api/keys/${viewKey}`)).json()).toEqual({ role: 'view' });
    expect(await (await fetch(`${srv.base}/api/keys/${editKey}`)).json()).toEqual({ role: 'edit', viewKey });
    const viewer = rawSocket(srv.wsBase, viewKey);
    await viewer.opened();
    const post = (key: string, body: unknown) => fetch(`${srv.base}/api/rooms/${key}/rotate`, { method: 'POST', body: JSON.stringify(body), headers: { 'content-type': 'application/json' } });
    expect((await post(viewKey, { which: 'view' })).status).toBe(403);
    expect((await post(editKey, { which: 'nope' })).status).toBe(400);
    const r1 = (await (await post(editKey, { which: 'view' })).json()) as { editKey: string; viewKey: string };
    expect(r1.editKey).toBe(editKey);
    expect(r1.viewKey).not.toBe(viewKey);
    expect((await viewer.closed()).code).toBe(4410);
    expect((await fetch(`${srv.base}/api/keys/${viewKey}`)).status).toBe(404);
    expect((await rawSocket(srv.wsBase, viewKey).closed()).code).toBe(4404);
    const editor = rawSocket(srv.wsBase, editKey);
    await editor.opened();
    const r2 = (await (await post(editKey, { which: 'edit' })).json()) as { editKey: string; viewKey: string };
    expect(r2.viewKey).toBe(r1.viewKey);
    expect((await editor.closed()).code).toBe(4410);
    expect((await fetch(`${srv.base}/api/keys/${editKey}`)).status).toBe(404);
    expect((await post(editKey, { which: 'view' })).status).toBe(404);
    expect(await (await fetch(`${srv.base}/api/keys/${r2.editKey}`)).json()).toEqual({ role: 'edit', viewKey: r1.viewKey });
    expect((await fetch(`${srv.base}/api/rooms`, { method: 'POST', body: 'x'.repeat(10_000) })).status).toBe(413);
  });
});

describe('compaction', () => {
  it('keeps the document identical', async () => {
    const { editKey } = await createRoom(srv.base);
    const roomId = srv.sync.storage.findKey(hashKey(editKey))!.roomId;
    const a = client(editKey);
    await a.synced();
    for (let i = 0; i < 35; i++) a.doc.getMap('parts').set(`p${i % 7}`, { x: i });
    a.doc.getArray('order').insert(0, ['k1', 'k2']);
    await waitFor('compacted', () => srv.sync.stats().compactions >= 3 && srv.sync.storage.loadRoom(roomId).snapshot !== null);
    await waitFor('all applied', () => docFromStored(srv.sync.storage.loadRoom(roomId)).getArray('order').length === 2);
    const stored = srv.sync.storage.loadRoom(roomId);
    expect(stored.updates.length).toBeLessThan(10);
    const fromStore = docFromStored(stored);
    const content = (d: Y.Doc) => ({ parts: d.getMap('parts').toJSON(), order: d.getArray('order').toJSON() });
    expect(content(fromStore)).toEqual(content(a.doc));
    expect(content(fromStore).order).toEqual(['k1', 'k2']);
    expect(Y.encodeStateVector(fromStore)).toEqual(Y.encodeStateVector(a.doc));
    a.provider.destroy();
    await waitFor('unloaded', () => srv.sync.rooms.loadedRoom(roomId) === undefined);
    const after = srv.sync.storage.loadRoom(roomId);
    expect(after.updates.length).toBe(0);
    expect(content(docFromStored(after))).toEqual(content(fromStore));
    expect(Y.encodeStateVector(docFromStored(after))).toEqual(Y.encodeStateVector(fromStore));
  });
});
