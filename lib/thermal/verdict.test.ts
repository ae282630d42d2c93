/**
 * Verdict states against hand calculations: fine, mould risk (surface RH >= 80 % at the coldest-month
 * mean, ISO 13788 clause 4.2 criterion), condensation (below the design-day dew point), fRsi and
 * fRsi,min (ISO 10211, ISO 13788), and hidden surfaces (an air-open layer against an airtight one on
 * its cold side, judged with indoor air; DESIGN.md section 4). Surface temperatures come from the
 * surface-temperature run, Rsi 0.25 (ISO 13788), so on a 1-D wall theta_si = theta_i - U' 0.25 (theta_i - theta_e)
 * with U' = 1 / (0.25 + sum d/lambda + 0.04) (ISO 6946 series resistances).
 */
import { describe, expect, it } from 'vitest';
import { buildSection, rect } from '../validation/build';
import { MESH_LEVELS } from './mesh';
import { solveSectionSync } from './section';

// ISO 13788 saturation pressure over water (Annex E formula, written out here independently of lib/psychro).
const pSat = (t: number) => 610.5 * Math.exp((17.269 * t) / (237.3 + t));
const tSat = (p: number) => { const l = Math.log(p / 610.5); return (237.3 * l) / (17.269 - l); };

/** A 1 m high wall of one layer with resistance R, room (20 C, 50 %) on the left, outdoors on the right. */
function wall(R: number, te: number, teMonth = te, rh = 50) {
  const d = 0.2;
  return buildSection(
    [{ id: 'layer', lambda: d / R }],
    [{ material: 'layer', points: rect(0, 0, d, 1) }],
    [{ id: 'room', kind: 'indoor', rect: [-0.1, 0, 0, 1], t: 20, rh, tMonth: 20, rhMonth: rh }, { id: 'out', kind: 'outdoor', rect: [d, 0, d + 0.1, 1], t: te, tMonth: teMonth }],
  );
}
const tsiOf = (R: number, ti: number, te: number) => ti - (0.25 / (0.25 + R + 0.04)) * (ti - te);

describe('verdict states on a 1-D wall (hand calculation)', () => {
  const dew = tSat(0.5 * pSat(20)); // 9.269 C (DESIGN.md: 9.27)
  const mould = tSat((0.5 * pSat(20)) / 0.8); // 12.62 C (DESIGN.md: 12.6)
  it('the dew point and mould limit of 20 C, 50 % are 9.27 and 12.6 C (DESIGN.md section 5, ISO 13788 formulas)', () => {
    expect(dew).toBeCloseTo(9.27, 2);
    expect(mould).toBeCloseTo(12.6, 1);
  });

  it('fine: surface above the mould limit; fRsi and fRsi,min by hand', () => {
    const R = 2.5;
    const r = solveSectionSync(wall(R, -10), { mesh: 'preview', omitField: true });
    const s = r.surfaces.find((x) => x.kind === 'surface' && x.zoneId === 'room')!;
    const tsi = tsiOf(R, 20, -10);
    expect(s.tMin).toBeCloseTo(tsi, 6);
    expect(s.state).toBe('fine');
    expect(r.verdict).toBe('fine');
    expect(s.fRsi!).toBeCloseTo((tsi + 10) / 30, 6);
    expect(r.conditions!.design.dewPoint!).toBeCloseTo(dew, 9);
    expect(r.conditions!.month.mouldLimit!).toBeCloseTo(mould, 9);
    expect(r.conditions!.month.fRsiMin!).toBeCloseTo((mould + 10) / 30, 9);
    expect(s.rhSurfaceMax).toBeCloseTo((0.5 * pSat(20)) / pSat(tsi), 6);
    expect(s.rhSurfaceMax).toBeLessThan(0.8);
    expect(r.coldest!.t).toBeCloseTo(tsi, 6);
  });

  it('mould risk: surface between the dew point and the mould limit (surface RH >= 80 %, ISO 13788)', () => {
    const R = 0.543; // U' = 1/0.833 -> theta_si = 20 - 0.3 * 30 = 11.0 C
    const r = solveSectionSync(wall(R, -10), { mesh: 'preview', omitField: true });
    const s = r.surfaces.find((x) => x.kind === 'surface')!;
    const tsi = tsiOf(R, 20, -10);
    expect(tsi).toBeGreaterThan(dew);
    expect(tsi).toBeLessThan(mould);
    expect(s.tMin).toBeCloseTo(tsi, 6);
    expect(s.state).toBe('mould risk');
    expect(s.rhSurfaceMax).toBeCloseTo((0.5 * pSat(20)) / pSat(tsi), 6);
    expect(s.rhSurfaceMax).toBeGreaterThanOrEqual(0.8);
    expect(r.verdict).toBe('mould risk');
  });

  it('condensation: surface below the design-day dew point', () => {
    const R = 0.11; // U' = 2.5 -> theta_si = 20 - 0.625 * 30 = 1.25 C
    const r = solveSectionSync(wall(R, -10), { mesh: 'preview', omitField: true });
    const s = r.surfaces.find((x) => x.kind === 'surface')!;
    expect(s.tMin).toBeCloseTo(tsiOf(R, 20, -10), 6);
    expect(s.tMin).toBeLessThan(dew);
    expect(s.state).toBe('condensation');
    expect(r.verdict).toBe('condensation');
  });

  it('the mould check uses the coldest-month set, the condensation check the design day', () => {
    const R = 0.543;
    // Design day -10 C (surface 11.0 C, above the dew point); coldest month +5 C: surface 20 - 0.3 * 15 = 15.5 C, above the mould limit.
    const r = solveSectionSync(wall(R, -10, 5), { mesh: 'preview', omitField: true });
    const s = r.surfaces.find((x) => x.kind === 'surface')!;
    expect(s.tMin).toBeCloseTo(tsiOf(R, 20, -10), 6);
    expect(s.tMinMonth).toBeCloseTo(tsiOf(R, 20, 5), 6);
    expect(s.state).toBe('fine');
    expect(r.conditions!.month.fRsiMin!).toBeCloseTo((mould - 5) / 15, 9);
  });
});

