/**
 * Real parts for integration tests: a sync server on a random loopback port (in this process or as a
 * child process), SQLite files in a temp dir, y-websocket clients over `ws`, raw websockets.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import * as Y from 'yjs';
import * as encoding from 'lib0/encoding';
import * as decoding from 'lib0/decoding';
import WebSocket from 'ws';
import { WebsocketProvider } from 'y-websocket';
import { startSyncServer } from '../../server/sync-main';
import { createLogger } from '../../server/sync/log';
import type { Limits } from '../../server/sync/limits';
import type { SyncConfigOptions } from '../../server/sync/config';
import { messageRole, readRole } from '../../server/sync/protocol';
import type { Role } from '../../server/sync/keys';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

export function tempDir(prefix = 'dewline-it-'): string {
  return fs.mkdtempSync(path.join(os.tmpdir(), prefix));
}

export async function waitFor(what: string, cond: () => boolean, timeoutMs = 10_000): Promise<void> {
  const t0 = Date.now();
  while (!cond()) {
    if (Date.now() - t0 > timeoutMs) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 10));
  }
}

/** In-process sync server on 127.0.0.1:<random>, logs captured in `logLines`. */
export async function startTestServer(opts: { dir?: string; limits?: Partial<Limits>; allowedOrigins?: SyncConfigOptions['allowedOrigins'] } = {}) {
  const dir = opts.dir ?? tempDir();
  const logLines: string[] = [];
  const s = await startSyncServer({
    port: 0,
    host: '127.0.0.1',
    dbFile: path.join(dir, 'rooms.sqlite'),
    limits: opts.limits,
    allowedOrigins: opts.allowedOrigins,
    log: createLogger({ level: 'debug', write: (line) => void logLines.push(line) }),
    env: {} as NodeJS.ProcessEnv,
  });
  return { ...s, dir, logLines, base: `http://127.0.0.1:${s.port}`, wsBase: `ws://127.0.0.1:${s.port}/sync` };
}

export async function createRoom(base: string): Promise<{ editKey: string; viewKey: string }> {
  const res = await fetch(`${base}/api/rooms`, { method: 'POST' });
  if (res.status !== 201) throw new Error(`POST /api/rooms: ${res.status}`);
  return (await res.json()) as { editKey: string; viewKey: string };
}

export interface TestClient {
  doc: Y.Doc;
  provider: WebsocketProvider;
  /** role announced by the server's role message (undefined until it arrives) */
  role(): Role | undefined;
  closes: { code: number; reason: string }[];
  synced(): Promise<void>;
  destroy(): void;
}

/** A stock y-websocket client (Node, `ws`), with a handler for the role message. */
export function connectClient(wsBase: string, key: string): TestClient {
  const doc = new Y.Doc();
  const provider = new WebsocketProvider(wsBase, key, doc, {
    WebSocketPolyfill: WebSocket as unknown as typeof globalThis.WebSocket,
    disableBc: true,
    maxBackoffTime: 500,
  });
  let role: Role | undefined;
  provider.messageHandlers[messageRole] = (_encoder, decoder) => {
    role = readRole(decoder);
  };
  const closes: { code: number; reason: string }[] = [];
  provider.on('connection-close', (event) => {
    if (event) closes.push({ code: event.code, reason: String(event.reason) });
  });
  return {
    doc,
    provider,
    role: () => role,
    closes,
    synced: () => waitFor('client synced', () => provider.synced, 15_000),
    destroy() {
      provider.destroy();
      doc.destroy();
    },
  };
}

/** A raw websocket to /sync/<key> that records every binary frame it receives and how it closed. */
export function rawSocket(wsBase: string, key: string, headers: Record<string, string> = {}) {
  const ws = new WebSocket(`${wsBase}/${key}`, { headers });
  const frames: Uint8Array[] = [];
  const state: { open: boolean; close?: { code: number; reason: string }; error?: Error } = { open: false };
  ws.on('open', () => (state.open = true));
  ws.on('message', (data: Buffer) => frames.push(new Uint8Array(data)));
  ws.on('close', (code, reason) => (state.close = { code, reason: reason.toString() }));
  ws.on('error', (err) => (state.error = err));
  return {
    ws,
    frames,
    state,
    opened: () => waitFor('raw socket open', () => state.open || state.close !== undefined || state.error !== undefined),
    closed: () => waitFor('raw socket close', () => state.close !== undefined, 10_000).then(() => state.close!),
  };
}

/** Message type of a frame (first varUint). */
export function frameType(frame: Uint8Array): number {
  return decoding.readVarUint(decoding.createDecoder(frame));
}

export function roleOfFrame(frame: Uint8Array): Role {
  const d = decoding.createDecoder(frame);
  if (decoding.readVarUint(d) !== messageRole) throw new Error('not a role frame');
  return readRole(d);
}

/** Hand-encoded sync frame: [0 messageSync][step][varUint8Array payload]. */
export function syncFrame(step: number, payload: Uint8Array): Uint8Array {
  const e = encoding.createEncoder();
  encoding.writeVarUint(e, 0);
  encoding.writeVarUint(e, step);
  encoding.writeVarUint8Array(e, payload);
  return encoding.toUint8Array(e);
}

/** A Yjs update that sets map `name`[key] = value, made on a fresh doc. */
export function mapSetUpdate(name: string, key: string, value: unknown): Uint8Array {
  const d = new Y.Doc();
  d.getMap(name).set(key, value);
  const u = Y.encodeStateAsUpdate(d);
  d.destroy();
  return u;
}

/** The document a room's storage holds (snapshot then updates), rebuilt from the rows. */
export function docFromStored(stored: { snapshot: Uint8Array | null; updates: { data: Uint8Array }[] }): Y.Doc {
  const d = new Y.Doc();
  if (stored.snapshot) Y.applyUpdate(d, stored.snapshot);
  for (const u of stored.updates) Y.applyUpdate(d, u.data);
  return d;
}

/** The sync server as a child process (`node --import tsx server/sync-main.ts`), so it can be SIGKILLed. */
export async function spawnServer(dbFile: string): Promise<{ child: ChildProcess; port: number; stderr: () => string }> {
  const child = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'server/sync-main.ts'), '--port', '0', '--host', '127.0.0.1', '--db', dbFile], {
    cwd: root,
    env: { ...process.env, DEWLINE_LOG_LEVEL: 'info' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  let err = '';
  child.stderr!.on('data', (d) => (err += d));
  const port = await new Promise<number>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`server child did not start in 30 s; stderr: ${err}`)), 30_000);
    child.stdout!.on('data', (d) => {
      out += d;
      const line = out.split('\n')[0];
      if (out.includes('\n')) {
        clearTimeout(timer);
        resolve((JSON.parse(line) as { port: number }).port);
      }
    });
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`server child exited (${code}) before listening; stderr: ${err}`));
    });
  });
  return { child, port, stderr: () => err };
}
