/**
 * Allowed-origin check for browser requests (websocket upgrades and API POSTs).
 * No Origin header (scripts, curl, Node clients): allowed. Otherwise allowed when the origin's
 * host equals the request's Host header (same origin), or when it is in the configured list;
 * the list '*' allows every origin.
 */
export type AllowedOrigins = '*' | readonly string[];

/** Parses DEWLINE_ALLOWED_ORIGINS: '*' or a comma-separated list of origins like https://a.example. */
export function parseAllowedOrigins(raw: string | undefined): AllowedOrigins {
  if (raw === undefined || raw.trim() === '') return [];
  if (raw.trim() === '*') return '*';
  return raw.split(',').map((s) => normalizeOrigin(s.trim()));
}

/** 'https://A.example:443/' -> 'https://a.example'; throws for anything that is not an http(s) origin. */
export function normalizeOrigin(value: string): string {
  let u: URL;
  try {
    u = new URL(value);
  } catch {
    throw new Error(`not an origin: ${JSON.stringify(value)}`);
  }
  if (u.protocol !== 'http:' && u.protocol !== 'https:') throw new Error(`not an http(s) origin: ${JSON.stringify(value)}`);
  return u.origin;
}

export function isOriginAllowed(origin: string | undefined, host: string | undefined, allowed: AllowedOrigins): boolean {
  if (origin === undefined) return true;
  if (allowed === '*') return true;
  let o: URL;
  try {
    o = new URL(origin);
  } catch {
    return false;
  }
  if (host !== undefined && o.host.toLowerCase() === host.toLowerCase()) return true;
  return allowed.includes(o.origin);
}
