/**
 * The HTTP side of rooms: create a room, look up a key, rotate a key, health.
 *
 *   POST /api/rooms                      -> 201 {editKey, viewKey}
 *   GET  /api/keys/<key>                 -> 200 {role:'edit', viewKey} | {role:'view'} ; 404
 *   POST /api/rooms/<editKey>/rotate     body {"which":"edit"|"view"} -> 200 {editKey, viewKey}
 *   GET  /api/rooms/<editKey>/versions   -> 200 {versions: [{id, name, createdAt, bytes}]} newest first
 *   POST /api/rooms/<editKey>/versions   body {"name": "..."} -> 201 {id, name, createdAt, bytes}
 *   GET  /api/rooms/<editKey>/versions/<id> -> 200 application/octet-stream: the document then (a Yjs update)
 *   GET  /healthz                        -> 200 {ok, rooms, connections}
 */
import type http from 'node:http';
import { randomBytes } from 'node:crypto';
import { hashKey, isRole, isWellFormedKey, keyTag, newKey, sealViewKey, unsealViewKey } from './keys';
import type { Limits, RateLimiter } from './limits';
import type { Logger } from './log';
import { isOriginAllowed, type AllowedOrigins } from './origin';
import { closeCodes, type RoomRegistry } from './rooms';
import type { Storage } from './storage';

export class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

export interface ApiDeps {
  storage: Storage;
  rooms: RoomRegistry;
  limits: Limits;
  log: Logger;
  allowedOrigins: AllowedOrigins;
  apiLimiter: RateLimiter;
  roomLimiter: RateLimiter;
}

function sendJson(res: http.ServerResponse, status: number, body: unknown): void {
  const text = JSON.stringify(body);
  res.writeHead(status, {
    'content-type': 'application/json; charset=utf-8',
    'content-length': Buffer.byteLength(text),
    'cache-control': 'no-store',
    'x-content-type-options': 'nosniff',
  });
  res.end(text);
}

/** Reads at most `max` bytes of body; rejects with 413 beyond that. */
export function readBody(req: http.IncomingMessage, max: number): Promise<string> {
  const declared = Number(req.headers['content-length'] ?? 0);
  if (declared > max) return Promise.reject(new HttpError(413, `request body over ${max} bytes`));
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (chunk: Buffer) => {
      size += chunk.length;
      if (size > max) {
        reject(new HttpError(413, `request body over ${max} bytes`));
        req.destroy();
        return;
      }
      chunks.push(chunk);
    });
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
    req.on('error', reject);
  });
}

/** Parses the rotate body; throws HttpError(400) naming what is wrong. */
export function parseRotateBody(text: string): { which: 'edit' | 'view' } {
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw new HttpError(400, 'body must be JSON: {"which":"edit"} or {"which":"view"}');
  }
  const which = (body as { which?: unknown } | null)?.which;
  if (!isRole(which)) throw new HttpError(400, 'field "which" must be "edit" or "view"');
  return { which };
}

/** Most named versions one room keeps. */
export const MAX_VERSIONS_PER_ROOM = 200;
/** Longest version name, characters. */
export const MAX_VERSION_NAME = 80;

/** Parses the body of a new named version; throws HttpError(400) naming what is wrong. */
export function parseVersionBody(text: string): { name: string } {
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw new HttpError(400, 'body must be JSON: {"name":"..."}');
  }
  const raw = (body as { name?: unknown } | null)?.name;
  if (typeof raw !== 'string') throw new HttpError(400, 'field "name" must be a string');
  const name = raw.replace(/\s+/g, ' ').trim();
  if (name.length === 0) throw new HttpError(400, 'field "name" must not be empty');
  if (name.length > MAX_VERSION_NAME) throw new HttpError(400, `field "name" must be at most ${MAX_VERSION_NAME} characters`);
  return { name };
}

