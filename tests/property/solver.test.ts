/**
 * Properties of the discrete heat-flow problem that hold for every section, checked on every
 * template (preview mesh) and on random sections (fast-check, 220 random sections per run):
 * - maximum principle: every temperature lies between the coldest and the warmest zone touching
 *   the construction (the operator is an M-matrix; a property of the Laplace equation);
 * - energy balance as ISO 10211 defines it (sum of flows / half the sum of their absolute values) below 1e-4;
 * - mirror symmetry: a section mirrored about a vertical line has the same zone flows and the mirrored field;
 * - Rayleigh's monotonicity law: lowering any material's conductivity never raises L2D of the indoor
 *   zone (L2D is the minimum of the dissipation over all fields with the indoor zone at 1 K and the
 *   others at 0, which is monotone in every conductance; Rayleigh's law of electrical networks).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { TEMPLATES } from '../../lib/section/templates';
import { solveSectionSync } from '../../lib/thermal/section';
import type { SectionResults } from '../../lib/thermal/types';
import type { PlainSection } from './sections';
import { PROPERTY_MESH, buildPlain, mirrorPlain, plainFromSnapshot, plainSectionArb, scaleMaterial } from './sections';

/** DEWLINE_PROPERTY_SCALE=10 runs ten times as many random sections (a deeper search; default 1). */
const SCALE = Math.max(1, Number(process.env.DEWLINE_PROPERTY_SCALE ?? 1) || 1);
const TIGHT = { rtol: 1e-12, ftol: 0, btol: 0 };
const RUNS = { maximum: 100 * SCALE, mirror: 60 * SCALE, monotone: 60 * SCALE };
/** Random sections per run, in total (the issue asks for at least 200). */
export const RANDOM_SECTIONS = RUNS.maximum + RUNS.mirror + RUNS.monotone;

function boundsOf(p: PlainSection): { W: number; H: number } {
  let W = 0, H = 0;
  for (const s of p.solids) for (const [x, y] of s.points) { W = Math.max(W, x); H = Math.max(H, y); }
  return { W, H };
}

function gridProbes(p: PlainSection): [number, number][] {
  const { W, H } = boundsOf(p);
  const out: [number, number][] = [];
  for (let i = 0; i <= 4; i++) for (let j = 0; j <= 4; j++) out.push([(W * i) / 4, (H * j) / 4]);
  return out;
}

/** Every temperature the results hold: field cells, probes (both runs), surface segments. */
function checkMaximumPrinciple(r: SectionResults): void {
  const touching = r.zones.filter((z) => z.touches);
  const lo = Math.min(...touching.map((z) => z.design.t)), hi = Math.max(...touching.map((z) => z.design.t));
  const eps = 1e-6 * Math.max(hi - lo, 1) ;
  let n = 0;
  const check = (t: number | null, what: string) => {
    if (t === null) return;
    n++;
    if (!(t >= lo - eps && t <= hi + eps)) throw new Error(`${what}: ${t} C outside [${lo}, ${hi}]`);
  };
  r.field.t.forEach((t, k) => check(t, `cell ${k}`));
  r.probes.forEach((p) => { check(p.heat, `probe ${p.at} (heat run)`); check(p.surface, `probe ${p.at} (surface run)`); });
  r.surfaces.forEach((s) => { check(s.tMin, `segment ${s.id}`); check(s.tMean, `segment ${s.id} mean`); });
  expect(n).toBeGreaterThan(0);
}

/**
 * ISO 10211 energy balance below 1e-4. When every zone touching the construction has the same
 * temperature there is no heat flow and the ratio is 0 / 0: the flows are rounding noise and the
 * reported balance can be anything up to 2 (found by this test; see docs/solver.md). Then the flows
 * themselves must vanish instead.
 */
function checkBalance(r: SectionResults): void {
  const ts = r.zones.filter((z) => z.touches).map((z) => z.design.t);
  if (Math.max(...ts) - Math.min(...ts) > 0) {
    expect(r.energyBalance).toBeLessThan(1e-4);
    return;
  }
  const scale = Math.max(1, ...ts.map(Math.abs));
  for (const z of r.zones) expect(Math.abs(z.phi)).toBeLessThan(1e-9 * scale * Math.max(1, r.l2d ?? 1));
}

function checkMirror(a: SectionResults, b: SectionResults): void {
  const tz = a.zones.filter((z) => z.touches).map((z) => z.design.t);
  if (Math.max(...tz) === Math.min(...tz)) {
    // No temperature difference: both fields are that one temperature (flows are rounding noise).
    for (const r of [a, b]) for (const t of r.field.t) if (t !== null) expect(Math.abs(t - tz[0])).toBeLessThan(1e-9 * Math.max(1, Math.abs(tz[0])));
    return;
  }
  const big = Math.max(1e-9, ...a.zones.map((z) => Math.abs(z.phi)));
  for (const z of a.zones) {
    const m = b.zones.find((x) => x.id === z.id)!;
    expect(Math.abs(m.phi - z.phi) / big, `flow of ${z.id}`).toBeLessThan(1e-6);
  }
  if (a.l2d !== null) expect(Math.abs(b.l2d! - a.l2d) / a.l2d).toBeLessThan(1e-6);
  // Mirrored mesh: the grid lines of one are the negated, reversed lines of the other.
  const nx = a.field.xs.length - 1, ny = a.field.ys.length - 1;
  expect(b.field.xs.length - 1).toBe(nx);
  expect(b.field.ys).toEqual(a.field.ys);
  a.field.xs.forEach((x, i) => expect(Math.abs(b.field.xs[nx - i] + x)).toBeLessThan(1e-9));
  const ts = a.zones.filter((z) => z.touches).map((z) => z.design.t);
  const range = Math.max(1e-9, Math.max(...ts) - Math.min(...ts));
  for (let j = 0; j < ny; j++)
    for (let i = 0; i < nx; i++) {
      const ta = a.field.t[j * nx + i], tb = b.field.t[j * nx + (nx - 1 - i)];
      if (ta === null || tb === null) { expect(tb).toBe(ta); continue; }
      if (Math.abs(ta - tb) > 1e-6 * range) throw new Error(`cell (${i}, ${j}): ${ta} vs mirrored ${tb}`);
    }
}

