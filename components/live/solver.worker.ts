/// <reference lib="webworker" />
/**
 * The solver worker: plain messages in and out. One solve at a time; a cancel message (or a newer solve)
 * aborts the running one between iterations. The last results of each mesh level warm-start the next.
 */
import { solveSection } from '@/lib/thermal/section';
import type { SectionResults } from '@/lib/thermal/types';
import type { SectionSnapshot } from '@/lib/section/schema';
import type { FromWorker, ToWorker } from './protocol';
import { levels, rangeOf } from './colour';
import { isotherms } from './contours';

const scope = self as unknown as DedicatedWorkerGlobalScope;
let current: { id: number; token: { aborted: boolean } } | null = null;
const last: Partial<Record<string, SectionResults>> = {};

scope.onmessage = (e: MessageEvent<ToWorker>) => {
  const m = e.data;
  if (m.type === 'cancel') {
    if (current && current.id === m.id) current.token.aborted = true;
    return;
  }
  if (m.type === 'solve') {
    if (current) current.token.aborted = true;
    void run(m.id, m.snapshot as SectionSnapshot, m.mesh, m.isoStep ?? null);
  }
};

async function run(id: number, snapshot: SectionSnapshot, mesh: 'preview' | 'default' | 'fine', isoStep: number | null) {
  const token = { aborted: false };
  current = { id, token };
  const t0 = performance.now();
  const timer = setInterval(() => post({ type: 'progress', id, elapsedMs: performance.now() - t0 }), 250);
  try {
    // Preview solves start from the last preview; release solves start cold, so they equal `dewline solve` to the last digit.
    const warm = mesh === 'preview' ? last.preview ?? last.default ?? null : null;
    const results = await solveSection(snapshot, { mesh, signal: token, warmStart: warm });
    last[mesh] = results;
    const t = new Float64Array(results.field.t.length);
    for (let k = 0; k < t.length; k++) { const v = results.field.t[k]; t[k] = v === null ? NaN : v; }
    const lean: SectionResults = { ...results, field: { xs: results.field.xs, ys: results.field.ys, t: [] } };
    // Isotherms are traced here (about 0.1 s on a 15 000-cell field), off the page's main thread.
    let iso: { step: number; lines: ReturnType<typeof isotherms> } | null = null;
    if (isoStep && isoStep > 0) {
      const range = rangeOf(results.zones.filter((z) => z.touches).map((z) => z.design.t));
      iso = { step: isoStep, lines: isotherms({ xs: results.field.xs, ys: results.field.ys, nx: results.field.xs.length - 1, ny: results.field.ys.length - 1, t }, levels(range, isoStep)) };
    }
    post({ type: 'result', id, results: lean, field: t, ms: performance.now() - t0, iso }, [t.buffer]);
  } catch (err) {
    const e = err as Error;
    if (e?.name === 'AbortError') post({ type: 'cancelled', id });
    else post({ type: 'error', id, message: e?.message ?? String(err) });
  } finally {
    clearInterval(timer);
    if (current?.id === id) current = null;
  }
}

function post(m: FromWorker, transfer: Transferable[] = []) {
  scope.postMessage(m, transfer);
}