describe('hidden surfaces', () => {
  // Room | gypsum 12.5 mm (airtight, 0.25) | batt 140 mm (air-open, 0.04) | sheathing 12 mm (airtight, 0.13) | outdoors.
  const layers = [
    { id: 'gypsum', d: 0.0125, lambda: 0.25, airOpen: false },
    { id: 'batt', d: 0.14, lambda: 0.04, airOpen: true },
    { id: 'sheathing', d: 0.012, lambda: 0.13, airOpen: false },
  ];
  let x = 0;
  const solids = layers.map((l) => { const p = rect(x, 0, x + l.d, 1); x += l.d; return { material: l.id, points: p }; });
  const total = x;
  const s = buildSection(layers.map((l) => ({ id: l.id, lambda: l.lambda, airOpen: l.airOpen })), solids, [
    { id: 'room', kind: 'indoor', rect: [-0.1, 0, 0, 1], t: 20, rh: 50 },
    { id: 'out', kind: 'outdoor', rect: [total, 0, total + 0.1, 1], t: -10 },
  ]);
  const r = solveSectionSync(s, { mesh: 'preview', omitField: true });
  const hidden = r.surfaces.filter((h) => h.kind === 'hidden');

  it('only the cold side of the batt, against the sheathing, is a hidden surface, judged with indoor air', () => {
    expect(hidden).toHaveLength(1);
    const h = hidden[0];
    expect(h.partId).toBe('p1'); // the batt
    expect(h.behindPartId).toBe('p2'); // the sheathing behind it
    expect(h.zoneId).toBe('room');
    expect(h.from[0]).toBeCloseTo(0.0125 + 0.14, 9);
    expect(h.to[0]).toBeCloseTo(0.0125 + 0.14, 9);
  });

  it('its temperature is the series-resistance interface temperature, and it condenses (hand calculation)', () => {
    const R = 0.25 + 0.0125 / 0.25 + 0.14 / 0.04 + 0.012 / 0.13 + 0.04;
    const t = 20 - ((0.25 + 0.0125 / 0.25 + 0.14 / 0.04) / R) * 30; // about -7.3 C
    const h = hidden[0];
    expect(h.tMin).toBeCloseTo(t, 6);
    expect(h.state).toBe('condensation');
    expect(r.verdict).toBe('condensation');
    // The room-side surface itself is fine, and the coldest point reported is on a real surface, not the hidden one.
    const room = r.surfaces.find((q) => q.kind === 'surface')!;
    expect(room.state).toBe('fine');
    expect(r.coldest!.segmentId).toBe(room.id);
    expect(r.assumptions.some((a) => a.topic === 'hidden surfaces')).toBe(true);
  });
});

