/// <reference lib="webworker" />
/**
 * The solver worker: plain messages in and out. One solve at a time, by the policy in scheduler.ts
 * (SolveQueue): a newer preview waits for the running preview and starts the moment it ends; a release
 * or a cancel aborts the running solve between iterations. The last results of each mesh level
 * warm-start the next.
 */
import { solveSectionSteps } from '@/lib/thermal/section';
import type { SectionResults } from '@/lib/thermal/types';
import type { SectionSnapshot } from '@/lib/section/schema';
import type { FromWorker, Raster, ToWorker } from './protocol';
import type { QueueAction } from './scheduler';
import { SolveQueue } from './scheduler';
import { buildLut, levels, rangeOf, rasterize } from './colour';
import { isotherms } from './contours';
import { channelPause, runSliced } from './drive';

const scope = self as unknown as DedicatedWorkerGlobalScope;
type SolveMessage = Extract<ToWorker, { type: 'solve' }>;
const queue = new SolveQueue<SolveMessage>();
const tokens = new Map<number, { aborted: boolean }>();
const last: Partial<Record<string, SectionResults>> = {};
const clock = () => performance.timeOrigin + performance.now();
const LUT = buildLut();
const pause = channelPause();

scope.onmessage = (e: MessageEvent<ToWorker>) => {
  const m = e.data;
  act(m.type === 'cancel' ? queue.cancel(m.id) : queue.solve(m));
};

function act(actions: QueueAction<SolveMessage>[]) {
  for (const a of actions) {
    if (a.type === 'abort') {
      const t = tokens.get(a.id);
      if (t) t.aborted = true;
    } else if (a.type === 'drop') post({ type: 'cancelled', id: a.id });
    else void run(a.job);
  }
}

async function run(m: SolveMessage) {
  const { id, mesh } = m;
  const snapshot = m.snapshot as SectionSnapshot;
  const isoStep = m.isoStep ?? null;
  const token = { aborted: false };
  tokens.set(id, token);
  const startedAt = clock();
  const t0 = performance.now();
  const timer = setInterval(() => post({ type: 'progress', id, elapsedMs: performance.now() - t0 }), 250);
  try {
    // Preview solves start from the last preview; release solves start cold, so they equal `dewline solve` to the last digit.
    const warm = mesh === 'preview' ? last.preview ?? last.default ?? null : null;
    const results = await runSliced(solveSectionSteps(snapshot, { mesh, signal: token, warmStart: warm }), token, pause);
    last[mesh] = results;
    const t1 = performance.now();
    const t = new Float64Array(results.field.t.length);
    for (let k = 0; k < t.length; k++) { const v = results.field.t[k]; t[k] = v === null ? NaN : v; }
    const lean: SectionResults = { ...results, field: { xs: results.field.xs, ys: results.field.ys, t: [] } };
    // Isotherms are traced here (about 0.1 s on a 15 000-cell field), off the page's main thread.
    let iso: { step: number; lines: ReturnType<typeof isotherms> } | null = null;
    if (isoStep && isoStep > 0) {
      const range = rangeOf(results.zones.filter((z) => z.touches).map((z) => z.design.t));
      iso = { step: isoStep, lines: isotherms({ xs: results.field.xs, ys: results.field.ys, nx: results.field.xs.length - 1, ny: results.field.ys.length - 1, t }, levels(range, isoStep)) };
    }
    const t2 = performance.now();
    // The colours for the view the page had when it asked: the page only copies the pixels in.
    let raster: Raster | null = null;
    if (m.raster && m.raster.width > 0 && m.raster.height > 0) {
      const { view, width, height, alpha } = m.raster;
      const pixels = new Uint8ClampedArray(width * height * 4);
      const range = rangeOf(results.zones.filter((z) => z.touches).map((z) => z.design.t));
      rasterize({ xs: results.field.xs, ys: results.field.ys, nx: results.field.xs.length - 1, ny: results.field.ys.length - 1, t }, range, LUT, view, width, height, pixels, alpha);
      raster = { view, width, height, alpha, pixels };
    }
    const t3 = performance.now();
    // The field and the pixels go over as transferred buffers, not copied.
    const transfer: Transferable[] = [t.buffer];
    if (raster) transfer.push(raster.pixels.buffer);
    post({ type: 'result', id, results: lean, field: t, ms: performance.now() - t0, iso, raster, sentAt: m.sentAt, startedAt, postedAt: clock(), parts: { solveMs: t1 - t0, isoMs: t2 - t1, rasterMs: t3 - t2 } }, transfer);
  } catch (err) {
    const e = err as Error;
    if (e?.name === 'AbortError') post({ type: 'cancelled', id });
    else post({ type: 'error', id, message: e?.message ?? String(err) });
  } finally {
    clearInterval(timer);
    tokens.delete(id);
    // The waiting preview starts here, without a round trip through the page. First one trip through the
    // event loop: the solve's last slice (the results) runs for tens of milliseconds without a pause, and
    // the page's newer requests posted meanwhile are read only now; without the trip the worker started
    // the request it held from before that slice, a drawing already several moves old.
    await pause();
    act(queue.finished(id));
  }
}

function post(m: FromWorker, transfer: Transferable[] = []) {
  scope.postMessage(m, transfer);
}
