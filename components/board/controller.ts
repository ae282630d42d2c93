/**
 * The board's controller: the section read from the document, the view, the selection, the tools and
 * the gestures. It changes the document only through the model's named operations (lib/section/ops),
 * each with the board's origin, so Y.UndoManager undoes per person and the rooms need nothing else.
 * No React and no Konva here: the canvas and the panels subscribe to its stores.
 */
import type * as Y from 'yjs';
import type { Box, Point } from '@/lib/section/geometry';
import { SectionError, formatProblem } from '@/lib/section/errors';
import type { Handle } from '@/lib/section/kind';
import * as ops from '@/lib/section/ops';
import { readSection } from '@/lib/section/doc';
import { partKind } from '@/lib/section/registry';
import type { ResolvedSection } from '@/lib/section/resolve';
import { partParams, resolveSection } from '@/lib/section/resolve';
import type { SectionSnapshot, ZoneKind, ZoneRecord } from '@/lib/section/schema';
import { parseSectionText } from '@/lib/section/validate';
import { createUndoManager } from '@/lib/section/undo';
import type { UnitSystem } from '@/lib/units';
import type { Draft } from './draft';
import { draftClick, draftClose, draftUndo, emptyDraft } from './draft';
import type { HitSolid } from './hit';
import { boxOf, boxesInside, hitSolid, nearestPoint, rectBetween } from './hit';
import type { Guide, SnapTargets } from './snap';
import { snapMove, snapPoint, snapValue, targetsFromBoxes } from './snap';
import type { Store } from './store';
import { createStore } from './store';
import type { View } from './view';
import { fitBox, gridSpacing, panBy, toScreen, toWorld, zoomAt } from './view';

export type Tool = { type: 'select' } | { type: 'place-part'; kind: string } | { type: 'place-zone'; kind: ZoneKind } | { type: 'polygon' } | { type: 'cut' };

export interface Selection {
  parts: readonly string[];
  zones: readonly string[];
}

export interface SectionState {
  snapshot: SectionSnapshot;
  resolved: ResolvedSection;
  /** Solids for hit-testing, bottom first. */
  hits: HitSolid[];
  version: number;
}

export interface UiState {
  selection: Selection;
  tool: Tool;
  system: UnitSystem;
  grid: boolean;
  snap: boolean;
  help: boolean;
  /** Parts moving in the current gesture (drawn on their own layer). */
  moving: ReadonlySet<string> | null;
  /** Chosen vertex of the selected free polygon. */
  vertex: number | null;
  message: { text: string; tone: 'error' | 'info' } | null;
  /** Problems of a file that could not be opened. */
  fileProblems: string[] | null;
  canUndo: boolean;
  canRedo: boolean;
  readOnly: boolean;
  /** The saved cut line whose chart the readout shows. */
  activeCut: string | null;
}

/** What changes on every pointer move: drawn on the top layer only. */
export interface Transient {
  guides: Guide[];
  marquee: Box | null;
  cursor: Point | null;
  draft: Draft;
  zoneRect: Box | null;
  /** A refused handle or move, shown beside the pointer. */
  refusal: { text: string; sx: number; sy: number } | null;
  /** The cut line being drawn. */
  cut: [Point, Point] | null;
}

/** Where the pointer is over the drawing (world and screen), for the probe; null when it is off the board. */
export interface PointerSpot {
  w: [number, number];
  sx: number;
  sy: number;
  pointerType: string;
}

export interface PointerInput {
  sx: number;
  sy: number;
  button: number;
  shift: boolean;
  alt: boolean;
  ctrl: boolean;
  pointerId: number;
  pointerType: string;
  /** Clicks in a row (2 for a double click). */
  detail: number;
}

export interface KeyInput {
  key: string;
  shift: boolean;
  ctrl: boolean;
  alt: boolean;
}

/** A handle on screen: a kind's own parameter handle, a zone edge, a polygon vertex or edge midpoint. */
export type ScreenHandle =
  | { type: 'param'; partId: string; handle: Handle; at: Point }
  | { type: 'zone'; zoneId: string; edge: 'left' | 'right' | 'top' | 'bottom'; at: Point }
  | { type: 'vertex'; partId: string; index: number; at: Point }
  | { type: 'midpoint'; partId: string; after: number; at: Point };

type Gesture =
  | { type: 'none' }
  | { type: 'pending-move'; startS: [number, number]; startW: Point; parts: string[]; zones: string[]; clickedId: string | null; shift: boolean }
  | { type: 'move'; startW: Point; parts: string[]; zones: string[]; box: Box; targets: SnapTargets; applied: [number, number] }
  | { type: 'handle'; h: ScreenHandle & { type: 'param' }; startCoord: number; cross: number; startW: Point; targets: SnapTargets; applied: number }
  | { type: 'zone-edge'; zoneId: string; edge: 'left' | 'right' | 'top' | 'bottom'; startW: Point; start: { x: number; y: number; width: number; height: number }; targets: SnapTargets }
  | { type: 'vertex'; partId: string; index: number; origin: Point; targets: SnapTargets }
  | { type: 'marquee'; startW: Point; add: boolean; startS: [number, number] }
  | { type: 'pan'; startS: [number, number]; startView: View; moved: boolean; clearOnClick: boolean }
  | { type: 'zone-rect'; kind: ZoneKind; startW: Point }
  | { type: 'cut'; startW: Point }
  | { type: 'pinch'; startDist: number; startMid: [number, number]; startView: View };

export const ZONE_TITLES: Record<ZoneKind, string> = {
  indoor: 'Indoor air',
  outdoor: 'Outdoor air',
  'ground-surface': 'Ground surface',
  unconditioned: 'Unconditioned space',
  fixed: 'Fixed temperature',
};

/** Starting conditions of a new zone: example values, not code values. */
export const ZONE_DEFAULTS: Record<ZoneKind, Pick<ZoneRecord, 'design' | 'month' | 'rs'>> = {
  indoor: { design: { t: 20, rh: 50 }, month: { t: 20, rh: 50 }, rs: 'auto' },
  outdoor: { design: { t: -18, rh: null }, month: { t: -6, rh: null }, rs: 'auto' },
  'ground-surface': { design: { t: 4, rh: null }, month: { t: 2, rh: null }, rs: 'auto' },
  unconditioned: { design: { t: 5, rh: null }, month: { t: 8, rh: null }, rs: 'auto' },
  fixed: { design: { t: 10, rh: null }, month: { t: 10, rh: null }, rs: 0 },
};

