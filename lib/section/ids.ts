/** Random ids for parts, zones, cuts and materials: 12 base-62 characters (about 71 bits). */
const ALPHABET = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz';

export function newId(prefix = ''): string {
  const bytes = new Uint8Array(12);
  globalThis.crypto.getRandomValues(bytes);
  let s = prefix;
  for (const b of bytes) s += ALPHABET[b % 62];
  return s;
}
