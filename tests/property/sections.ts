/**
 * Random sections for the property tests, and helpers that turn any section into plain polygons
 * (so it can be mirrored or have one material's conductivity lowered without changing the mesh).
 */
import fc from 'fast-check';
import type { Point } from '../../lib/section/geometry';
import { resolveSection } from '../../lib/section/resolve';
import type { SectionSnapshot, ZoneKind } from '../../lib/section/schema';
import type { MeshSpec } from '../../lib/thermal/mesh';
import type { TestMaterial, TestSolid, TestZone } from '../../lib/validation/build';
import { buildSection, rect } from '../../lib/validation/build';

/** A coarse mesh for the random sections (a few hundred to a few thousand cells). */
export const PROPERTY_MESH: MeshSpec = { h0: 0.01, growth: 1.5, hmax: 0.05, hmaxGround: 0.05 };

/** A section as plain data: blocks of material and rectangular or polygonal zones. */
export interface PlainSection {
  materials: TestMaterial[];
  solids: TestSolid[];
  zones: TestZone[];
}

const lambdaArb = fc.double({ min: Math.log(0.02), max: Math.log(200), noNaN: true }).map((v) => Math.round(Math.exp(v) * 1e4) / 1e4);
const tempArb = fc.integer({ min: -300, max: 400 }).map((v) => v / 10);
const sizeArb = fc.integer({ min: 2, max: 40 }).map((v) => v / 100);

/**
 * A rectilinear grid of 1-4 x 1-3 blocks, each its own material (conductivity 0.02 to 200 W/(m K),
 * log-uniform), optionally a triangle of another material on top (a sloped edge, staircased), an
 * indoor zone on the left face, an outdoor zone on the right face and optionally a third zone along
 * part of the top face (unconditioned or fixed temperature).
 */
export const plainSectionArb: fc.Arbitrary<PlainSection> = fc
  .record({
    cols: fc.array(sizeArb, { minLength: 1, maxLength: 4 }),
    rows: fc.array(sizeArb, { minLength: 1, maxLength: 3 }),
    lambdas: fc.array(lambdaArb, { minLength: 12, maxLength: 12 }),
    tri: fc.option(fc.record({ lambda: lambdaArb, p: fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })), { minLength: 3, maxLength: 3 }) }), { nil: null }),
    ti: tempArb,
    te: tempArb,
    rsIn: fc.constantFrom<'auto' | number>('auto', 'auto', 0.1, 0.25),
    top: fc.option(fc.record({ kind: fc.constantFrom<ZoneKind>('unconditioned', 'fixed'), t: tempArb, a: fc.double({ min: 0, max: 0.45, noNaN: true }), b: fc.double({ min: 0.55, max: 1, noNaN: true }) }), { nil: null }),
  })
  .map(({ cols, rows, lambdas, tri, ti, te, rsIn, top }) => {
    const W = cols.reduce((s, v) => s + v, 0), H = rows.reduce((s, v) => s + v, 0);
    const materials: TestMaterial[] = [];
    const solids: TestSolid[] = [];
    let y = 0;
    rows.forEach((h, j) => {
      let x = 0;
      cols.forEach((w, i) => {
        const id = `b${j}-${i}`;
        materials.push({ id, lambda: lambdas[(j * 4 + i) % 12] });
        solids.push({ material: id, points: rect(round(x), round(y), round(x + w), round(y + h)) });
        x += w;
      });
      y += h;
    });
    if (tri) {
      const pts = tri.p.map(([u, v]) => [round(u * W), round(v * H)] as Point);
      const area = (pts[1][0] - pts[0][0]) * (pts[2][1] - pts[0][1]) - (pts[2][0] - pts[0][0]) * (pts[1][1] - pts[0][1]);
      if (Math.abs(area) > 1e-3) {
        materials.push({ id: 'tri', lambda: tri.lambda });
        solids.push({ material: 'tri', points: pts });
      }
    }
    const zones: TestZone[] = [
      { id: 'in', kind: 'indoor', rect: [-0.1, 0, 0, round(H)], t: ti, rs: rsIn },
      { id: 'out', kind: 'outdoor', rect: [round(W), 0, round(W) + 0.1, round(H)], t: te },
    ];
    if (top) zones.push({ id: 'top', kind: top.kind, rect: [round(top.a * W), round(H), round(top.b * W), round(H) + 0.1], t: top.t, rh: top.kind === 'unconditioned' ? 60 : null });
    return { materials, solids, zones };
  });

function round(v: number): number {
  return Math.round(v * 1e6) / 1e6;
}

export function buildPlain(p: PlainSection): SectionSnapshot {
  return buildSection(p.materials, p.solids, p.zones);
}

const mirrorPts = (pts: readonly Point[]): Point[] => pts.map(([x, y]) => [-x, y] as Point).reverse();

/** The same section mirrored about the line x = 0. */
export function mirrorPlain(p: PlainSection): PlainSection {
  return {
    materials: p.materials,
    solids: p.solids.map((s) => ({ material: s.material, points: mirrorPts(s.points) })),
    zones: p.zones.map((z) => {
      const { rect: r, points, ...rest } = z;
      return r ? { ...rest, rect: [-r[2], r[1], -r[0], r[3]] as [number, number, number, number] } : { ...rest, points: mirrorPts(points!) };
    }),
  };
}

/** The same section with one material's conductivity multiplied by `factor`. */
export function scaleMaterial(p: PlainSection, id: string, factor: number): PlainSection {
  return { ...p, materials: p.materials.map((m) => (m.id === id ? { ...m, lambda: m.lambda * factor } : m)) };
}

/** Any section (a template with parametric parts and joins) as plain polygons, zones as rings. */
export function plainFromSnapshot(s: SectionSnapshot): PlainSection {
  const r = resolveSection(s);
  const used = [...new Set(r.solids.map((x) => x.materialId))];
  // Short ids of our own (a document's material ids may not take the test prefix).
  const materials: TestMaterial[] = used.map((id, i) => {
    const m = r.materials.get(id)!;
    return { id: `m${i}`, lambda: m.lambda, airOpen: m.airOpen, pattern: m.pattern };
  });
  const solids = r.solids.map((x) => ({ material: `m${used.indexOf(x.materialId)}`, points: x.polygon }));
  const zones: TestZone[] = r.zones.map((z) => ({ id: z.zoneId, kind: z.kind, points: z.polygon, t: z.record.design.t, rh: z.record.design.rh, tMonth: z.record.month.t, rhMonth: z.record.month.rh, rs: z.record.rs }));
  return { materials, solids, zones };
}
