/**
 * The rooms API as seen from a client (browser or Node): plain fetch calls that return parsed bodies
 * or throw a RoomApiError carrying the server's message. `base` is '' in the browser (same origin).
 */

export type Role = 'edit' | 'view';

export interface RoomKeys {
  editKey: string;
  viewKey: string;
}

export interface VersionInfo {
  id: number;
  name: string;
  createdAt: number;
  bytes: number;
}

export class RoomApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

/** The shape of key the server issues: 22 characters of base64url (see docs/rooms.md). */
export function isRoomKey(value: unknown): value is string {
  return typeof value === 'string' && /^[A-Za-z0-9_-]{22}$/.test(value);
}

async function call(url: string, init?: RequestInit): Promise<Response> {
  let res: Response;
  try {
    res = await fetch(url, init);
  } catch (err) {
    throw new RoomApiError(0, `the server cannot be reached (${(err as Error).message})`);
  }
  if (!res.ok) {
    let text = `${res.status} ${res.statusText}`;
    try {
      const body = (await res.json()) as { error?: unknown };
      if (typeof body.error === 'string') text = body.error;
    } catch {
      // not JSON: keep the status line
    }
    throw new RoomApiError(res.status, text);
  }
  return res;
}

const json = (body: unknown): RequestInit => ({ method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });

export async function createRoom(base = ''): Promise<RoomKeys> {
  return (await (await call(`${base}/api/rooms`, { method: 'POST' })).json()) as RoomKeys;
}

/** The role a key opens (and, for an edit key, the room's view key); 404 -> RoomApiError. */
export async function lookupKey(key: string, base = ''): Promise<{ role: Role; viewKey?: string }> {
  return (await (await call(`${base}/api/keys/${encodeURIComponent(key)}`)).json()) as { role: Role; viewKey?: string };
}

export async function rotateKey(editKey: string, which: Role, base = ''): Promise<RoomKeys> {
  return (await (await call(`${base}/api/rooms/${encodeURIComponent(editKey)}/rotate`, json({ which }))).json()) as RoomKeys;
}

export async function listVersions(editKey: string, base = ''): Promise<VersionInfo[]> {
  return ((await (await call(`${base}/api/rooms/${encodeURIComponent(editKey)}/versions`)).json()) as { versions: VersionInfo[] }).versions;
}

export async function saveVersion(editKey: string, name: string, base = ''): Promise<VersionInfo> {
  return (await (await call(`${base}/api/rooms/${encodeURIComponent(editKey)}/versions`, json({ name }))).json()) as VersionInfo;
}

/** The document of a named version, as a Yjs update. */
export async function fetchVersion(editKey: string, id: number, base = ''): Promise<Uint8Array> {
  return new Uint8Array(await (await call(`${base}/api/rooms/${encodeURIComponent(editKey)}/versions/${id}`)).arrayBuffer());
}
