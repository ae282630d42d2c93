/**
 * The live session: watches the board's drawn section, asks the worker for solves through the scheduler
 * (preview mesh while dragging, default mesh otherwise), and holds the newest results in a small store.
 * Results older than the drawing are kept on screen, marked stale, until fresh ones arrive.
 */
import type { BoardController } from '@/components/board/controller';
import type { Store } from '@/components/board/store';
import { createStore } from '@/components/board/store';
import type { SectionSnapshot } from '@/lib/section/schema';
import type { SectionResults } from '@/lib/thermal/types';
import type { GridField } from './colour';
import { PREVIEW_RASTER_SCALE, rasterFrame } from './colour';
import type { Isotherm } from './contours';
import type { LiveOptions } from './options';
import type { FromWorker, Raster, ToWorker, WorkParts } from './protocol';
import type { Effect, Mesh } from './scheduler';
import { Scheduler } from './scheduler';

export interface LiveState {
  results: SectionResults | null;
  field: GridField | null;
  /** Section version the shown results belong to. */
  version: number;
  /** Version of the drawing when the results last turned stale or fresh. */
  drawn: number;
  stale: boolean;
  busy: { mesh: Mesh; elapsedMs: number } | null;
  error: string | null;
  /** Results received so far (tests and the benchmark count them). */
  refreshes: number;
  lastMs: number;
  stopped: boolean;
  /** Mesh level of the shown results. */
  mesh: Mesh | null;
  /** Isotherms traced by the worker for the shown results, at `step` K. */
  iso: { step: number; lines: Isotherm[] } | null;
  /** The colours painted by the worker for the view of the request (the overlay paints them itself for any other view). */
  raster: Raster | null;
}

/** Resolution of the colour raster for results of a mesh level: lower for previews (see PREVIEW_RASTER_SCALE). */
export const rasterScale = (mesh: Mesh | null): number => (mesh === 'preview' ? PREVIEW_RASTER_SCALE : 1);

/** Opacity of the colour raster over the parts, 0 to 255. */
export const RASTER_ALPHA = 235;

/**
 * The page's record of its traffic with the worker, for the benchmark (window.__dewline.liveLog): every
 * request posted, every result and cancel received, on the page's clock (timeOrigin + now, ms). Bounded.
 */
export interface DeliveryLog {
  posts: { id: number; mesh: Mesh; at: number }[];
  results: { id: number; mesh: Mesh | null; sentAt: number; startedAt: number; postedAt: number; handledAt: number; ms: number; parts: WorkParts | null; rasterBytes: number; shown: boolean }[];
  cancelled: { id: number; at: number }[];
}
const LOG_MAX = 4000;
const pushBounded = <T,>(a: T[], x: T) => { a.push(x); if (a.length > LOG_MAX) a.splice(0, a.length - LOG_MAX); };

export interface Baseline { results: SectionResults; snapshot: SectionSnapshot }

export class LiveSession {
  readonly state: Store<LiveState>;
  readonly baseline: Store<Baseline | null> = createStore<Baseline | null>(null);
  controller: BoardController | null = null;
  private worker: Worker | null = null;
  private sched = new Scheduler<SectionSnapshot>();
  private shownId = 0;
  private queued = false;
  private lastSent = { version: -1, mesh: '' as string };
  private snapshots = new Map<number, SectionSnapshot>();
  private off: (() => void)[] = [];
  readonly log: DeliveryLog = { posts: [], results: [], cancelled: [] };

  /** `options` (optional): the viewer's isotherm interval is traced in the worker with each solve. */
  constructor(private readonly options: LiveOptions | null = null) {
    this.state = createStore<LiveState>({ results: null, field: null, version: -1, drawn: 0, stale: true, busy: null, error: null, refreshes: 0, lastMs: 0, stopped: false, mesh: null, iso: null, raster: null });
  }

  attach(c: BoardController) {
    if (this.controller === c) return;
    this.detach();
    this.controller = c;
    this.worker = new Worker(new URL('./solver.worker.ts', import.meta.url), { type: 'module' });
    this.worker.onmessage = (e: MessageEvent<FromWorker>) => this.receive(e.data);
    this.off.push(c.section.subscribe(() => this.schedule()), c.settled.subscribe(() => this.schedule()));
    this.schedule();
  }

  detach() {
    for (const f of this.off) f();
    this.off = [];
    this.worker?.terminate();
    this.worker = null;
    this.controller = null;
  }

  private patch(p: Partial<LiveState>) {
    this.state.set((s) => ({ ...s, ...p }));
  }

  /**
   * Coalesce changes to one request per task: the request is posted in a microtask after the change,
   * not in the next animation frame. A drag applies its move inside the board's animation-frame callback,
   * so waiting for the next frame held every request back by a frame, and by the whole of that frame's
   * rendering when it was a long one; the worker, done with its preview, sat idle meanwhile.
   */
  private schedule() {
    const c = this.controller;
    if (!c) return;
    // Patch only when staleness flips: a drag changes the drawing on every frame, and the readout need not re-render for it.
    const drawn = c.section.get().version, stale = this.state.get().version !== drawn;
    if (stale !== this.state.get().stale) this.patch({ drawn, stale });
    if (this.queued) return;
    this.queued = true;
    queueMicrotask(() => {
      this.queued = false;
      this.sendCurrent();
    });
  }