const HANDLE_TOL = { mouse: 9, touch: 20 };
const SNAP_PX = 8;
const DRAG_START_PX = 3;

function emptyTransient(): Transient {
  return { guides: [], marquee: null, cursor: null, draft: emptyDraft(), zoneRect: null, refusal: null, cut: null };
}

function stateOf(snapshot: SectionSnapshot, version: number): SectionState {
  const resolved = resolveSection(snapshot);
  const hits: HitSolid[] = resolved.solids.map((s) => ({ partId: s.partId, polygon: s.polygon, box: boxOf(s.polygon) }));
  return { snapshot, resolved, hits, version };
}

export interface ControllerOptions {
  readOnly?: boolean;
  system?: UnitSystem;
  onPreview?: (s: SectionState) => void;
}

export class BoardController {
  readonly doc: Y.Doc;
  readonly origin: object;
  readonly undoManager: Y.UndoManager;
  /** The section as drawn: follows every change, also during a drag. */
  readonly section: Store<SectionState>;
  /** The section as the panels show it: updated when no gesture is under way. */
  readonly settled: Store<SectionState>;
  readonly view: Store<View>;
  readonly size: Store<{ width: number; height: number }>;
  readonly ui: Store<UiState>;
  readonly transient: Store<Transient>;
  /** The pointer over the drawing (updated on every move; only the probe listens). */
  readonly pointer: Store<PointerSpot | null> = createStore<PointerSpot | null>(null);

  private gesture: Gesture = { type: 'none' };
  private pointers = new Map<number, [number, number]>();
  private ownOp = false;
  private version = 0;
  private fitted = false;
  private spaceDown = false;
  private pendingMove: PointerInput | null = null;
  private raf = 0;
  private disposers: (() => void)[] = [];
  private readonly options: ControllerOptions;
  /** Called when the user asks to open a file (Ctrl+O): the board shows its file chooser. */
  onOpenRequest: (() => void) | null = null;
  onSaveRequest: (() => void) | null = null;

  constructor(doc: Y.Doc, origin: object, options: ControllerOptions = {}) {
    this.doc = doc;
    this.origin = origin;
    this.options = options;
    // Every user action is one undo step: the board ends each capture itself (see `action`).
    this.undoManager = createUndoManager(doc, origin, 1e12);
    const first = this.read() ?? stateOf(ops.currentSection(doc), 0);
    this.section = createStore(first);
    this.settled = createStore(first);
    this.view = createStore<View>({ k: 100, ox: 400, oy: 300 });
    this.size = createStore({ width: 800, height: 600 });
    this.ui = createStore<UiState>({
      selection: { parts: [], zones: [] },
      tool: { type: 'select' },
      system: options.system ?? 'si',
      grid: true,
      snap: true,
      help: false,
      moving: null,
      vertex: null,
      message: null,
      fileProblems: null,
      canUndo: false,
      canRedo: false,
      readOnly: !!options.readOnly,
      activeCut: null,
    });
    this.transient = createStore(emptyTransient());
    const onUpdate = () => {
      if (!this.ownOp) this.refresh();
    };
    doc.on('update', onUpdate);
    const onStack = () => this.patchUi({ canUndo: this.undoManager.undoStack.length > 0, canRedo: this.undoManager.redoStack.length > 0 });
    this.undoManager.on('stack-item-added', onStack);
    this.undoManager.on('stack-item-popped', onStack);
    this.undoManager.on('stack-cleared', onStack);
    this.disposers.push(() => doc.off('update', onUpdate), () => this.undoManager.destroy());
  }

  dispose() {
    if (this.raf) cancelAnimationFrame(this.raf);
    this.raf = 0;
    for (const d of this.disposers) d();
  }

  // ---- reading the document --------------------------------------------------------------------

  private read(): SectionState | null {
    const v = readSection(this.doc);
    if (!v.ok) return null;
    return stateOf(v.section, ++this.version);
  }

  private refresh() {
    const s = this.read();
    if (!s) {
      this.say('The shared document holds an invalid change; showing the last valid state.', 'error');
      return;
    }
    this.setSection(s);
  }

  private setSection(s: SectionState) {
    this.section.set(s);
    if (this.gesture.type === 'none' || this.gesture.type === 'pending-move') this.settled.set(s);
    this.options.onPreview?.(s);
    // Drop selected ids that no longer exist (undo of an add, a remote delete).
    const ui = this.ui.get();
    const parts = ui.selection.parts.filter((id) => s.resolved.parts.has(id));
    const zones = ui.selection.zones.filter((id) => s.snapshot.zones.some((z) => z.id === id));
    if (parts.length !== ui.selection.parts.length || zones.length !== ui.selection.zones.length) this.patchUi({ selection: { parts, zones }, vertex: null });
  }

  snapshot(): SectionSnapshot {
    return this.section.get().snapshot;
  }

  // ---- state helpers ---------------------------------------------------------------------------

  patchUi(p: Partial<UiState>) {
    this.ui.set((u) => ({ ...u, ...p }));
  }

  private patchTransient(p: Partial<Transient>) {
    this.transient.set((t) => ({ ...t, ...p }));
  }

  say(text: string, tone: 'error' | 'info' = 'info') {
    this.patchUi({ message: { text, tone } });
  }

  /**
   * Run named operations as one user action (one undo step). A refused edit leaves the document as it
   * was and returns the model's message.
   */
  action(fn: () => SectionSnapshot | string | string[] | void, opts: { quiet?: boolean; continueCapture?: boolean } = {}): string | null {
    if (this.ui.get().readOnly) {
      this.say('This section is view-only.', 'error');
      return 'This section is view-only.';
    }
    if (!opts.continueCapture) this.undoManager.stopCapturing();
    this.ownOp = true;
    try {
      const r = fn();
      this.ownOp = false;
      if (r && typeof r === 'object' && !Array.isArray(r) && 'parts' in r) this.setSection(stateOf(r, ++this.version));
      else this.refresh();
      if (!opts.continueCapture) this.undoManager.stopCapturing();
      if (!opts.quiet) this.patchUi({ message: null });
      return null;
    } catch (e) {
      this.ownOp = false;
      const text = e instanceof SectionError ? e.problems.map((p) => this.explain(p.path, p.message)).join('\n') : (e as Error).message;
      if (!opts.quiet) this.say(text, 'error');
      return text;
    }
  }

