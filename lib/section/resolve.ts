/**
 * From a snapshot to world geometry: every part's pieces placed in the section (joins resolved,
 * parents first), every zone as a polygon, and the material table the solver needs.
 * This is what the mesher, the board and the sheet draw from.
 */
import type { Material } from '../materials/material';
import { libraryMaterial } from '../materials/library';
import { anchorPoint } from './anchors';
import type { Box, Point } from './geometry';
import { boxOfPoints, rectPolygon, ringToVertices, translatePolygon, unionBox } from './geometry';
import type { KindContext } from './kind';
import type { ParamValue } from './params';
import { partKind } from './registry';
import type { PartRecord, SectionSnapshot, ZoneKind, ZoneRecord } from './schema';

export interface ResolvedSolid {
  partId: string;
  /** Index of the piece within its part. */
  piece: number;
  role: string;
  materialId: string;
  /** World coordinates, counter-clockwise not guaranteed. */
  polygon: Point[];
  /** Stacking rank: a higher rank wins a point. Solids always win over zones. */
  rank: number;
}

export interface ResolvedZone {
  zoneId: string;
  kind: ZoneKind;
  polygon: Point[];
  rank: number;
  record: ZoneRecord;
}

export interface ResolvedPart {
  id: string;
  record: PartRecord;
  /** World position of the local origin. */
  origin: Point;
  /** World box of all pieces. */
  box: Box;
}

export interface ResolvedSection {
  snapshot: SectionSnapshot;
  materials: ReadonlyMap<string, Material>;
  parts: ReadonlyMap<string, ResolvedPart>;
  /** Bottom of the stack first. */
  solids: ResolvedSolid[];
  zones: ResolvedZone[];
  /** Box of all solids and zones. */
  bounds: Box;
}

/** Library materials plus the document's own (a document material of the same id wins). */
export function materialTable(snapshot: Pick<SectionSnapshot, 'materials'>): Map<string, Material> {
  const table = new Map<string, Material>();
  for (const m of snapshot.materials) table.set(m.id, m as Material);
  return table;
}

export function lookupMaterial(table: ReadonlyMap<string, Material>, id: string): Material | undefined {
  return table.get(id) ?? libraryMaterial(id);
}

/** The kind parameters of a part record (every field that is not a common one). */
export function partParams(part: PartRecord): Record<string, ParamValue> {
  const kind = partKind(part.kind);
  const out: Record<string, ParamValue> = {};
  if (!kind) return out;
  for (const [key, spec] of Object.entries(kind.params)) out[key] = (part[key] as ParamValue | undefined) ?? (spec.type === 'ring' ? spec.default : spec.default);
  return out;
}

/** Pieces of a part in its local frame. */
export function localPieces(part: PartRecord, ctx: KindContext) {
  const kind = partKind(part.kind);
  if (!kind) return [];
  return kind.pieces(partParams(part) as never, part.material, ctx);
}

export function zonePolygon(zone: ZoneRecord): Point[] {
  return zone.shape.type === 'rect' ? rectPolygon(zone.shape.x, zone.shape.y, zone.shape.width, zone.shape.height) : (ringToVertices(zone.shape.points) ?? []);
}

/**
 * Place every part. Joins are followed parents first; a join whose target is missing or that forms a
 * cycle is reported by validation, and here falls back to the part's own x, y (or 0, 0).
 */
export function resolveSection(snapshot: SectionSnapshot): ResolvedSection {
  const materials = materialTable(snapshot);
  const ctx: KindContext = { material: (id) => lookupMaterial(materials, id) };
  const byId = new Map(snapshot.parts.map((p) => [p.id, p]));
  const local = new Map<string, { pieces: ReturnType<typeof localPieces>; box: Box }>();
  for (const p of snapshot.parts) {
    const pieces = localPieces(p, ctx);
    const pts = pieces.flatMap((x) => x.polygon);
    local.set(p.id, { pieces, box: pts.length ? boxOfPoints(pts) : { minX: 0, minY: 0, maxX: 0, maxY: 0 } });
  }
  const origins = new Map<string, Point>();
  const visiting = new Set<string>();
  const originOf = (id: string): Point => {
    const done = origins.get(id);
    if (done) return done;
    const part = byId.get(id)!;
    let o: Point = [part.x ?? 0, part.y ?? 0];
    const j = part.join;
    if (j && byId.has(j.to) && !visiting.has(id) && j.to !== id) {
      visiting.add(id);
      const target = originOf(j.to);
      visiting.delete(id);
      const tb = local.get(j.to)!.box;
      const [ax, ay] = anchorPoint({ minX: tb.minX + target[0], minY: tb.minY + target[1], maxX: tb.maxX + target[0], maxY: tb.maxY + target[1] }, j.anchor);
      const [sx, sy] = anchorPoint(local.get(id)!.box, j.self);
      o = [ax + j.dx - sx, ay + j.dy - sy];
    }
    origins.set(id, o);
    return o;
  };

  const parts = new Map<string, ResolvedPart>();
  const solids: ResolvedSolid[] = [];
  let rank = 0;
  let bounds: Box | null = null;
  for (const p of snapshot.parts) {
    const o = originOf(p.id);
    const { pieces, box } = local.get(p.id)!;
    const world: Box = { minX: box.minX + o[0], minY: box.minY + o[1], maxX: box.maxX + o[0], maxY: box.maxY + o[1] };
    parts.set(p.id, { id: p.id, record: p, origin: o, box: world });
    pieces.forEach((piece, i) => {
      let materialId: string;
      if (typeof piece.material === 'string') materialId = piece.material;
      else {
        materialId = piece.material.id;
        if (!materials.has(materialId)) materials.set(materialId, piece.material);
      }
      if (!materials.has(materialId)) {
        const lib = libraryMaterial(materialId);
        if (lib) materials.set(materialId, lib);
      }
      solids.push({ partId: p.id, piece: i, role: piece.role, materialId, polygon: translatePolygon(piece.polygon, o[0], o[1]), rank: rank++ });
    });
    if (pieces.length) bounds = bounds ? unionBox(bounds, world) : world;
  }
  const zones: ResolvedZone[] = snapshot.zones.map((z, i) => {
    const polygon = zonePolygon(z);
    if (polygon.length) {
      const b = boxOfPoints(polygon);
      bounds = bounds ? unionBox(bounds, b) : b;
    }
    return { zoneId: z.id, kind: z.kind, polygon, rank: i, record: z };
  });
  return { snapshot, materials, parts, solids, zones, bounds: bounds ?? { minX: 0, minY: 0, maxX: 1, maxY: 1 } };
}