  private sendCurrent(force = false) {
    const c = this.controller;
    if (!c) return;
    const s = c.section.get();
    const mesh: Mesh = c.isDragging() ? 'preview' : 'default';
    if (!force && this.lastSent.version === s.version && this.lastSent.mesh === mesh) return;
    this.lastSent = { version: s.version, mesh };
    this.snapshots.set(s.version, s.snapshot);
    for (const k of this.snapshots.keys()) if (this.snapshots.size > 40) this.snapshots.delete(k);
    this.apply(this.sched.request(s.snapshot, mesh, s.version));
    this.patch({ stopped: false });
  }

  /** Solve the drawing again at the default mesh (after a stop). */
  resume() {
    this.sendCurrent(true);
  }

  stop() {
    this.apply(this.sched.stop());
    this.patch({ busy: null, stopped: true });
  }

  private apply(effects: Effect<SectionSnapshot>[]) {
    for (const e of effects) {
      if (e.type === 'cancel') this.post({ type: 'cancel', id: e.id });
      else {
        const o = this.options?.get();
        const c = this.controller;
        const size = c?.size.get();
        // Previews (a drag) are painted at a lower resolution: a quarter of the pixels to paint, send and draw.
        const raster = c && size && (!o || o.colours) ? { ...rasterFrame(c.view.get(), size.width, size.height, rasterScale(e.req.mesh)), alpha: RASTER_ALPHA } : null;
        const sentAt = performance.timeOrigin + performance.now();
        this.post({ type: 'solve', id: e.req.id, snapshot: e.req.snapshot, mesh: e.req.mesh, isoStep: o && o.isotherms ? o.step : null, sentAt, raster });
        pushBounded(this.log.posts, { id: e.req.id, mesh: e.req.mesh, at: sentAt });
        this.patch({ busy: { mesh: e.req.mesh, elapsedMs: 0 } });
      }
    }
    if (!this.sched.busy) this.patch({ busy: null });
  }

  private post(m: ToWorker) {
    this.worker?.postMessage(m);
  }

  private receive(m: FromWorker) {
    if (m.type === 'progress') {
      const r = this.sched.get(m.id);
      if (r && !this.state.get().stopped) this.patch({ busy: { mesh: r.mesh, elapsedMs: m.elapsedMs } });
      return;
    }
    // Every request is answered once; look it up by id (the worker may have started an older one than the page last posted).
    const req = this.sched.done(m.id);
    const handledAt = performance.timeOrigin + performance.now();
    if (m.type === 'result') pushBounded(this.log.results, { id: m.id, mesh: req?.mesh ?? null, sentAt: m.sentAt ?? NaN, startedAt: m.startedAt ?? NaN, postedAt: m.postedAt ?? NaN, handledAt, ms: m.ms, parts: m.parts ?? null, rasterBytes: m.raster?.pixels.byteLength ?? 0, shown: Scheduler.fresher(m.id, this.shownId) });
    else if (m.type === 'cancelled') pushBounded(this.log.cancelled, { id: m.id, at: handledAt });
    if (m.type === 'result' && Scheduler.fresher(m.id, this.shownId)) {
      this.shownId = m.id;
      const version = req?.version ?? this.state.get().version;
      const field: GridField = { xs: m.results.field.xs, ys: m.results.field.ys, nx: m.results.field.xs.length - 1, ny: m.results.field.ys.length - 1, t: m.field };
      const drawn = this.controller?.section.get().version ?? version;
      const prev = this.state.get();
      this.patch({ results: m.results, field, version, stale: version !== drawn, mesh: req?.mesh ?? null, error: null, refreshes: prev.refreshes + 1, lastMs: m.ms, iso: m.iso ?? null, raster: m.raster ?? null });
      // Delivery figures for the benchmark: request to solve start, and result posted to handled here.
      const now = performance.timeOrigin + performance.now();
      const lag = { toWorkerMs: m.startedAt !== undefined && m.sentAt !== undefined ? m.startedAt - m.sentAt : NaN, backMs: m.postedAt !== undefined ? now - m.postedAt : NaN };
      expose(this, m.results, req?.mesh ?? null, version, m.ms, lag);
    } else if (m.type === 'error' && req) this.patch({ error: m.message });
    if (!this.sched.busy) this.patch({ busy: null });
    // A preview that finished after the release, or anything missed: make sure the drawing gets its default solve.
    if (!this.sched.busy && this.controller && !this.controller.isDragging() && this.lastSent.mesh !== 'default') this.sendCurrent();
  }

  pinBaseline() {
    const r = this.state.get().results;
    const snap = this.snapshots.get(this.state.get().version) ?? this.controller?.snapshot();
    if (r && snap) this.baseline.set({ results: r, snapshot: snap });
  }
}

function expose(s: LiveSession, results: SectionResults, mesh: Mesh | null, version: number, ms: number, lag: { toWorkerMs: number; backMs: number }) {
  if (typeof window === 'undefined') return;
  const w = window as unknown as { __dewline?: Record<string, unknown> };
  w.__dewline ??= {};
  w.__dewline.results = results;
  w.__dewline.liveLog = s.log;
  w.__dewline.live = { mesh, version, refreshes: s.state.get().refreshes, stale: s.state.get().stale, at: performance.now(), ms, cells: results.mesh.cells, ...lag, snapshot: s.controller?.snapshot() };
}