  /** A problem path such as parts[3].thickness, said with the part's name. */
  private explain(path: string, message: string): string {
    const m = /^parts\[(\d+)\]\.?(.*)$/.exec(path);
    if (m) {
      const p = this.snapshot().parts[Number(m[1])];
      const who = p ? p.name || partKind(p.kind)?.title || p.kind : `part ${m[1]}`;
      return `${who}${m[2] ? ` ${m[2]}` : ''}: ${message}`;
    }
    return formatProblem({ path, message });
  }

  // ---- view ------------------------------------------------------------------------------------

  setSize(width: number, height: number) {
    this.size.set({ width, height });
    if (!this.fitted && width > 0 && height > 0) {
      this.fitted = true;
      this.fitDetail();
    }
  }

  /** The junction: every part but the ground, which is usually far larger than the detail. */
  fitDetail() {
    const r = this.section.get().resolved;
    const boxes = [...r.parts.values()].filter((p) => p.record.kind !== 'soil').map((p) => p.box);
    if (!boxes.length) return this.fitAll();
    this.fitTo(boxes.reduce(unionBoxes), 48);
  }

  fitAll() {
    const r = this.section.get().resolved;
    if (!r.parts.size && !r.zones.length) {
      const { width, height } = this.size.get();
      this.view.set({ k: 200, ox: width / 2, oy: height / 2 });
      return;
    }
    this.fitTo(r.bounds);
  }

  fitSelection() {
    const b = this.selectionBox();
    if (b) this.fitTo(b, 64);
    else this.fitAll();
  }

  private fitTo(b: Box, margin = 32) {
    const { width, height } = this.size.get();
    this.view.set(fitBox(b, width, height, margin));
  }

  zoomBy(factor: number, sx?: number, sy?: number) {
    const { width, height } = this.size.get();
    this.view.set(zoomAt(this.view.get(), sx ?? width / 2, sy ?? height / 2, factor));
  }

  wheel(sx: number, sy: number, deltaY: number, deltaMode: number) {
    const d = deltaMode === 1 ? deltaY * 16 : deltaMode === 2 ? deltaY * 400 : deltaY;
    this.zoomBy(Math.exp(-d * 0.0015), sx, sy);
  }

  toWorld(sx: number, sy: number): [number, number] {
    return toWorld(this.view.get(), sx, sy);
  }

  toScreen(p: Point): [number, number] {
    return toScreen(this.view.get(), p);
  }

  /** Grid step in metres (minor lines), used for snapping and nudging. */
  gridStep(): number {
    return gridSpacing(this.view.get().k, this.ui.get().system).minor;
  }

  // ---- selection -------------------------------------------------------------------------------

  select(sel: Partial<Selection>) {
    this.patchUi({ selection: { parts: sel.parts ?? [], zones: sel.zones ?? [] }, vertex: null });
  }

  selectAll() {
    this.select({ parts: this.snapshot().parts.map((p) => p.id) });
  }

  selectionBox(): Box | null {
    const { selection } = this.ui.get();
    const r = this.section.get().resolved;
    const boxes: Box[] = [];
    for (const id of selection.parts) {
      const p = r.parts.get(id);
      if (p) boxes.push(p.box);
    }
    for (const z of r.zones) if (selection.zones.includes(z.zoneId) && z.polygon.length) boxes.push(boxOf(z.polygon));
    return boxes.length ? boxes.reduce(unionBoxes) : null;
  }

  /** Parts that follow the given ones through joins (transitively), including them. */
  followers(ids: Iterable<string>): Set<string> {
    const out = new Set(ids);
    const parts = this.snapshot().parts;
    let grew = true;
    while (grew) {
      grew = false;
      for (const p of parts) if (p.join && out.has(p.join.to) && !out.has(p.id)) {
        out.add(p.id);
        grew = true;
      }
    }
    return out;
  }

  // ---- edits (named operations) ----------------------------------------------------------------

  deleteSelection(): string | null {
    const { selection, vertex } = this.ui.get();
    if (vertex !== null && selection.parts.length === 1) return this.removeVertex(selection.parts[0], vertex);
    if (!selection.parts.length && !selection.zones.length) return null;
    const err = this.action(() => {
      if (selection.parts.length) ops.deleteParts(this.doc, this.origin, selection.parts);
      if (selection.zones.length) ops.deleteZones(this.doc, this.origin, selection.zones);
    });
    if (!err) this.select({});
    return err;
  }

  duplicateSelection(): string | null {
    const { selection } = this.ui.get();
    if (!selection.parts.length) return null;
    const step = this.gridStep() * 4;
    let fresh: string[] = [];
    const err = this.action(() => {
      fresh = ops.duplicateParts(this.doc, this.origin, selection.parts, step, -step);
    });
    if (!err) this.select({ parts: fresh });
    return err;
  }

  restack(where: 'up' | 'down' | 'top' | 'bottom'): string | null {
    const ids = this.ui.get().selection.parts;
    if (!ids.length) return null;
    return this.action(() => ops.restackParts(this.doc, this.origin, ids, where));
  }

  toggleLock(): string | null {
    const ids = this.ui.get().selection.parts;
    if (!ids.length) return null;
    const parts = this.snapshot().parts.filter((p) => ids.includes(p.id));
    const lock = parts.some((p) => !p.locked);
    return this.action(() => ops.setLocked(this.doc, this.origin, ids, lock));
  }

  nudge(dx: number, dy: number): string | null {
    const { selection } = this.ui.get();
    if (!selection.parts.length && !selection.zones.length) return null;
    return this.action(() => {
      if (selection.parts.length) ops.moveParts(this.doc, this.origin, selection.parts, dx, dy);
      for (const z of selection.zones) ops.moveZone(this.doc, this.origin, z, dx, dy);
    });
  }

  updatePart(id: string, patch: Record<string, unknown>): string | null {
    return this.action(() => ops.updatePart(this.doc, this.origin, id, patch), { quiet: true });
  }