describe('three zones', () => {
  it('gives no fRsi (it needs two zones) but temperature weighting factors that sum to 1 (ISO 10211)', () => {
    const s = buildSection(
      [{ id: 'layer', lambda: 0.5 }],
      [{ material: 'layer', points: rect(0, 0, 0.3, 1) }],
      [
        { id: 'room', kind: 'indoor', rect: [-0.1, 0, 0, 1], t: 20, rh: 50 },
        { id: 'out', kind: 'outdoor', rect: [0.3, 0, 0.4, 1], t: -10 },
        { id: 'attic', kind: 'unconditioned', rect: [0, 1, 0.3, 1.1], t: 5, rh: 70 },
      ],
    );
    const r = solveSectionSync(s, { mesh: 'preview', omitField: true });
    for (const seg of r.surfaces) {
      expect(seg.fRsi).toBeNull();
      const w = Object.values(seg.weights);
      expect(w.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 9);
      // Superposition: the coldest temperature is the weighted sum of the zone temperatures.
      expect(seg.weights.room * 20 + seg.weights.out * -10 + seg.weights.attic * 5).toBeCloseTo(seg.tMin, 6);
    }
    expect(r.surfaces.some((q) => q.zoneId === 'attic')).toBe(true);
  });
});

describe('coldest point at a corner where a conductive part touches the room at one point', () => {
  // Concrete (lambda 2.3) in the south-west quadrant, cold on its outer faces; insulation (0.035) in
  // the south-east and north-west quadrants; the room in the north-east one. The concrete touches the
  // room only at the origin, so the coldest room surface is at that corner and the surface
  // temperature changes steeply away from it (our own case; the reference is a much finer mesh).
  const s = buildSection(
    [{ id: 'concrete', lambda: 2.3 }, { id: 'foam', lambda: 0.035 }],
    [
      { material: 'concrete', points: rect(-0.2, -0.2, 0, 0) },
      { material: 'foam', points: rect(0, -0.2, 0.2, 0) },
      { material: 'foam', points: rect(-0.2, 0, 0, 0.2) },
    ],
    [
      { id: 'room', kind: 'indoor', rect: [0, 0, 0.2, 0.2], t: 20, rh: 50, tMonth: 20, rhMonth: 50 },
      { id: 'out', kind: 'outdoor', points: [[-0.3, -0.3], [0.2, -0.3], [0.2, -0.2], [-0.2, -0.2], [-0.2, 0.2], [-0.3, 0.2]], t: -10, tMonth: -10 },
    ],
  );
  const cold = (mesh: NonNullable<Parameters<typeof solveSectionSync>[1]>['mesh']) => solveSectionSync(s, { mesh, omitField: true }).coldest!;

  it('is read at the corner node and agrees with a much finer mesh to 0.05 K at the default and fine levels', () => {
    const ref = cold({ h0: 0.00025, growth: 1.1, hmax: 0.01, hmaxGround: 0.01, h0Point: 0.0000625 });
    const d = cold('default'), f = cold('fine');
    for (const c of [d, f, ref]) {
      expect(Math.abs(c.at[0])).toBeLessThan(1e-9);
      expect(Math.abs(c.at[1])).toBeLessThan(1e-9);
    }
    expect(Math.abs(d.t - ref.t)).toBeLessThan(0.05);
    expect(Math.abs(f.t - ref.t)).toBeLessThan(0.05);
    // Superposition holds at the corner too.
    expect(d.weights.room * 20 + d.weights.out * -10).toBeCloseTo(d.t, 6);
  });

  it('with the preview level\'s coarser corner patch (cells split in 2, not 4) reads the same corner, within 0.2 K of the split of 4', () => {
    const two = cold('preview');
    const four = cold({ ...MESH_LEVELS.preview, cornerSplit: 4 });
    expect(MESH_LEVELS.preview.cornerSplit).toBe(2);
    for (const c of [two, four]) expect(Math.hypot(c.at[0], c.at[1])).toBeLessThan(1e-9);
    expect(two.t).not.toBe(four.t); // the option reaches the patch
    expect(Math.abs(two.t - four.t)).toBeLessThan(0.2);
    expect(two.weights.room * 20 + two.weights.out * -10).toBeCloseTo(two.t, 6);
  });
});