/** Route of an API path, or null when the path is not ours. Keys in the path are not validated here. */
export function matchApiRoute(pathname: string):
  | { route: 'health' }
  | { route: 'createRoom' }
  | { route: 'lookupKey'; key: string }
  | { route: 'rotate'; key: string }
  | { route: 'versions'; key: string }
  | { route: 'version'; key: string; id: number }
  | null {
  if (pathname === '/healthz') return { route: 'health' };
  if (pathname === '/api/rooms' || pathname === '/api/rooms/') return { route: 'createRoom' };
  let m = /^\/api\/keys\/([^/]*)\/?$/.exec(pathname);
  if (m) return { route: 'lookupKey', key: decodeURIComponent(m[1]) };
  m = /^\/api\/rooms\/([^/]*)\/rotate\/?$/.exec(pathname);
  if (m) return { route: 'rotate', key: decodeURIComponent(m[1]) };
  m = /^\/api\/rooms\/([^/]*)\/versions\/?$/.exec(pathname);
  if (m) return { route: 'versions', key: decodeURIComponent(m[1]) };
  m = /^\/api\/rooms\/([^/]*)\/versions\/([0-9]{1,15})\/?$/.exec(pathname);
  if (m) return { route: 'version', key: decodeURIComponent(m[1]), id: Number(m[2]) };
  return null;
}

export function createRoomWithKeys(storage: Storage): { editKey: string; viewKey: string } {
  const editKey = newKey();
  const viewKey = newKey();
  storage.createRoom({ roomId: randomBytes(16).toString('hex'), editHash: hashKey(editKey), viewHash: hashKey(viewKey), viewKeySealed: sealViewKey(viewKey, editKey) });
  return { editKey, viewKey };
}

function clientAddress(req: http.IncomingMessage): string {
  return req.socket.remoteAddress ?? 'unknown';
}

/**
 * Handles the request if its path is one of ours and returns true; returns false (and touches
 * nothing) otherwise, so the caller can pass it on (to Next).
 */
export function handleApiRequest(deps: ApiDeps, req: http.IncomingMessage, res: http.ServerResponse, health: () => unknown): boolean {
  let pathname: string;
  try {
    pathname = new URL(req.url ?? '/', 'http://localhost').pathname;
  } catch {
    return false;
  }
  let route: ReturnType<typeof matchApiRoute>;
  try {
    route = matchApiRoute(pathname);
  } catch {
    sendJson(res, 400, { error: 'bad path encoding' });
    return true;
  }
  if (!route) return false;
  void serve(deps, req, res, route, health).catch((err: unknown) => {
    if (err instanceof HttpError) {
      if (!res.headersSent) sendJson(res, err.status, { error: err.message });
      if (err.status === 413) res.once('finish', () => req.socket.destroy());
    } else {
      deps.log.error('api request failed', { route: route.route, err: String(err) });
      if (!res.headersSent) sendJson(res, 500, { error: 'internal error' });
    }
  });
  return true;
}