  updateZone(id: string, patch: Partial<Omit<ZoneRecord, 'id'>>): string | null {
    return this.action(() => ops.updateZone(this.doc, this.origin, id, patch), { quiet: true });
  }

  setMaterial(ids: readonly string[], material: string): string | null {
    return this.action(() => ops.setPartMaterial(this.doc, this.origin, ids, material));
  }

  removeVertex(partId: string, index: number): string | null {
    const err = this.action(() => ops.removeVertex(this.doc, this.origin, partId, index));
    if (!err) this.patchUi({ vertex: null });
    return err;
  }

  placePart(kind: string, at: Point): string | null {
    let id = '';
    const err = this.action(() => {
      id = ops.addPart(this.doc, this.origin, { kind, x: round6(at[0]), y: round6(at[1]) });
    });
    if (!err) {
      this.select({ parts: [id] });
      this.say(`${partKind(kind)?.title ?? kind} placed. Drag its handles or type its sizes at the right.`);
    }
    return err;
  }

  placeZone(kind: ZoneKind, box: Box): string | null {
    let id = '';
    const err = this.action(() => {
      id = ops.addZone(this.doc, this.origin, {
        kind,
        name: ZONE_TITLES[kind],
        shape: { type: 'rect', x: round6(box.minX), y: round6(box.minY), width: round6(box.maxX - box.minX), height: round6(box.maxY - box.minY) },
        ...structuredClone(ZONE_DEFAULTS[kind]),
      });
    });
    if (!err) this.select({ zones: [id] });
    return err;
  }

  /** Save a cut line (rounded to micrometres) and show its chart. */
  addCut(from: Point, to: Point, name?: string): string | null {
    let id = '';
    const n = this.snapshot().cuts.length + 1;
    const err = this.action(() => {
      id = ops.putCut(this.doc, this.origin, { name: name ?? `Cut ${n}`, from: [round6(from[0]), round6(from[1])], to: [round6(to[0]), round6(to[1])] });
    });
    if (!err) {
      this.patchUi({ activeCut: id });
      this.say('Cut line saved; its temperature chart is in the readout.');
    }
    return err;
  }

  deleteCut(id: string): string | null {
    const err = this.action(() => ops.deleteCut(this.doc, this.origin, id));
    if (!err && this.ui.get().activeCut === id) this.patchUi({ activeCut: null });
    return err;
  }

  /**
   * A double click (the browser's dblclick event: pointer events carry no click count in Chromium, so
   * PointerInput.detail is 0 there). On a vertex of the selected free polygon it removes that vertex.
   */
  doubleClick(sx: number, sy: number, pointerType = 'mouse'): string | null {
    if (this.ui.get().readOnly || this.ui.get().tool.type !== 'select') return null;
    const h = this.handleAt(sx, sy, pointerType);
    return h?.type === 'vertex' ? this.removeVertex(h.partId, h.index) : null;
  }

  /** The pointer left the drawing. */
  pointerLeave() {
    if (this.gesture.type === 'none') this.pointer.set(null);
  }

  undo() {
    this.undoManager.stopCapturing();
    this.undoManager.undo();
    this.undoManager.stopCapturing();
  }

  redo() {
    this.undoManager.stopCapturing();
    this.undoManager.redo();
    this.undoManager.stopCapturing();
  }

  /** The section as a file's text. */
  saveText(): string {
    return JSON.stringify(this.snapshot(), null, 2) + '\n';
  }

  /** Open a file's text into this document (one undo step); bad files give `path: message` lines. */
  openText(text: string): string[] | null {
    const v = parseSectionText(text);
    if (!v.ok) {
      const lines = v.problems.map(formatProblem);
      this.patchUi({ fileProblems: lines });
      return lines;
    }
    const err = this.action(() => ops.replaceSection(this.doc, this.origin, v.section));
    if (err) {
      this.patchUi({ fileProblems: [err] });
      return [err];
    }
    this.patchUi({ fileProblems: null, selection: { parts: [], zones: [] } });
    this.fitDetail();
    this.say(`Opened '${v.section.name}'.`);
    return null;
  }

  setTool(tool: Tool) {
    this.patchUi({ tool });
    this.patchTransient({ draft: emptyDraft(), guides: [], zoneRect: null, cut: null });
    if (tool.type === 'polygon') this.say('Click the vertices; click the first one or press Enter to close; Esc to stop.');
    else if (tool.type === 'place-part') this.say(`Click on the board to place the ${partKind(tool.kind)?.title.toLowerCase() ?? tool.kind}.`);
    else if (tool.type === 'place-zone') this.say(`Drag a rectangle for the ${ZONE_TITLES[tool.kind].toLowerCase()} (or click for a 1 m square).`);
    else if (tool.type === 'cut') this.say('Drag a line across the section; the readout charts the temperature along it. Esc to stop.');
    else this.patchUi({ message: null });
  }

  // ---- handles ---------------------------------------------------------------------------------

  /** Handles of the single selected part or zone, in world coordinates. */
  handles(): ScreenHandle[] {
    const { selection } = this.ui.get();
    const st = this.section.get();
    const out: ScreenHandle[] = [];
    if (selection.parts.length === 1 && !selection.zones.length) {
      const rp = st.resolved.parts.get(selection.parts[0]);
      if (!rp || rp.record.locked) return out;
      const kind = partKind(rp.record.kind);
      if (!kind) return out;
      const params = partParams(rp.record);
      if (rp.record.kind === 'polygon') {
        const ring = (params.points as Point[]).slice(0, -1);
        ring.forEach((p, i) => out.push({ type: 'vertex', partId: rp.id, index: i, at: [p[0] + rp.origin[0], p[1] + rp.origin[1]] }));
        ring.forEach((p, i) => {
          const q = ring[(i + 1) % ring.length];
          out.push({ type: 'midpoint', partId: rp.id, after: i, at: [(p[0] + q[0]) / 2 + rp.origin[0], (p[1] + q[1]) / 2 + rp.origin[1]] });
        });
      } else for (const h of kind.handles(params as never)) out.push({ type: 'param', partId: rp.id, handle: h, at: [h.at[0] + rp.origin[0], h.at[1] + rp.origin[1]] });
    } else if (selection.zones.length === 1 && !selection.parts.length) {
      const z = st.snapshot.zones.find((x) => x.id === selection.zones[0]);
      if (z && z.shape.type === 'rect') {
        const { x, y, width: w, height: h } = z.shape;
        out.push(
          { type: 'zone', zoneId: z.id, edge: 'left', at: [x, y + h / 2] },
          { type: 'zone', zoneId: z.id, edge: 'right', at: [x + w, y + h / 2] },
          { type: 'zone', zoneId: z.id, edge: 'bottom', at: [x + w / 2, y] },
          { type: 'zone', zoneId: z.id, edge: 'top', at: [x + w / 2, y + h] },
        );
      }
    }
    return out;
  }

