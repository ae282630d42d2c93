/**
 * Limits and their defaults, and a small per-address rate limiter for the HTTP API.
 * Every limit can be set by option or environment variable (see config.ts and docs/rooms.md).
 */

export interface Limits {
  /** largest websocket message accepted, bytes (bigger: close 1009) */
  maxMessageBytes: number;
  /** largest stored document (snapshot plus pending updates), bytes (bigger: the update is refused, close 4413) */
  maxDocBytes: number;
  /** most simultaneous connections in one room (more: close 4503) */
  maxConnectionsPerRoom: number;
  /** most simultaneous sync connections in the whole process (more: close 4503) */
  maxConnections: number;
  /** largest HTTP request body on the API, bytes (bigger: 413) */
  maxBodyBytes: number;
  /** API requests per minute per client address (more: 429) */
  apiRequestsPerMinute: number;
  /** rooms created per hour per client address (more: 429) */
  roomsPerHour: number;
  /** compact a room after this many appended updates */
  compactEveryUpdates: number;
  /** compact a room that has pending updates at least this often, ms */
  compactIntervalMs: number;
  /** websocket ping interval; a connection that misses one pong is dropped, ms */
  pingIntervalMs: number;
}

export const defaultLimits: Readonly<Limits> = Object.freeze({
  maxMessageBytes: 1024 * 1024,
  maxDocBytes: 16 * 1024 * 1024,
  maxConnectionsPerRoom: 100,
  maxConnections: 2000,
  maxBodyBytes: 4 * 1024,
  apiRequestsPerMinute: 120,
  roomsPerHour: 60,
  compactEveryUpdates: 500,
  compactIntervalMs: 60_000,
  pingIntervalMs: 30_000,
});

/** Environment variable for each limit. */
export const limitEnvNames: Readonly<Record<keyof Limits, string>> = Object.freeze({
  maxMessageBytes: 'DEWLINE_MAX_MESSAGE_BYTES',
  maxDocBytes: 'DEWLINE_MAX_DOC_BYTES',
  maxConnectionsPerRoom: 'DEWLINE_MAX_CONNECTIONS_PER_ROOM',
  maxConnections: 'DEWLINE_MAX_CONNECTIONS',
  maxBodyBytes: 'DEWLINE_MAX_BODY_BYTES',
  apiRequestsPerMinute: 'DEWLINE_API_REQUESTS_PER_MINUTE',
  roomsPerHour: 'DEWLINE_ROOMS_PER_HOUR',
  compactEveryUpdates: 'DEWLINE_COMPACT_EVERY_UPDATES',
  compactIntervalMs: 'DEWLINE_COMPACT_INTERVAL_MS',
  pingIntervalMs: 'DEWLINE_PING_INTERVAL_MS',
});

/** Parses a positive integer limit; throws a clear error naming the source otherwise. */
export function parseLimit(name: string, raw: string): number {
  const n = Number(raw);
  if (!/^\d+$/.test(raw.trim()) || !Number.isSafeInteger(n) || n <= 0) {
    throw new Error(`${name} must be a positive integer, got ${JSON.stringify(raw)}`);
  }
  return n;
}

/** Defaults, overridden by the environment, overridden by explicit options. */
export function resolveLimits(overrides: Partial<Limits> = {}, env: NodeJS.ProcessEnv = process.env): Limits {
  const out: Limits = { ...defaultLimits };
  for (const k of Object.keys(defaultLimits) as (keyof Limits)[]) {
    const raw = env[limitEnvNames[k]];
    if (raw !== undefined && raw !== '') out[k] = parseLimit(limitEnvNames[k], raw);
    const given = overrides[k];
    if (given !== undefined) {
      if (!Number.isSafeInteger(given) || given <= 0) throw new Error(`limit ${k} must be a positive integer, got ${given}`);
      out[k] = given;
    }
  }
  return out;
}

/**
 * Fixed-window counter per address: `allow(addr)` is true while the address has made fewer than
 * `perWindow` calls in the current window. Old windows are forgotten, so memory stays bounded by
 * the number of addresses seen in one window.
 */
export function createRateLimiter(perWindow: number, windowMs: number, now: () => number = Date.now) {
  let windowStart = now();
  let counts = new Map<string, number>();
  return {
    allow(addr: string): boolean {
      const t = now();
      if (t - windowStart >= windowMs) {
        windowStart = t;
        counts = new Map();
      }
      const c = counts.get(addr) ?? 0;
      if (c >= perWindow) return false;
      counts.set(addr, c + 1);
      return true;
    },
  };
}
export type RateLimiter = ReturnType<typeof createRateLimiter>;
