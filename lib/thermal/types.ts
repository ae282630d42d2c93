/** The results of a section solve: a plain, JSON-serialisable object (fields documented in docs/solver.md). */
import type { MeshLevel, MeshSpec } from './mesh';

export type SurfaceState = 'fine' | 'mould risk' | 'condensation';

export interface Assumption {
  topic: string;
  text: string;
  /** Standard and clause, or where the figure comes from. */
  source: string;
}

export interface ZoneResult {
  id: string;
  name: string;
  kind: string;
  design: { t: number; rh: number | null };
  month: { t: number; rh: number | null };
  /** Does the zone touch the construction? */
  touches: boolean;
  /** Surface-resistance rule per run. */
  rsHeat: string;
  rsSurface: string;
  /** Heat flow from the zone into the construction at the design temperatures, W/m (heat-flow run). */
  phi: number;
  /** The same at the coldest-month temperatures, W/m. */
  phiMonth: number;
}

export interface Coupling {
  a: string;
  b: string;
  /** Thermal coupling coefficient L_ab, W/(m K) (ISO 10211). */
  l: number;
}

export interface Layer {
  materialId: string;
  name: string;
  thickness: number;
  lambda: number;
  /** d / lambda, m2K/W. */
  r: number;
}

export interface ReferenceCut {
  id: string;
  name: string;
  from: [number, number];
  to: [number, number];
  layers: Layer[];
  rsi: number;
  rse: number;
  /** U = 1 / (Rsi + sum d/lambda + Rse), W/(m2 K) (ISO 6946). */
  u: number;
  length: number;
  /** U l, W/(m K). */
  ul: number;
}

export interface PsiResult {
  /** L2D of the indoor zone against all other zones, W/(m K). */
  l2d: number;
  /** psi = L2D - sum U_j l_j, W/(m K). */
  psi: number;
  convention: string;
  flanking: ReferenceCut[];
}

export interface PsiGroundResult {
  l2d: number;
  /** psi_g = L2D - 0.5 B' U_floor - h_w U_wall, W/(m K). */
  psiG: number;
  characteristicDimension: number;
  uFloor: number;
  /** d_t, the equivalent thickness of the floor (ISO 13370), m. */
  dt: number;
  rf: number;
  wallThickness: number;
  groundLambda: number;
  formula: string;
  floorCut: ReferenceCut;
  wallHeight: number;
  uWall: number | null;
  wallCut: ReferenceCut | null;
  /** ISO 13370 heated basement: z, U of the below-grade wall and its cut; null for a slab on ground. */
  basement: { depth: number; uWall: number; dw: number; rw: number; formula: string; wallCut: ReferenceCut } | null;
}

export interface Segment {
  id: string;
  /** 'surface': a face on a zone with a humidity. 'hidden': an air-open layer against an airtight one on its cold side, judged as if indoor air reaches it. */
  kind: 'surface' | 'hidden';
  /** The zone whose air is judged at the surface. */
  zoneId: string;
  partId: string;
  materialId: string;
  /** For a hidden surface: the airtight part behind it. */
  behindPartId: string | null;
  from: [number, number];
  to: [number, number];
  length: number;
  /** Surface-temperature run at the design-day temperatures: coldest and mean surface temperature, C. */
  tMin: number;
  tMean: number;
  /** Where tMin occurs. */
  at: [number, number];
  /** Coldest-month set: coldest surface temperature and the highest surface RH (fraction). */
  tMinMonth: number;
  rhSurfaceMax: number;
  /** fRsi at the coldest point, for two-zone sections (null otherwise). */
  fRsi: number | null;
  /** Temperature weighting factors at the coldest point (ISO 10211), per zone id; sums to 1. */
  weights: Record<string, number>;
  dewPoint: number;
  mouldLimit: number;
  state: SurfaceState;
}

export interface UnitSolveReport {
  run: 'heat' | 'surface';
  zoneId: string;
  iterations: number;
  relativeResidual: number;
  flowChange: number;
  balance: number;
  converged: boolean;
  warm: boolean;
}

export interface SectionResults {
  format: 'dewline-results';
  version: 1;
  name: string;
  mesh: { level: MeshLevel | 'custom'; spec: MeshSpec; nx: number; ny: number; cells: number; unknowns: number; minCell: number; maxCell: number };
  solver: {
    method: string;
    levels: number[];
    operatorComplexity: number;
    solves: UnitSolveReport[];
    /** Largest final relative residual of any solve. */
    residual: number;
    iterations: number;
    timings: { meshMs: number; assembleMs: number; setupMs: number; solveMs: number; resultsMs: number };
  };
  zones: ZoneResult[];
  /** ISO 10211 energy balance of the design heat-flow run: |sum of flows| / (0.5 sum |flows|). */
  energyBalance: number;
  couplings: Coupling[];
  /** Indoor zone used for L2D, fRsi and hidden surfaces. */
  indoorZoneId: string | null;
  /** Exterior reference temperature for fRsi (two-zone sections: the other zone), C. */
  l2d: number | null;
  psi: PsiResult | null;
  psiGround: PsiGroundResult | null;
  conditions: {
    design: { ti: number; te: number | null; rh: number | null; dewPoint: number | null };
    month: { ti: number; te: number | null; rh: number | null; mouldLimit: number | null; fRsiMin: number | null };
  } | null;
  surfaces: Segment[];
  coldest: { segmentId: string; t: number; at: [number, number]; fRsi: number | null; weights: Record<string, number> } | null;
  verdict: SurfaceState;
  /** Surface-temperature run at the design temperatures, per cell (row-major, j nx + i), null outside the solids. */
  field: { xs: number[]; ys: number[]; t: (number | null)[] };
  probes: { at: [number, number]; heat: number | null; surface: number | null }[];
  assumptions: Assumption[];
  warnings: string[];
}