  private snapTargets(exclude: ReadonlySet<string>): SnapTargets {
    const r = this.section.get().resolved;
    const boxes: Box[] = [];
    for (const p of r.parts.values()) if (!exclude.has(p.id)) boxes.push(p.box);
    for (const z of r.zones) if (!exclude.has(z.zoneId) && z.polygon.length) boxes.push(boxOf(z.polygon));
    const t = targetsFromBoxes(boxes);
    // The world axes are targets too: grade (y = 0) and the reference line (x = 0).
    t.xs.push({ at: 0, lo: 0, hi: 0 });
    t.ys.push({ at: 0, lo: 0, hi: 0 });
    return t;
  }

  private snapTol(alt: boolean): number {
    return alt || !this.ui.get().snap ? -1 : SNAP_PX / this.view.get().k;
  }

  private gridFor(alt: boolean): number | null {
    const ui = this.ui.get();
    return alt || !ui.snap || !ui.grid ? null : this.gridStep();
  }

  // ---- pointer input ---------------------------------------------------------------------------

  pointerDown(e: PointerInput) {
    this.pointers.set(e.pointerId, [e.sx, e.sy]);
    this.pointer.set({ w: this.toWorld(e.sx, e.sy), sx: e.sx, sy: e.sy, pointerType: e.pointerType });
    if (this.pointers.size === 2) {
      // Two fingers: pinch and pan; any gesture under way is dropped (its edits stay as one undo step).
      this.endGesture();
      const [a, b] = [...this.pointers.values()];
      this.gesture = { type: 'pinch', startDist: Math.hypot(a[0] - b[0], a[1] - b[1]) || 1, startMid: [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2], startView: this.view.get() };
      return;
    }
    if (this.pointers.size > 2) return;
    const ui = this.ui.get();
    const w = this.toWorld(e.sx, e.sy);
    if (e.button === 1 || e.button === 2 || this.spaceDown) {
      this.gesture = { type: 'pan', startS: [e.sx, e.sy], startView: this.view.get(), moved: false, clearOnClick: false };
      return;
    }
    if (ui.readOnly) {
      this.gesture = { type: 'pan', startS: [e.sx, e.sy], startView: this.view.get(), moved: false, clearOnClick: false };
      this.clickSelect(w, e);
      return;
    }
    const tool = ui.tool;
    if (tool.type === 'polygon') {
      const tol = this.snapTol(e.alt);
      const p = tol > 0 ? snapPoint(w, this.snapTargets(new Set()), tol, this.gridFor(e.alt)).p : w;
      const r = draftClick(this.transient.get().draft, p, (e.pointerType === 'touch' ? 16 : 9) / this.view.get().k);
      this.applyDraft(r);
      return;
    }
    if (tool.type === 'place-part') {
      const tol = this.snapTol(e.alt);
      const p = tol > 0 ? snapPoint(w, this.snapTargets(new Set()), tol, this.gridFor(e.alt)).p : w;
      const err = this.placePart(tool.kind, p);
      if (!err && !e.shift) this.patchUi({ tool: { type: 'select' } });
      return;
    }
    if (tool.type === 'place-zone') {
      this.gesture = { type: 'zone-rect', kind: tool.kind, startW: this.snapped(w, e.alt) };
      return;
    }
    if (tool.type === 'cut') {
      this.gesture = { type: 'cut', startW: this.snapped(w, e.alt) };
      return;
    }
    // The pick tool: handles first, then parts, then zones, then empty space.
    const h = this.handleAt(e.sx, e.sy, e.pointerType);
    if (h) return this.startHandle(h, w, e);
    const partId = hitSolid(this.section.get().hits, w[0], w[1], 3 / this.view.get().k);
    const zoneId = partId ? null : this.zoneAt(w);
    if (partId || zoneId) {
      const sel = ui.selection;
      const id = (partId ?? zoneId)!;
      const isPart = !!partId;
      const inSel = isPart ? sel.parts.includes(id) : sel.zones.includes(id);
      let next: Selection = sel;
      if (e.shift) next = inSel ? { parts: sel.parts.filter((x) => x !== id), zones: sel.zones.filter((x) => x !== id) } : isPart ? { parts: [...sel.parts, id], zones: sel.zones } : { parts: sel.parts, zones: [...sel.zones, id] };
      else if (!inSel) next = isPart ? { parts: [id], zones: [] } : { parts: [], zones: [id] };
      if (next !== sel) this.patchUi({ selection: next, vertex: null });
      this.gesture = { type: 'pending-move', startS: [e.sx, e.sy], startW: w, parts: [...next.parts], zones: [...next.zones], clickedId: id, shift: e.shift };
      return;
    }
    if (e.pointerType === 'touch') this.gesture = { type: 'pan', startS: [e.sx, e.sy], startView: this.view.get(), moved: false, clearOnClick: true };
    else this.gesture = { type: 'marquee', startW: w, add: e.shift, startS: [e.sx, e.sy] };
  }

  private clickSelect(w: Point, e: PointerInput) {
    const partId = hitSolid(this.section.get().hits, w[0], w[1], 3 / this.view.get().k);
    const zoneId = partId ? null : this.zoneAt(w);
    if (partId) this.select({ parts: [partId] });
    else if (zoneId) this.select({ zones: [zoneId] });
    else if (!e.shift) this.select({});
  }

  private snapped(w: Point, alt: boolean): [number, number] {
    const tol = this.snapTol(alt);
    return tol > 0 ? snapPoint(w, this.snapTargets(new Set()), tol, this.gridFor(alt)).p : [w[0], w[1]];
  }

