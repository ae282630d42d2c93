/**
 * The sync server: rooms over the Yjs sync and awareness protocol on /sync/<key>, plus the rooms
 * API and /healthz. It attaches to any http.Server; it knows nothing of Next.
 *
 *   const sync = createSyncServer({ dbFile: 'data/dewline.sqlite' });
 *   http.createServer((req, res) => { if (!sync.handleRequest(req, res)) next(req, res); })
 *     .on('upgrade', (req, socket, head) => { if (!sync.handleUpgrade(req, socket, head)) other(req, socket, head); });
 *   ...
 *   await sync.close();
 */
import type http from 'node:http';
import type { Duplex } from 'node:stream';
import { WebSocketServer, type WebSocket } from 'ws';
import { resolveSyncConfig, type SyncConfig, type SyncConfigOptions } from './config';
import { handleApiRequest } from './http';
import { hashKey, isWellFormedKey, keyTag } from './keys';
import { createRateLimiter } from './limits';
import { createLogger, type Logger } from './log';
import { isOriginAllowed } from './origin';
import { closeCodes, createRoomRegistry } from './rooms';
import { openStorage } from './storage';

export { closeCodes } from './rooms';
export { messageRole } from './protocol';
export type { SyncConfigOptions } from './config';

export interface SyncServerOptions extends SyncConfigOptions {
  log?: Logger;
  env?: NodeJS.ProcessEnv;
}

export interface SyncHealth {
  ok: boolean;
  rooms: number;
  connections: number;
}

/** '/sync/<key>' -> key; anything else -> null. The key is not validated here. */
export function syncKeyFromUrl(url: string | undefined): string | null {
  if (!url) return null;
  const pathname = url.split('?', 1)[0];
  const m = /^\/sync\/([^/]*)$/.exec(pathname);
  if (!m) return null;
  try {
    return decodeURIComponent(m[1]);
  } catch {
    return '';
  }
}

function refuseUpgrade(socket: Duplex, status: number, text: string): void {
  socket.end(`HTTP/1.1 ${status} ${text}\r\nConnection: close\r\nContent-Length: 0\r\n\r\n`);
  socket.destroy();
}

export function createSyncServer(opts: SyncServerOptions = {}) {
  const config: SyncConfig = resolveSyncConfig(opts, opts.env ?? process.env);
  const log = opts.log ?? createLogger({ level: config.logLevel });
  const storage = openStorage(config.dbFile, { sync: config.dbSync });
  const { limits } = config;
  const rooms = createRoomRegistry({ storage, limits, log });
  const wss = new WebSocketServer({ noServer: true, maxPayload: limits.maxMessageBytes, perMessageDeflate: false, clientTracking: false });
  const apiDeps = {
    storage,
    rooms,
    limits,
    log,
    allowedOrigins: config.allowedOrigins,
    apiLimiter: createRateLimiter(limits.apiRequestsPerMinute, 60_000),
    roomLimiter: createRateLimiter(limits.roomsPerHour, 3_600_000),
  };
  const tickTimer = setInterval(() => rooms.tick(), Math.min(limits.compactIntervalMs, 10_000));
  const pingTimer = setInterval(() => rooms.ping(), limits.pingIntervalMs);
  tickTimer.unref();
  pingTimer.unref();
  let closed = false;
  const pending = new Set<WebSocket>();

  function health(): SyncHealth {
    const s = rooms.stats();
    return { ok: !closed, rooms: s.roomsLoaded, connections: s.connections };
  }

  function onSocket(ws: WebSocket, key: string): void {
    const found = isWellFormedKey(key) ? storage.findKey(hashKey(key)) : null;
    if (!found) {
      log.info('connection refused: unknown key', { key: isWellFormedKey(key) ? keyTag(key) : 'malformed' });
      ws.close(closeCodes.unknownKey, 'unknown or revoked key');
      return;
    }
    rooms.join(ws, { roomId: found.roomId, role: found.role, keyHash: hashKey(key), keyTag: keyTag(key) });
  }

  return {
    config,
    /** Serves /healthz and /api/...; returns false for any other path. */
    handleRequest(req: http.IncomingMessage, res: http.ServerResponse): boolean {
      return handleApiRequest(apiDeps, req, res, health);
    },
    /** Takes upgrades for /sync/<key>; returns false for any other path. */
    handleUpgrade(req: http.IncomingMessage, socket: Duplex, head: Buffer): boolean {
      const key = syncKeyFromUrl(req.url);
      if (key === null) return false;
      socket.on('error', () => {});
      if (closed) {
        refuseUpgrade(socket, 503, 'Service Unavailable');
        return true;
      }
      if (!isOriginAllowed(req.headers.origin, req.headers.host, config.allowedOrigins)) {
        log.warn('upgrade refused: origin not allowed', { origin: String(req.headers.origin).slice(0, 100) });
        refuseUpgrade(socket, 403, 'Forbidden');
        return true;
      }
      wss.handleUpgrade(req, socket, head, (ws) => {
        pending.add(ws);
        ws.once('close', () => pending.delete(ws));
        onSocket(ws, key);
      });
      return true;
    },
    /** Attaches to a plain http.Server (no Next): our paths, 404 for the rest. */
    attach(server: http.Server): void {
      server.on('request', (req, res) => {
        if (!this.handleRequest(req, res)) {
          res.writeHead(404, { 'content-type': 'application/json' });
          res.end(JSON.stringify({ error: 'not found' }));
        }
      });
      server.on('upgrade', (req, socket, head) => {
        if (!this.handleUpgrade(req, socket, head)) socket.destroy();
      });
    },
    health,
    stats: () => rooms.stats(),
    /** Internal: storage and rooms, for tests that inspect what was stored. */
    storage,
    rooms,
    /** Closes all connections, compacts and unloads rooms, closes the database. */
    async close(): Promise<void> {
      if (closed) return;
      closed = true;
      clearInterval(tickTimer);
      clearInterval(pingTimer);
      rooms.closeAll();
      for (const ws of pending) ws.terminate();
      await new Promise<void>((resolve) => wss.close(() => resolve()));
      storage.close();
      log.info('sync server closed');
    },
  };
}

export type SyncServer = ReturnType<typeof createSyncServer>;
