/**
 * Stacking keys: strings that sort between any two others (fractional indexing over base-62 digits),
 * so a part moves in the stack by changing one field, never by moving items in a list.
 * Keys never end in the digit '0'.
 */
const DIGITS = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz';
const BASE = DIGITS.length;
const idx = (c: string) => DIGITS.indexOf(c);

function midpoint(a: string, b: string | null): string {
  if (b !== null) {
    let n = 0;
    while ((a[n] ?? '0') === b[n]) n++;
    if (n > 0) return b.slice(0, n) + midpoint(a.slice(n), b.slice(n));
  }
  const da = a ? idx(a[0]) : 0;
  const db = b !== null ? idx(b[0]) : BASE;
  if (db - da > 1) return DIGITS[Math.round((da + db) / 2)];
  if (b !== null && b.length > 1) return b.slice(0, 1);
  return DIGITS[da] + midpoint(a.slice(1), null);
}

/** A key strictly between a and b (null: open end). Throws when a >= b. */
export function keyBetween(a: string | null, b: string | null): string {
  if (a !== null && b !== null && a >= b) throw new Error(`stacking keys out of order: '${a}' >= '${b}'`);
  return midpoint(a ?? '', b);
}

/** n keys in ascending order between a and b. */
export function keysBetween(a: string | null, b: string | null, n: number): string[] {
  const out: string[] = [];
  let lo = a;
  for (let i = 0; i < n; i++) {
    lo = keyBetween(lo, b);
    out.push(lo);
  }
  return out;
}

export function isOrderKey(k: string): boolean {
  return /^[0-9A-Za-z]+$/.test(k) && !k.endsWith('0');
}
