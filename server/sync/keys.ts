/**
 * Room keys. A key is 16 random bytes (128 bits) in base64url (22 characters). The server keeps only
 * SHA-256 hashes of keys; the view key is additionally kept sealed (AES-256-GCM) under a key derived
 * from the edit key, so that whoever holds the edit key can be shown the view link again, while the
 * database alone reveals neither key.
 */
import { createCipheriv, createDecipheriv, createHash, hkdfSync, randomBytes } from 'node:crypto';

export type Role = 'edit' | 'view';

export const KEY_BYTES = 16;
/** base64url of 16 bytes, unpadded */
export const KEY_LENGTH = 22;
const keyPattern = /^[A-Za-z0-9_-]{22}$/;

export function isRole(value: unknown): value is Role {
  return value === 'edit' || value === 'view';
}

/** A fresh random key (128 bits). */
export function newKey(): string {
  return randomBytes(KEY_BYTES).toString('base64url');
}

/** True when `value` has the shape of a key this server issues (it may still be unknown). */
export function isWellFormedKey(value: unknown): value is string {
  return typeof value === 'string' && keyPattern.test(value);
}

/** Hex SHA-256 of the key: what the database stores and looks keys up by. */
export function hashKey(key: string): string {
  return createHash('sha256').update(key, 'utf8').digest('hex');
}

/** Short, non-reversible tag of a key for log lines (first 8 hex digits of a separate hash). */
export function keyTag(key: string): string {
  return createHash('sha256').update('dewline-log:' + key, 'utf8').digest('hex').slice(0, 8);
}

function sealingKey(editKey: string): Buffer {
  return Buffer.from(hkdfSync('sha256', Buffer.from(editKey, 'utf8'), Buffer.alloc(0), 'dewline view key seal', 32));
}

/** Encrypts the view key under the edit key: 12-byte nonce | 16-byte tag | ciphertext. */
export function sealViewKey(viewKey: string, editKey: string): Buffer {
  const nonce = randomBytes(12);
  const cipher = createCipheriv('aes-256-gcm', sealingKey(editKey), nonce);
  const body = Buffer.concat([cipher.update(viewKey, 'utf8'), cipher.final()]);
  return Buffer.concat([nonce, cipher.getAuthTag(), body]);
}

/** The view key sealed by `sealViewKey`, or null if the edit key does not open it. */
export function unsealViewKey(sealed: Uint8Array, editKey: string): string | null {
  const buf = Buffer.from(sealed);
  if (buf.length < 29) return null;
  try {
    const decipher = createDecipheriv('aes-256-gcm', sealingKey(editKey), buf.subarray(0, 12));
    decipher.setAuthTag(buf.subarray(12, 28));
    const text = Buffer.concat([decipher.update(buf.subarray(28)), decipher.final()]).toString('utf8');
    return isWellFormedKey(text) ? text : null;
  } catch {
    return null;
  }
}