  /** The top-most zone at a world point (zones lie under every solid). */
  zoneAt(w: Point): string | null {
    const zones = this.section.get().resolved.zones;
    for (let i = zones.length - 1; i >= 0; i--) {
      const z = zones[i];
      if (!z.polygon.length) continue;
      const b = boxOf(z.polygon);
      if (w[0] >= b.minX && w[0] <= b.maxX && w[1] >= b.minY && w[1] <= b.maxY && hitSolid([{ partId: z.zoneId, polygon: z.polygon, box: b }], w[0], w[1])) return z.zoneId;
    }
    return null;
  }

  handleAt(sx: number, sy: number, pointerType = 'mouse'): ScreenHandle | null {
    const hs = this.handles();
    if (!hs.length) return null;
    const tol = pointerType === 'touch' ? HANDLE_TOL.touch : HANDLE_TOL.mouse;
    // Vertices and parameter handles win over edge midpoints.
    const primary = hs.filter((h) => h.type !== 'midpoint');
    let i = nearestPoint(primary.map((h) => this.toScreen(h.at)), sx, sy, tol);
    if (i >= 0) return primary[i];
    const mids = hs.filter((h) => h.type === 'midpoint');
    i = nearestPoint(mids.map((h) => this.toScreen(h.at)), sx, sy, tol * 0.8);
    return i >= 0 ? mids[i] : null;
  }

  private startHandle(h: ScreenHandle, w: Point, e: PointerInput) {
    this.undoManager.stopCapturing();
    if (h.type === 'param') {
      const axis = h.handle.axis === 'x' ? 0 : 1;
      this.beginMoving(new Set([h.partId]));
      this.gesture = { type: 'handle', h, startCoord: h.at[axis], cross: h.at[1 - axis], startW: w, targets: this.snapTargets(new Set([h.partId])), applied: 0 };
    } else if (h.type === 'zone') {
      const z = this.snapshot().zones.find((x) => x.id === h.zoneId)!;
      if (z.shape.type !== 'rect') return;
      this.gesture = { type: 'zone-edge', zoneId: h.zoneId, edge: h.edge, startW: w, start: { ...z.shape }, targets: this.snapTargets(new Set([h.zoneId])) };
    } else if (h.type === 'vertex') {
      if (e.detail >= 2) {
        this.removeVertex(h.partId, h.index);
        return;
      }
      this.patchUi({ vertex: h.index });
      const rp = this.section.get().resolved.parts.get(h.partId)!;
      this.beginMoving(new Set([h.partId]));
      this.gesture = { type: 'vertex', partId: h.partId, index: h.index, origin: rp.origin, targets: this.snapTargets(new Set([h.partId])) };
    } else if (h.type === 'midpoint') {
      const rp = this.section.get().resolved.parts.get(h.partId)!;
      const local: Point = [h.at[0] - rp.origin[0], h.at[1] - rp.origin[1]];
      const err = this.action(() => ops.insertVertex(this.doc, this.origin, h.partId, h.after, local), { continueCapture: true });
      if (err) return;
      this.patchUi({ vertex: h.after + 1 });
      this.beginMoving(new Set([h.partId]));
      this.gesture = { type: 'vertex', partId: h.partId, index: h.after + 1, origin: rp.origin, targets: this.snapTargets(new Set([h.partId])) };
    }
  }

  private beginMoving(ids: Set<string>) {
    this.patchUi({ moving: this.followers(ids) });
  }

  pointerMove(e: PointerInput) {
    if (this.pointers.has(e.pointerId)) this.pointers.set(e.pointerId, [e.sx, e.sy]);
    if (this.pointers.size <= 1) this.pointer.set({ w: this.toWorld(e.sx, e.sy), sx: e.sx, sy: e.sy, pointerType: e.pointerType });
    // Coalesce: one update per animation frame, with the latest pointer position.
    this.pendingMove = e;
    if (!this.raf) this.raf = requestAnimationFrame(() => {
      this.raf = 0;
      const m = this.pendingMove;
      this.pendingMove = null;
      if (m) this.applyMove(m);
    });
  }

