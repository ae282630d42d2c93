/**
 * File versions. Version 1 is current. Version 0 was the pre-release draft used while the model was
 * built: relative humidity as a fraction (0.5) rather than per cent (50), and positions as `at: [x, y]`.
 * Each step takes a plain object of version n to version n + 1; newer files are refused.
 */
import { FORMAT_TAG, FORMAT_VERSION } from './schema';
import type { Problem } from './errors';

type Json = Record<string, unknown>;

const STEPS: Record<number, (doc: Json) => Json> = {
  0: (doc) => {
    const parts = Array.isArray(doc.parts) ? doc.parts : [];
    const zones = Array.isArray(doc.zones) ? doc.zones : [];
    return {
      ...doc,
      version: 1,
      parts: parts.map((p: unknown) => {
        if (!p || typeof p !== 'object') return p;
        const { at, ...rest } = p as Json;
        return Array.isArray(at) && at.length === 2 ? { ...rest, x: at[0], y: at[1] } : rest;
      }),
      zones: zones.map((z: unknown) => {
        if (!z || typeof z !== 'object') return z;
        const zone = z as Json;
        const fix = (c: unknown) => (c && typeof c === 'object' && typeof (c as Json).rh === 'number' ? { ...(c as Json), rh: ((c as Json).rh as number) * 100 } : c);
        return { ...zone, design: fix(zone.design), month: fix(zone.month) };
      }),
    };
  },
};

export type MigrationResult = { ok: true; doc: Json; from: number } | { ok: false; problems: Problem[] };

export function migrateToCurrent(raw: unknown): MigrationResult {
  if (!raw || typeof raw !== 'object' || Array.isArray(raw)) return { ok: false, problems: [{ path: '', message: 'a section file must be a JSON object' }] };
  let doc = raw as Json;
  if (doc.format !== FORMAT_TAG)
    return { ok: false, problems: [{ path: 'format', message: `must be '${FORMAT_TAG}', got ${JSON.stringify(doc.format) ?? 'nothing'} (not a Dewline section file)` }] };
  const v = doc.version;
  if (typeof v !== 'number' || !Number.isInteger(v) || v < 0)
    return { ok: false, problems: [{ path: 'version', message: `must be a whole number, got ${JSON.stringify(v) ?? 'nothing'}` }] };
  if (v > FORMAT_VERSION)
    return { ok: false, problems: [{ path: 'version', message: `this file is format version ${v}, written by a newer Dewline; this one reads versions up to ${FORMAT_VERSION}. Open it with a newer Dewline.` }] };
  const from = v;
  for (let n = v; n < FORMAT_VERSION; n++) doc = STEPS[n](doc);
  return { ok: true, doc, from };
}