describe('properties on random sections (fast-check)', () => {
  it(`maximum principle and ISO 10211 energy balance below 1e-4 (${RUNS.maximum} sections)`, () => {
    fc.assert(
      fc.property(plainSectionArb, (p) => {
        const r = solveSectionSync(buildPlain(p), { mesh: PROPERTY_MESH, probes: gridProbes(p) });
        checkMaximumPrinciple(r);
        checkBalance(r);
      }),
      { numRuns: RUNS.maximum },
    );
  }, 120_000 * SCALE);

  it(`mirror symmetry about a vertical line: same flows, mirrored field (${RUNS.mirror} sections)`, () => {
    fc.assert(
      fc.property(plainSectionArb, (p) => {
        // Solved to a tight residual, so what is compared is the discretisation, not where two
        // iterations (on differently numbered unknowns) happened to stop.
        const a = solveSectionSync(buildPlain(p), { mesh: PROPERTY_MESH, stop: TIGHT });
        const b = solveSectionSync(buildPlain(mirrorPlain(p)), { mesh: PROPERTY_MESH, stop: TIGHT });
        checkMirror(a, b);
      }),
      { numRuns: RUNS.mirror },
    );
  }, 120_000 * SCALE);

  it(`Rayleigh monotonicity: lowering one block's conductivity never raises L2D (${RUNS.monotone} sections)`, () => {
    fc.assert(
      fc.property(plainSectionArb, fc.nat(), fc.double({ min: 0.001, max: 0.99, noNaN: true }), (p, k, factor) => {
        const id = p.materials[k % p.materials.length].id;
        const a = solveSectionSync(buildPlain(p), { mesh: PROPERTY_MESH, omitField: true });
        const b = solveSectionSync(buildPlain(scaleMaterial(p, id, factor)), { mesh: PROPERTY_MESH, omitField: true });
        expect(a.l2d).not.toBeNull();
        if (b.l2d! > a.l2d! * (1 + 1e-6) + 1e-12) throw new Error(`L2D rose from ${a.l2d} to ${b.l2d} when ${id} was scaled by ${factor}`);
      }),
      { numRuns: RUNS.monotone },
    );
  }, 120_000 * SCALE);

  it('counts at least 200 random sections per run', () => expect(RANDOM_SECTIONS).toBeGreaterThanOrEqual(200));
});

describe('properties on every template (preview mesh)', () => {
  for (const t of TEMPLATES) {
    const p = plainFromSnapshot(t.build());
    it(`${t.name}: maximum principle and energy balance below 1e-4 (preview and default mesh)`, () => {
      const r = solveSectionSync(t.build(), { mesh: 'preview' });
      checkMaximumPrinciple(r);
      expect(r.energyBalance).toBeLessThan(1e-4);
      const d = solveSectionSync(t.build(), { mesh: 'default' });
      checkMaximumPrinciple(d);
      expect(d.energyBalance).toBeLessThan(1e-4);
      // The plain-polygon copy used below solves to the same flows as the template itself.
      const q = solveSectionSync(buildPlain(p), { mesh: 'preview', omitField: true });
      for (const z of r.zones) expect(q.zones.find((x) => x.id === z.id)!.phi).toBeCloseTo(z.phi, 9);
    }, 60_000);
    it(`${t.name}: mirror symmetry`, () => {
      checkMirror(solveSectionSync(buildPlain(p), { mesh: 'preview', stop: TIGHT }), solveSectionSync(buildPlain(mirrorPlain(p)), { mesh: 'preview', stop: TIGHT }));
    }, 60_000);
    it(`${t.name}: lowering any material's conductivity never raises L2D (3 random materials)`, () => {
      const base = solveSectionSync(buildPlain(p), { mesh: 'preview', omitField: true }).l2d!;
      expect(base).toBeGreaterThan(0);
      fc.assert(
        fc.property(fc.nat(), fc.double({ min: 0.01, max: 0.9, noNaN: true }), (k, factor) => {
          const id = p.materials[k % p.materials.length].id;
          const l = solveSectionSync(buildPlain(scaleMaterial(p, id, factor)), { mesh: 'preview', omitField: true }).l2d!;
          if (l > base * (1 + 1e-6)) throw new Error(`L2D rose from ${base} to ${l} when ${id} was scaled by ${factor}`);
        }),
        { numRuns: 3 },
      );
    }, 120_000);
  }
});