  /** Apply a pointer move now (tests and benchmarks call it directly). */
  applyMove(e: PointerInput): void {
    const g = this.gesture;
    const w = this.toWorld(e.sx, e.sy);
    switch (g.type) {
      case 'none': {
        if (this.ui.get().tool.type === 'polygon') this.patchTransient({ cursor: this.snapped(w, e.alt) });
        return;
      }
      case 'pinch': {
        const [a, b] = [...this.pointers.values()];
        if (!a || !b) return;
        const dist = Math.hypot(a[0] - b[0], a[1] - b[1]) || 1;
        const mid: [number, number] = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
        const v = zoomAt(g.startView, g.startMid[0], g.startMid[1], dist / g.startDist);
        this.view.set(panBy(v, mid[0] - g.startMid[0], mid[1] - g.startMid[1]));
        return;
      }
      case 'pan': {
        const dx = e.sx - g.startS[0], dy = e.sy - g.startS[1];
        if (Math.hypot(dx, dy) > DRAG_START_PX) g.moved = true;
        this.view.set(panBy(g.startView, dx, dy));
        return;
      }
      case 'marquee':
        this.patchTransient({ marquee: rectBetween(g.startW, w) });
        return;
      case 'zone-rect':
        this.patchTransient({ zoneRect: rectBetween(g.startW, this.snapped(w, e.alt)) });
        return;
      case 'cut':
        this.patchTransient({ cut: [g.startW, this.snapped(w, e.alt)] });
        return;
      case 'pending-move': {
        if (Math.hypot(e.sx - g.startS[0], e.sy - g.startS[1]) < DRAG_START_PX) return;
        const parts = this.snapshot().parts;
        const locked = parts.filter((p) => g.parts.includes(p.id) && p.locked);
        if (locked.length) {
          this.gesture = { type: 'none' };
          this.say(`'${locked[0].name || locked[0].kind}' is locked; unlock it (L) to move it.`, 'error');
          return;
        }
        this.undoManager.stopCapturing();
        const moving = this.followers(g.parts);
        const r = this.section.get().resolved;
        const boxes = [...g.parts.map((id) => r.parts.get(id)?.box), ...r.zones.filter((z) => g.zones.includes(z.zoneId)).map((z) => boxOf(z.polygon))].filter((b): b is Box => !!b);
        if (!boxes.length) return;
        this.patchUi({ moving });
        this.gesture = { type: 'move', startW: g.startW, parts: g.parts, zones: g.zones, box: boxes.reduce(unionBoxes), targets: this.snapTargets(new Set([...moving, ...g.zones])), applied: [0, 0] };
        return this.applyMove(e);
      }
      case 'move': {
        const rawDx = w[0] - g.startW[0], rawDy = w[1] - g.startW[1];
        const tol = this.snapTol(e.alt);
        const s = tol > 0 || this.gridFor(e.alt) ? snapMove(g.box, rawDx, rawDy, g.targets, Math.max(tol, 0), this.gridFor(e.alt)) : { dx: rawDx, dy: rawDy, guides: [] };
        const ddx = round9(s.dx - g.applied[0]), ddy = round9(s.dy - g.applied[1]);
        if (ddx || ddy) {
          const err = this.action(() => {
            let last: SectionSnapshot | void = undefined;
            if (g.parts.length) last = ops.moveParts(this.doc, this.origin, g.parts, ddx, ddy);
            for (const z of g.zones) last = ops.moveZone(this.doc, this.origin, z, ddx, ddy);
            return last;
          }, { quiet: true, continueCapture: true });
          if (err) this.patchTransient({ refusal: { text: err, sx: e.sx, sy: e.sy } });
          else {
            g.applied = [s.dx, s.dy];
            this.patchTransient({ refusal: null });
          }
        }
        this.patchTransient({ guides: s.guides });
        return;
      }
      case 'handle': {
        const axis = g.h.handle.axis === 'x' ? 0 : 1;
        const raw = g.startCoord + (w[axis] - g.startW[axis]);
        const tol = this.snapTol(e.alt);
        const s = tol > 0 || this.gridFor(e.alt) ? snapValue(g.h.handle.axis, raw, g.cross, g.targets, Math.max(tol, 0), this.gridFor(e.alt)) : { v: raw, guide: null };
        const desired = s.v - g.startCoord;
        const inc = round9(desired - g.applied);
        if (inc) {
          const err = this.action(() => ops.dragHandle(this.doc, this.origin, g.h.partId, g.h.handle.id, inc), { quiet: true, continueCapture: true });
          if (err) this.patchTransient({ refusal: { text: err, sx: e.sx, sy: e.sy } });
          else {
            g.applied = desired;
            this.patchTransient({ refusal: null });
          }
        }
        this.patchTransient({ guides: s.guide ? [s.guide] : [] });
        return;
      }
      case 'zone-edge': {
        const tol = this.snapTol(e.alt);
        const horizontal = g.edge === 'left' || g.edge === 'right';
        const axis = horizontal ? 'x' : 'y';
        const raw = horizontal ? (g.edge === 'left' ? g.start.x : g.start.x + g.start.width) + (w[0] - g.startW[0]) : (g.edge === 'bottom' ? g.start.y : g.start.y + g.start.height) + (w[1] - g.startW[1]);
        const s = tol > 0 ? snapValue(axis, raw, horizontal ? w[1] : w[0], g.targets, tol, this.gridFor(e.alt)) : { v: raw, guide: null };
        const v = round6(s.v);
        const r = { ...g.start };
        if (g.edge === 'left') { r.width = g.start.x + g.start.width - v; r.x = v; }
        if (g.edge === 'right') r.width = v - g.start.x;
        if (g.edge === 'bottom') { r.height = g.start.y + g.start.height - v; r.y = v; }
        if (g.edge === 'top') r.height = v - g.start.y;
        const err = this.action(() => ops.updateZone(this.doc, this.origin, g.zoneId, { shape: { type: 'rect', ...r } }), { quiet: true, continueCapture: true });
        this.patchTransient({ refusal: err ? { text: err, sx: e.sx, sy: e.sy } : null, guides: s.guide ? [s.guide] : [] });
        return;
      }
      case 'vertex': {
        const tol = this.snapTol(e.alt);
        const s = tol > 0 ? snapPoint(w, g.targets, tol, this.gridFor(e.alt)) : { p: w, guides: [] };
        const local: Point = [round9(s.p[0] - g.origin[0]), round9(s.p[1] - g.origin[1])];
        const err = this.action(() => ops.moveVertex(this.doc, this.origin, g.partId, g.index, local), { quiet: true, continueCapture: true });
        this.patchTransient({ refusal: err ? { text: err, sx: e.sx, sy: e.sy } : null, guides: s.guides });
        return;
      }
    }
  }

  pointerUp(e: PointerInput) {
    if (this.raf) {
      cancelAnimationFrame(this.raf);
      this.raf = 0;
      const m = this.pendingMove;
      this.pendingMove = null;
      if (m) this.applyMove(m);
    }
    this.pointers.delete(e.pointerId);
    const g = this.gesture;
    if (g.type === 'pinch') {
      if (this.pointers.size < 2) this.gesture = { type: 'none' };
      return;
    }
    if (g.type === 'pending-move') {
      // A click on an already selected part (without shift) narrows the selection to it.
      const ui = this.ui.get();
      if (!g.shift && g.clickedId && ui.selection.parts.length + ui.selection.zones.length > 1) {
        const isPart = ui.selection.parts.includes(g.clickedId);
        this.select(isPart ? { parts: [g.clickedId] } : { zones: [g.clickedId] });
      }
    } else if (g.type === 'marquee') {
      const r = this.transient.get().marquee;
      if (r && Math.hypot(e.sx - g.startS[0], e.sy - g.startS[1]) > DRAG_START_PX) {
        const st = this.section.get();
        const parts = boxesInside([...st.resolved.parts.values()].map((p) => ({ id: p.id, box: p.box })), r);
        const zones = boxesInside(st.resolved.zones.filter((z) => z.polygon.length).map((z) => ({ id: z.zoneId, box: boxOf(z.polygon) })), r);
        const sel = this.ui.get().selection;
        this.select(g.add ? { parts: [...new Set([...sel.parts, ...parts])], zones: [...new Set([...sel.zones, ...zones])] } : { parts, zones });
      } else if (!g.add) this.select({});
    } else if (g.type === 'pan') {
      if (!g.moved && g.clearOnClick) this.select({});
    } else if (g.type === 'zone-rect') {
      const r = this.transient.get().zoneRect;
      const w = this.snapped(this.toWorld(e.sx, e.sy), e.alt);
      const box = r && r.maxX - r.minX > 1e-6 && r.maxY - r.minY > 1e-6 ? r : { minX: w[0], minY: w[1], maxX: w[0] + 1, maxY: w[1] + 1 };
      const err = this.placeZone(g.kind, box);
      if (!err && !e.shift) this.patchUi({ tool: { type: 'select' } });
    } else if (g.type === 'cut') {
      const to = this.snapped(this.toWorld(e.sx, e.sy), e.alt);
      const [a, b] = [this.toScreen(g.startW), this.toScreen(to)];
      if (Math.hypot(a[0] - b[0], a[1] - b[1]) >= 6) {
        const err = this.addCut(g.startW, to);
        if (!err && !e.shift) this.patchUi({ tool: { type: 'select' } });
      } else this.say('Drag to draw the cut line (a click is too short).', 'error');
    }
    this.endGesture();
  }

