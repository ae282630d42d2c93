import { afterEach, describe, expect, it } from 'vitest';
import path from 'node:path';
import type { ChildProcess } from 'node:child_process';
import { connectClient, createRoom, spawnServer, tempDir, waitFor, type TestClient } from './helpers';

const children: ChildProcess[] = [];
const clients: TestClient[] = [];
afterEach(() => {
  for (const c of clients.splice(0)) c.destroy();
  for (const ch of children.splice(0)) if (ch.exitCode === null && ch.signalCode === null) ch.kill('SIGKILL');
});

function exited(child: ChildProcess): Promise<NodeJS.Signals | number | null> {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve(child.signalCode ?? child.exitCode);
  return new Promise((resolve) => child.once('exit', (code, signal) => resolve(signal ?? code)));
}

describe('durability', () => {
  it('an edit received by a second client survives SIGKILL of the server', async () => {
    const dbFile = path.join(tempDir(), 'rooms.sqlite');
    const first = await spawnServer(dbFile);
    children.push(first.child);
    const base = `http://127.0.0.1:${first.port}`;
    const wsBase = `ws://127.0.0.1:${first.port}/sync`;
    const { editKey, viewKey } = await createRoom(base);
    const a = connectClient(wsBase, editKey);
    const b = connectClient(wsBase, viewKey);
    clients.push(a, b);
    await Promise.all([a.synced(), b.synced()]);
    for (let i = 0; i < 25; i++) a.doc.getMap('parts').set(`p${i}`, { x: i * 0.1 });
    a.doc.getMap('parts').set('last', 'rim joist moved');
    await waitFor('second client received the edit', () => b.doc.getMap('parts').get('last') === 'rim joist moved');
    // stop the clients from reconnecting anywhere, then kill the server without any chance to flush or compact
    a.provider.disconnect();
    b.provider.disconnect();
    first.child.kill('SIGKILL');
    expect(await exited(first.child)).toBe('SIGKILL');

    const second = await spawnServer(dbFile);
    children.push(second.child);
    const c = connectClient(`ws://127.0.0.1:${second.port}/sync`, viewKey);
    clients.push(c);
    await c.synced();
    await waitFor('restarted server serves the edit', () => c.doc.getMap('parts').get('last') === 'rim joist moved');
    expect(c.doc.getMap('parts').size).toBe(26);
    expect(c.doc.getMap('parts').get('p24')).toEqual({ x: 2.4000000000000004 });
    // the old links still work after the restart: the edit key edits
    const d = connectClient(`ws://127.0.0.1:${second.port}/sync`, editKey);
    clients.push(d);
    await d.synced();
    await waitFor('edit role', () => d.role() === 'edit');
    second.child.kill('SIGTERM');
    await exited(second.child);
  }, 90_000);
});