async function serve(
  deps: ApiDeps,
  req: http.IncomingMessage,
  res: http.ServerResponse,
  route: NonNullable<ReturnType<typeof matchApiRoute>>,
  health: () => unknown,
): Promise<void> {
  const { storage, rooms, limits, log } = deps;
  const method = req.method ?? 'GET';
  if (route.route === 'health') {
    if (method !== 'GET' && method !== 'HEAD') throw new HttpError(405, 'use GET');
    sendJson(res, 200, health());
    return;
  }
  const addr = clientAddress(req);
  if (!deps.apiLimiter.allow(addr)) throw new HttpError(429, 'too many requests, try again in a minute');
  if (method === 'POST' && !isOriginAllowed(req.headers.origin, req.headers.host, deps.allowedOrigins)) {
    throw new HttpError(403, 'origin not allowed');
  }
  switch (route.route) {
    case 'createRoom': {
      if (method !== 'POST') throw new HttpError(405, 'use POST');
      await readBody(req, limits.maxBodyBytes);
      if (!deps.roomLimiter.allow(addr)) throw new HttpError(429, 'too many rooms created from this address, try again later');
      const keys = createRoomWithKeys(storage);
      log.info('room created', { key: keyTag(keys.editKey) });
      sendJson(res, 201, keys);
      return;
    }
    case 'lookupKey': {
      if (method !== 'GET') throw new HttpError(405, 'use GET');
      const found = isWellFormedKey(route.key) ? storage.findKey(hashKey(route.key)) : null;
      if (!found) throw new HttpError(404, 'unknown key');
      if (found.role === 'edit') {
        const sealed = storage.viewKeySealed(found.roomId);
        const viewKey = sealed ? unsealViewKey(sealed, route.key) : null;
        sendJson(res, 200, viewKey ? { role: 'edit', viewKey } : { role: 'edit' });
      } else {
        sendJson(res, 200, { role: 'view' });
      }
      return;
    }
    case 'rotate': {
      if (method !== 'POST') throw new HttpError(405, 'use POST');
      const { which } = parseRotateBody(await readBody(req, limits.maxBodyBytes));
      const found = isWellFormedKey(route.key) ? storage.findKey(hashKey(route.key)) : null;
      if (!found) throw new HttpError(404, 'unknown key');
      if (found.role !== 'edit') throw new HttpError(403, 'only the edit key can rotate keys');
      const sealed = storage.viewKeySealed(found.roomId);
      const oldViewKey = sealed ? unsealViewKey(sealed, route.key) : null;
      let editKey = route.key;
      let viewKey: string;
      if (which === 'edit') {
        if (!oldViewKey) throw new HttpError(500, 'view key cannot be recovered; rotate the view key instead');
        editKey = newKey();
        viewKey = oldViewKey;
        storage.replaceKey(found.roomId, 'edit', hashKey(editKey), sealViewKey(viewKey, editKey));
      } else {
        viewKey = newKey();
        storage.replaceKey(found.roomId, 'view', hashKey(viewKey), sealViewKey(viewKey, editKey));
      }
      // each room has one live key per role, so every connection of that role came in with the old key
      const closed = rooms.closeRoleInRoom(found.roomId, which, closeCodes.keyRevoked, 'key rotated');
      log.info('key rotated', { which, key: keyTag(editKey), closed });
      sendJson(res, 200, { editKey, viewKey });
      return;
    }
    case 'versions':
    case 'version': {
      const found = isWellFormedKey(route.key) ? storage.findKey(hashKey(route.key)) : null;
      if (!found) throw new HttpError(404, 'unknown key');
      if (found.role !== 'edit') throw new HttpError(403, 'named versions need the edit link');
      if (route.route === 'version') {
        if (method !== 'GET') throw new HttpError(405, 'use GET');
        const data = storage.versionData(found.roomId, route.id);
        if (!data) throw new HttpError(404, 'no such version in this room');
        res.writeHead(200, { 'content-type': 'application/octet-stream', 'content-length': data.length, 'cache-control': 'no-store', 'x-content-type-options': 'nosniff' });
        res.end(Buffer.from(data));
        return;
      }
      if (method === 'GET') {
        sendJson(res, 200, { versions: storage.listVersions(found.roomId) });
        return;
      }
      if (method !== 'POST') throw new HttpError(405, 'use GET or POST');
      const { name } = parseVersionBody(await readBody(req, limits.maxBodyBytes));
      if (storage.versionCount(found.roomId) >= MAX_VERSIONS_PER_ROOM) throw new HttpError(409, `this room already keeps ${MAX_VERSIONS_PER_ROOM} named versions`);
      const info = storage.addVersion(found.roomId, name, rooms.currentState(found.roomId));
      log.info('version saved', { key: keyTag(route.key), id: info.id, bytes: info.bytes });
      sendJson(res, 201, info);
      return;
    }
  }
}
