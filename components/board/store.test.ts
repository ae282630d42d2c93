import { describe, expect, it } from 'vitest';
import { createStore, pickIfChanged } from './store';

describe('pickIfChanged: a stable slice of a store for a component that reads only some fields', () => {
  it('keeps the same object while the picked fields are the same, and a new one when one changes', () => {
    const s = createStore({ results: { a: 1 } as object | null, busy: null as { ms: number } | null, stale: false });
    const keys = ['results', 'stale'] as const;
    const first = pickIfChanged(null, s.get(), keys);
    expect(first).toEqual({ results: s.get().results, stale: false });
    expect(Object.keys(first).sort()).toEqual(['results', 'stale']);
    // Progress: only `busy` changes, the slice stays the very same object (no re-render).
    s.set((v) => ({ ...v, busy: { ms: 250 } }));
    expect(pickIfChanged(first, s.get(), keys)).toBe(first);
    s.set((v) => ({ ...v, busy: { ms: 500 }, results: { ...v.results } }));
    const second = pickIfChanged(first, s.get(), keys);
    expect(second).not.toBe(first);
    expect(second.results).toBe(s.get().results);
    s.set((v) => ({ ...v, stale: true }));
    const third = pickIfChanged(second, s.get(), keys);
    expect(third).not.toBe(second);
    expect(third.stale).toBe(true);
  });
  it('compares with Object.is (NaN equals NaN, 0 and -0 differ)', () => {
    const keys = ['v'] as const;
    const a = pickIfChanged(null, { v: Number.NaN }, keys);
    expect(pickIfChanged(a, { v: Number.NaN }, keys)).toBe(a);
    const z = pickIfChanged(null, { v: 0 }, keys);
    expect(pickIfChanged(z, { v: -0 }, keys)).not.toBe(z);
  });
});