  pointerCancel(e: PointerInput) {
    this.pointers.delete(e.pointerId);
    this.endGesture();
  }

  private endGesture() {
    const wasEditing = ['move', 'handle', 'zone-edge', 'vertex'].includes(this.gesture.type);
    this.gesture = { type: 'none' };
    if (wasEditing) this.undoManager.stopCapturing();
    this.patchTransient({ guides: [], marquee: null, zoneRect: null, refusal: null, cut: null });
    if (this.ui.get().moving) this.patchUi({ moving: null });
    this.settled.set(this.section.get());
  }

  /** True while a drag edits the document (for the benchmark and tests). */
  isDragging(): boolean {
    return this.gesture.type !== 'none';
  }

  private applyDraft(r: ReturnType<typeof draftClick>) {
    if (r.type === 'continue') this.patchTransient({ draft: r.draft });
    else if (r.type === 'refused') {
      this.patchTransient({ draft: r.draft });
      this.say(`The polygon cannot close: ${r.message}.`, 'error');
    } else if (r.type === 'cancel') {
      this.patchTransient({ draft: emptyDraft() });
    } else if (r.type === 'close') {
      let id = '';
      const err = this.action(() => {
        id = ops.addPolygon(this.doc, this.origin, r.vertices.map(([x, y]) => [round9(x), round9(y)] as Point));
      });
      if (err) return;
      this.patchTransient({ draft: emptyDraft(), cursor: null });
      this.patchUi({ tool: { type: 'select' }, selection: { parts: [id], zones: [] } });
      this.say('Polygon added. Drag its vertices; drag an edge midpoint to add one; double-click a vertex to remove it.');
    }
  }

  // ---- keyboard --------------------------------------------------------------------------------

  /** Returns true when the key was the board's. */
  keyDown(k: KeyInput): boolean {
    const ui = this.ui.get();
    const key = k.key;
    const lower = key.length === 1 ? key.toLowerCase() : key;
    if (key === ' ') {
      this.spaceDown = true;
      return true;
    }
    if (k.ctrl) {
      if (lower === 'z' && !k.shift) return this.undo(), true;
      if ((lower === 'z' && k.shift) || lower === 'y') return this.redo(), true;
      if (lower === 'd') return this.duplicateSelection(), true;
      if (lower === 'a') return this.selectAll(), true;
      if (lower === 's') return this.onSaveRequest?.(), true;
      if (lower === 'o') return this.onOpenRequest?.(), true;
      return false;
    }
    if (ui.tool.type === 'polygon') {
      if (key === 'Enter') return this.applyDraft(draftClose(this.transient.get().draft)), true;
      if (key === 'Backspace') return this.applyDraft(draftUndo(this.transient.get().draft)), true;
      if (key === 'Escape') return this.setTool({ type: 'select' }), true;
    }
    switch (key) {
      case 'Escape':
        if (ui.help) this.patchUi({ help: false });
        else if (ui.tool.type !== 'select') this.setTool({ type: 'select' });
        else if (ui.fileProblems) this.patchUi({ fileProblems: null });
        else this.select({});
        return true;
      case 'Delete':
      case 'Backspace':
        this.deleteSelection();
        return true;
      case '?':
        this.patchUi({ help: !ui.help });
        return true;
      case ']':
      case '}':
        this.restack(k.shift ? 'top' : 'up');
        return true;
      case '[':
      case '{':
        this.restack(k.shift ? 'bottom' : 'down');
        return true;
      case '0':
        this.fitAll();
        return true;
      case '+':
      case '=':
        this.zoomBy(1.25);
        return true;
      case '-':
      case '_':
        this.zoomBy(0.8);
        return true;
      case 'ArrowLeft':
      case 'ArrowRight':
      case 'ArrowUp':
      case 'ArrowDown': {
        const s = this.gridStep() * (k.shift ? 10 : 1);
        const [dx, dy] = key === 'ArrowLeft' ? [-s, 0] : key === 'ArrowRight' ? [s, 0] : key === 'ArrowUp' ? [0, s] : [0, -s];
        this.nudge(dx, dy);
        return true;
      }
    }
    switch (lower) {
      case 'v':
        this.setTool({ type: 'select' });
        return true;
      case 'p':
        this.setTool({ type: 'polygon' });
        return true;
      case 'c':
        this.setTool({ type: 'cut' });
        return true;
      case 'f':
        this.fitSelection();
        return true;
      case 'l':
        this.toggleLock();
        return true;
      case 'g':
        this.patchUi({ grid: !ui.grid });
        return true;
      case 'm':
        this.patchUi({ snap: !ui.snap });
        this.say(ui.snap ? 'Snapping off.' : 'Snapping on.');
        return true;
      case 'u':
        this.patchUi({ system: ui.system === 'si' ? 'ip' : 'si' });
        return true;
    }
    return false;
  }

  keyUp(k: KeyInput) {
    if (k.key === ' ') this.spaceDown = false;
  }
}

function unionBoxes(a: Box, b: Box): Box {
  return { minX: Math.min(a.minX, b.minX), minY: Math.min(a.minY, b.minY), maxX: Math.max(a.maxX, b.maxX), maxY: Math.max(a.maxY, b.maxY) };
}

/** Round away floating-point dust (nanometres) so saved files read cleanly. */
const round9 = (v: number) => Math.round(v * 1e9) / 1e9;
/** Micrometres, for positions placed by a pointer. */
const round6 = (v: number) => Math.round(v * 1e6) / 1e6;
