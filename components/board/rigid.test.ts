import { describe, expect, it } from 'vitest';
import type { OutlineItem } from './rigid';
import { rigidShift } from './rigid';

const item = (key: string, flat: number[], pattern = 'concrete'): OutlineItem => ({ key, flat, pattern, rank: 1, locked: false });
const shifted = (it: OutlineItem, dx: number, dy: number): OutlineItem => ({ ...it, flat: it.flat.map((v, i) => v + (i % 2 ? dy : dx)) });

describe('rigidShift: the moving parts as they were at the start of the drag, shifted', () => {
  const base = [item('a:0', [0, 0, 1, 0, 1, 1, 0, 1]), item('b:0', [1, 0, 2, 0, 2, 0.5], 'insulation')];
  it('finds the common translation', () => {
    const s = rigidShift(base, base.map((x) => shifted(x, 0.013, -0.2)));
    expect(s).not.toBeNull();
    expect(s![0]).toBeCloseTo(0.013, 12);
    expect(s![1]).toBeCloseTo(-0.2, 12);
    expect(rigidShift(base, base)).toEqual([0, 0]);
  });
  it('refuses a change of shape, fill, stacking, count or order', () => {
    const moved = base.map((x) => shifted(x, 0.1, 0));
    const stretched = [moved[0], { ...moved[1], flat: moved[1].flat.map((v, i) => (i === 2 ? v + 0.05 : v)) }];
    expect(rigidShift(base, stretched)).toBeNull();
    expect(rigidShift(base, [moved[0], { ...moved[1], pattern: 'plain' }])).toBeNull();
    expect(rigidShift(base, [moved[0], { ...moved[1], rank: 5 }])).toBeNull();
    expect(rigidShift(base, [moved[0], { ...moved[1], locked: true }])).toBeNull();
    expect(rigidShift(base, [moved[0]])).toBeNull();
    expect(rigidShift(base, [moved[1], moved[0]])).toBeNull();
    expect(rigidShift([], [])).toBeNull();
  });
  it('refuses parts moved by different amounts (one followed, one did not)', () => {
    expect(rigidShift(base, [shifted(base[0], 0.1, 0), shifted(base[1], 0.1 + 1e-6, 0)])).toBeNull();
  });
});
