/** The probe and the cut line over a small hand-made section and field. */
import { describe, expect, it } from 'vitest';
import type { ResolvedSolid } from '@/lib/section/resolve';
import type { Segment } from '@/lib/thermal/types';
import type { GridField } from './colour';
import { chartPaths, cutLayers, cutProfile, profileRange } from './cutline';
import { probeAt, segmentNear, solidAt } from './probe';

const rect = (partId: string, materialId: string, x0: number, y0: number, x1: number, y1: number, rank: number): ResolvedSolid => ({
  partId, piece: 0, role: partId, materialId, rank, polygon: [[x0, y0], [x1, y0], [x1, y1], [x0, y1]],
});
// A wall of three layers from x = 0 to 0.3, 1 m high: 0.1 concrete, 0.05 foam, 0.15 concrete; a patch on top of the foam.
const solids = [
  rect('inner', 'concrete', 0, 0, 0.1, 1, 0),
  rect('foam', 'xps', 0.1, 0, 0.15, 1, 1),
  rect('outer', 'concrete', 0.15, 0, 0.3, 1, 2),
  rect('patch', 'wood', 0.05, 0.8, 0.2, 0.9, 3),
];
// Cells 0.05 m wide over x 0 to 0.3 and 0.5 m high over y 0 to 1: t = 100 x at the cell centre; the last column is void.
const xs = [0, 0.05, 0.1, 0.15, 0.2, 0.25, 0.3], ys = [0, 0.5, 1];
const t = new Float64Array(12);
for (let j = 0; j < 2; j++) for (let i = 0; i < 6; i++) t[j * 6 + i] = i === 5 ? NaN : 100 * (xs[i] + xs[i + 1]) / 2;
const field: GridField = { xs, ys, nx: 6, ny: 2, t };

const seg = { id: 's1', from: [0, 0] as [number, number], to: [0, 1] as [number, number], rhSurfaceMax: 0.72, tMin: 14 } as unknown as Segment;

describe('probe', () => {
  it('the top solid wins and its material is reported', () => {
    expect(solidAt(solids, 0.12, 0.5)?.partId).toBe('foam');
    expect(solidAt(solids, 0.12, 0.85)?.materialId).toBe('wood');
    expect(solidAt(solids, 0.5, 0.5)).toBeNull();
  });
  it('reads the cell temperature, and null outside the solids', () => {
    const r = probeAt(solids, field, [seg], 0.12, 0.3, 0.005);
    expect(r.t).toBeCloseTo(12.5, 12);
    expect(r.partId).toBe('foam');
    expect(r.segment).toBeNull();
    expect(probeAt(solids, field, [], 0.28, 0.3, 0.005).t).toBeNull(); // the void column
    expect(probeAt(solids, null, [], 0.12, 0.3, 0.005).t).toBeNull();
  });
  it('finds the verdict surface within the tolerance only', () => {
    expect(segmentNear([seg], 0.003, 0.5, 0.005)?.id).toBe('s1');
    expect(segmentNear([seg], 0.01, 0.5, 0.005)).toBeNull();
    expect(segmentNear([seg], -0.004, 1.002, 0.005)?.id).toBe('s1');
  });
});

describe('cut line', () => {
  it('crossing the wall gives its three layers with their thicknesses', () => {
    const L = cutLayers(solids, [-0.1, 0.5], [0.4, 0.5]);
    expect(L.map((l) => l.partId)).toEqual([null, 'inner', 'foam', 'outer', null]);
    const th = L.map((l) => l.s1 - l.s0);
    [0.1, 0.1, 0.05, 0.15, 0.1].forEach((v, i) => expect(th[i]).toBeCloseTo(v, 12));
  });
  it('a patch on top splits the layers where it covers them', () => {
    const L = cutLayers(solids, [0, 0.85], [0.3, 0.85]);
    expect(L.map((l) => l.partId)).toEqual(['inner', 'patch', 'outer']);
    expect(L[1].s1 - L[1].s0).toBeCloseTo(0.15, 12);
  });
  it('a slanted cut measures along its own length', () => {
    const L = cutLayers(solids, [0, 0.1], [0.3, 0.5]); // length 0.5
    expect(L[L.length - 1].s1).toBeCloseTo(0.5, 12);
    expect(L.map((l) => l.partId)).toEqual(['inner', 'foam', 'outer']);
    expect(L[1].s1 - L[1].s0).toBeCloseTo(0.05 / 0.6, 12); // 0.05 m of foam across, times 0.5 / 0.3
  });
  it('samples the field along the cut and breaks the chart in voids', () => {
    const p = cutProfile(field, solids, [0.025, 0.25], [0.275, 0.25], 6); // one sample at each cell centre
    expect(p.length).toBeCloseTo(0.25, 12);
    [2.5, 7.5, 12.5, 17.5, 22.5].forEach((v, i) => expect(p.t[i]).toBeCloseTo(v, 12));
    expect(Number.isNaN(p.t[5])).toBe(true);
    expect(profileRange(p)).toEqual({ lo: 2.5, hi: 22.5 });
    const paths = chartPaths(p, 250, 100, { lo: 0, hi: 25 });
    expect(paths).toHaveLength(1);
    expect(paths[0].split(' ')).toHaveLength(5);
    expect(paths[0].startsWith('0.0,90.0')).toBe(true);
    expect(paths[0].endsWith('200.0,10.0')).toBe(true);
  });
  it('a zero-length cut has no layers', () => {
    expect(cutLayers(solids, [0.1, 0.1], [0.1, 0.1])).toEqual([]);
  });
});
