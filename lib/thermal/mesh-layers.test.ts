/**
 * The mesh keeps thin layers at every level: grid lines include every vertex, so a layer thinner than
 * the first cell (a 0.25 mm ground cover against 16 mm at preview) is still its own row of cells.
 */
import { describe, expect, it } from 'vitest';
import { resolveSection } from '../section/resolve';
import { TEMPLATES, templateByName } from '../section/templates/index';
import type { MeshLevel } from './mesh';
import { MESH_LEVELS, buildMesh } from './mesh';

const LEVELS = Object.keys(MESH_LEVELS) as MeshLevel[];

function meshOf(name: string, level: MeshLevel) {
  const r = resolveSection(templateByName(name)!.build());
  const ground = (id: string) => ['earth', 'rock'].includes(r.materials.get(id)?.pattern ?? '');
  const mesh = buildMesh(r.solids.map((s) => ({ polygon: s.polygon, ground: ground(s.materialId) })), r.zones.map((z) => ({ polygon: z.polygon })), MESH_LEVELS[level]);
  return { r, mesh };
}

const bounds = (poly: readonly (readonly [number, number])[]) => ({
  minX: Math.min(...poly.map((p) => p[0])), maxX: Math.max(...poly.map((p) => p[0])),
  minY: Math.min(...poly.map((p) => p[1])), maxY: Math.max(...poly.map((p) => p[1])),
});

describe('mesh: thin layers keep their cells at every level', () => {
  for (const level of LEVELS)
    it(`${level}: the 0.25 mm ground cover of the crawl space is one row of cells along its whole length`, () => {
      const { r, mesh } = meshOf('crawlspace-unvented', level);
      const k = r.solids.findIndex((s) => s.partId === 'cover');
      expect(k).toBeGreaterThanOrEqual(0);
      const b = bounds(r.solids[k].polygon);
      expect(b.maxY - b.minY).toBeLessThan(MESH_LEVELS[level].h0 / 5); // far thinner than the first cell
      let columns = 0;
      for (let i = 0; i < mesh.nx; i++) {
        if (mesh.xc[i] <= b.minX || mesh.xc[i] >= b.maxX) continue;
        // Where a part higher in the stack covers it (the wall foam at its inner end), the cover does not show.
        const above = r.solids.slice(k + 1).some((s) => { const o = bounds(s.polygon); return o.minX < mesh.xc[i] && o.maxX > mesh.xc[i] && o.minY <= b.minY && o.maxY >= b.maxY; });
        if (above) continue;
        const rows: number[] = [];
        for (let j = 0; j < mesh.ny; j++) if (mesh.owner[j * mesh.nx + i] === k) rows.push(j);
        expect(rows.length, `column ${i}`).toBe(1);
        expect(mesh.ys[rows[0]]).toBeCloseTo(b.minY, 9);
        expect(mesh.ys[rows[0] + 1]).toBeCloseTo(b.maxY, 9);
        columns++;
      }
      expect(columns).toBeGreaterThan(3);
    });

  for (const t of TEMPLATES)
    it(`${t.name}: every part that shows on top somewhere at the default mesh owns cells at the preview mesh too`, () => {
      const owned = (level: MeshLevel) => {
        const { r, mesh } = meshOf(t.name, level);
        const parts = new Set<string>();
        for (const o of mesh.owner) if (o >= 0) parts.add(r.solids[o].partId);
        return parts;
      };
      const preview = owned('preview');
      for (const id of owned('default')) expect(preview.has(id), id).toBe(true);
    });
});
