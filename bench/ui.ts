/**
 * npm run bench:ui: the real app in Chromium (Debian's, or $CHROMIUM_PATH), figures only, never pass/fail.
 *
 * For each template, and for a stress section of 200 parts on screen (our own: the slab-edge template
 * plus small board pieces laid out in the ground), it drags the footing slowly with the mouse and
 * measures in the page:
 *   - frame intervals (requestAnimationFrame) while idle and while dragging;
 *   - long tasks (PerformanceObserver 'longtask': every main-thread task over 50 ms);
 *   - result refreshes per second while dragging (results from the worker at the preview mesh);
 *   - the preview solve time reported by the worker and the default solve after release.
 * Targets: at least 10 refreshes per second while dragging; no main-thread task over 50 ms.
 * Ratios are taken within the same run (drag frame vs idle frame, refresh interval vs preview solve time).
 *
 * The server is started the way playwright.config.ts starts it (built app, loopback, its own SQLite
 * file), unless DEWLINE_URL names a running one. Options: --drag-ms 3000, --only NAME, --json FILE,
 * --profile (main-thread functions by self time), --trace FILE (a Chromium trace of the drag, summarised),
 * --snap (drag with snapping on; by default Alt is held so every move changes the drawing).
 * --layers (canvas redraws per second and animation-frame time during the drag).
 */
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium } from 'playwright-core';
import type { Page } from 'playwright-core';
import { docFromSnapshot } from '../lib/section/doc';
import { addPart, currentSection } from '../lib/section/ops';
import type { SectionSnapshot } from '../lib/section/schema';
import { TEMPLATES, templateByName } from '../lib/section/templates/index';
import { buildIfStale, root } from '../scripts/build-if-stale.mjs';
import { findChromium } from '../scripts/find-chromium.mjs';

const arg = (name: string, def: string) => (process.argv.includes(name) ? process.argv[process.argv.indexOf(name) + 1] : def);
const DRAG_MS = Number(arg('--drag-ms', '3000'));
const ONLY = arg('--only', '');
const JSON_OUT = arg('--json', '');
/** --profile: also print the page's main-thread functions by self time during the drag (CDP profiler). */
const PROFILE = process.argv.includes('--profile');
/** --trace FILE: also write a Chromium trace of the drag (main-thread tasks, painting, compositing) to FILE (one case). */
const TRACE = arg('--trace', '');
/** --snap: drag with snapping on (grid and edges), as the tables before 2026-12-03 did; default: Alt held, no snapping. */
const SNAP = process.argv.includes('--snap');
/** --log FILE: also write the page's raw delivery log (requests, results, cancels) of the drag to FILE (one case). */
const LOG = arg('--log', '');
/** --layers: also print, per canvas of the board, how often it was cleared (one Konva layer draw each) during the drag, and the time in animation-frame callbacks. */
const LAYERS = process.argv.includes('--layers');
const TARGET_RPS = 10;
const TARGET_TASK_MS = 50;

/** The slab-edge template plus small boards in the ground until the section holds `total` parts. */
export function stressSection(total = 200): SectionSnapshot {
  const doc = docFromSnapshot(templateByName('slab-edge-break')!.build());
  const origin = { who: 'bench' };
  let n = currentSection(doc).parts.length;
  for (let j = 0; n < total; j++)
    for (let i = 0; i < 19 && n < total; i++, n++)
      addPart(doc, origin, { kind: 'board', x: 0.5 + i * 0.15, y: -0.45 - j * 0.15, name: `piece ${n}`, params: { orientation: 'horizontal', thickness: 0.05, length: 0.08 } });
  const s = currentSection(doc);
  s.name = 'Stress section: 200 parts';
  doc.destroy();
  return s;
}

async function startServer(): Promise<{ url: string; stop: () => void }> {
  if (process.env.DEWLINE_URL) return { url: process.env.DEWLINE_URL.replace(/\/$/, ''), stop: () => {} };
  if (buildIfStale() !== 0) throw new Error('next build failed');
  const port = Number(process.env.DEWLINE_BENCH_PORT ?? 3500 + Math.floor(Math.random() * 400));
  const child = spawn(process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), 'server/main.ts'], {
    cwd: root,
    env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', NODE_ENV: 'production', DEWLINE_DB: path.join(os.tmpdir(), `dewline-bench-${process.pid}.sqlite`) },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const url = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 240; i++) {
    try {
      if ((await fetch(`${url}/healthz`)).ok) return { url, stop: () => child.kill('SIGTERM') };
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 500));
  }
  child.kill('SIGTERM');
  throw new Error('the server did not start');
}

/**
 * In the page: record frame times, long tasks and result arrivals from now on. Plain JavaScript text, so
 * the bundler's helpers (tsx names functions) do not leak into the page.
 */
const INSTALL = `(() => {
  const b = (window.__bench = { frames: [], tasks: [], results: [], drawn: [], last: -1, lastDrawn: -1 });
  new PerformanceObserver((list) => {
    for (const e of list.getEntries()) b.tasks.push({ at: e.startTime, ms: e.duration });
  }).observe({ type: 'longtask', buffered: false });
  function tick(t) {
    b.frames.push(t);
    const c = window.__dewline.controller;
    const dv = c ? c.section.get().version : -1;
    if (dv !== b.lastDrawn) { b.lastDrawn = dv; b.drawn.push(t); }
    const l = window.__dewline.live;
    if (l && l.refreshes !== b.last) {
      b.last = l.refreshes;
      b.results.push({ at: l.at, mesh: l.mesh, version: l.version, ms: l.ms, cells: l.cells, toWorkerMs: l.toWorkerMs, backMs: l.backMs });
    }
    requestAnimationFrame(tick);
  }
  requestAnimationFrame(tick);
})()`;

interface Figures {
  name: string;
  parts: number;
  idleFrameP50: number;
  dragFrameP50: number;
  dragFrameP95: number;
  dragFrameMax: number;
  framesOver50: number;
  dragFrames: number;
  longTasks: number;
  longestTaskMs: number;
  refreshesPerSecond: number;
  /** Distinct drawn states of the section per second during the drag (the snapped moves): the most results there can be. */
  drawnPerSecond: number;
  previewResults: number;
  previewSolveMsMedian: number;
  previewCells: number;
  /** Median of request posted -> solve started in the worker, and result posted -> handled by the page, ms. */
  toWorkerMsMedian: number;
  backMsMedian: number;
  defaultSolveMs: number;
  defaultCells: number;
  dragMs: number;
  delivery: Delivery;
}

/**
 * The pipeline between page and worker during the drag, from the page's delivery log (every request
 * posted, every result handled, the worker's start and post times; page and worker clocks agree within
 * about 1 ms):
 *   - busy: the share of the drag the worker spent on previews (start to post);
 *   - gaps: the worker's idle time between posting one preview and starting the next, split into gaps
 *     where the next request was already waiting (worker overhead) and gaps where the page had not yet
 *     posted it (the worker waited for the page), with the median of each;
 *   - posts/s: requests the page posted; thrown: results not shown (older than one shown);
 *   - the worker's time per preview, split into the solve, isotherms and raster painting (medians);
 *   - result bytes: the last preview result as structured-clone payload (JSON length of the results
 *     object; field and pixels are transferred buffers, counted apart: the raster as the worker sent it).
 */
interface Delivery {
  busy: number;
  gapsQueued: number;
  gapsQueuedMsMedian: number;
  gapsWaitingPage: number;
  gapsWaitingPageMsMedian: number;
  postsPerSecond: number;
  thrown: number;
  solveMsMedian: number;
  isoMsMedian: number;
  rasterMsMedian: number;
  backMsMedian: number;
  resultJsonBytes: number;
  fieldBytes: number;
  rasterBytes: number;
}

interface LogEntry { id: number; mesh: string | null; sentAt: number; startedAt: number; postedAt: number; handledAt: number; ms: number; parts: { solveMs: number; isoMs: number; rasterMs: number } | null; rasterBytes?: number; shown: boolean }

function deliveryOf(log: { posts: { id: number; mesh: string; at: number }[]; results: LogEntry[] }, from: number, to: number, sizes: { json: number; field: number; raster: number }): Delivery {
  const rs = log.results.filter((r) => r.mesh === 'preview' && r.postedAt >= from && r.postedAt <= to).sort((a, b) => a.startedAt - b.startedAt);
  const busyMs = rs.reduce((a, r) => a + (Math.min(r.postedAt, to) - Math.max(r.startedAt, from)), 0);
  const queued: number[] = [], waiting: number[] = [];
  for (let k = 1; k < rs.length; k++) {
    const a = rs[k - 1], b = rs[k];
    const gap = b.startedAt - a.postedAt;
    // The request b was already in the worker's hands when a ended: any gap is the worker's own.
    if (b.sentAt <= a.postedAt) queued.push(gap);
    else waiting.push(gap);
  }
  const posts = log.posts.filter((p) => p.mesh === 'preview' && p.at >= from && p.at <= to).length;
  const med = (xs: number[]) => quantile(xs, 0.5);
  return {
    busy: busyMs / (to - from),
    gapsQueued: queued.length,
    gapsQueuedMsMedian: med(queued),
    gapsWaitingPage: waiting.length,
    gapsWaitingPageMsMedian: med(waiting),
    postsPerSecond: posts / ((to - from) / 1000),
    thrown: rs.filter((r) => !r.shown).length,
    solveMsMedian: med(rs.filter((r) => r.parts).map((r) => r.parts!.solveMs)),
    isoMsMedian: med(rs.filter((r) => r.parts).map((r) => r.parts!.isoMs)),
    rasterMsMedian: med(rs.filter((r) => r.parts).map((r) => r.parts!.rasterMs)),
    backMsMedian: med(rs.map((r) => r.handledAt - r.postedAt)),
    resultJsonBytes: sizes.json,
    fieldBytes: sizes.field,
    rasterBytes: rs.length && rs[rs.length - 1].rasterBytes !== undefined ? rs[rs.length - 1].rasterBytes! : sizes.raster,
  };
}

const quantile = (xs: number[], q: number) => {
  if (!xs.length) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(q * (s.length - 1) + 0.5))];
};
const intervals = (ts: number[]) => ts.slice(1).map((t, i) => t - ts[i]);

async function waitSettled(page: Page) {
  await page.waitForFunction(() => {
    const w = window as unknown as { __dewline?: { live?: { mesh: string; version: number }; controller?: { section: { get(): { version: number } } } } };
    return w.__dewline?.live?.mesh === 'default' && w.__dewline.live.version === w.__dewline.controller!.section.get().version;
  }, null, { timeout: 600_000, polling: 100 });
}

/**
 * Before the page loads (--layers): count every clearRect per canvas (a Konva layer clears its canvas
 * once per draw) and time every animation-frame callback, while window.__layers.on is true.
 */
const LAYER_PROBE = `(() => {
  const L = (window.__layers = { on: false, ids: new WeakMap(), n: 0, clears: {}, size: {}, rafMs: [], names: {}, times: {}, konva: null });
  const clear = CanvasRenderingContext2D.prototype.clearRect;
  CanvasRenderingContext2D.prototype.clearRect = function (...a) {
    if (L.on) {
      const c = this.canvas;
      if (!L.ids.has(c)) L.ids.set(c, L.n++);
      const id = L.ids.get(c);
      L.clears[id] = (L.clears[id] || 0) + 1;
      (L.times[id] = L.times[id] || []).push(performance.now());
      L.size[id] = c.width + 'x' + c.height;
      L.names[id] = (c.parentElement && [...c.parentElement.children].indexOf(c)) + '';
    }
    return clear.apply(this, a);
  };
  L.loaf = [];
  try {
    new PerformanceObserver((list) => {
      if (!L.on) return;
      for (const e of list.getEntries()) {
        const end = e.startTime + e.duration;
        L.loaf.push({ ms: e.duration, blocking: e.blockingDuration, render: e.renderStart ? end - e.renderStart : 0, layout: e.styleAndLayoutStart ? end - e.styleAndLayoutStart : 0,
          scripts: e.scripts.map((x) => ({ who: x.invoker + ' ' + (x.sourceFunctionName || '') + ' ' + (x.sourceURL || '').split('/').pop() + ':' + x.sourceCharPosition, ms: x.duration, forced: x.forcedStyleAndLayoutDuration })) });
      }
    }).observe({ type: 'long-animation-frame', buffered: false });
  } catch { /* no long-animation-frame entries in this browser */ }
  const raf = window.requestAnimationFrame.bind(window);
  window.requestAnimationFrame = (cb) => raf((t) => { const t0 = performance.now(); try { cb(t); } finally { if (L.on) L.rafMs.push(performance.now() - t0); } });
})()`;

interface Loaf { ms: number; blocking: number; render: number; layout: number; scripts: { who: string; ms: number; forced: number }[] }
interface LayerCounts { clears: Record<string, number>; size: Record<string, string>; names: Record<string, string>; rafMs: number[]; loaf: Loaf[]; times: Record<string, number[]> }

function printLayers(name: string, l: LayerCounts, seconds: number, t0: number) {
  console.log(`${name}: canvases cleared during the drag (per second; canvas position in the stage, size):`);
  for (const id of Object.keys(l.clears))
    if (l.size[id] !== '0x0') console.log(`  #${l.names[id]} ${l.size[id]}: ${(l.clears[id] / seconds).toFixed(1)}/s${l.clears[id] <= 5 ? ` (at ${l.times[id].map((t) => (t - t0).toFixed(0)).join(', ')} ms)` : ''}`);
  const r = [...l.rafMs].sort((a, b) => a - b);
  const q = (p: number) => (r.length ? r[Math.min(r.length - 1, Math.floor(p * (r.length - 1) + 0.5))].toFixed(1) : 'n/a');
  console.log(`  animation-frame callbacks: ${r.length}, total ${r.reduce((a, b) => a + b, 0).toFixed(0)} ms, p50 ${q(0.5)} / p95 ${q(0.95)} / max ${q(1)} ms`);
  // Long animation frames (Chromium's long-animation-frame entries): a frame's scripts, then its rendering (style, layout, paint).
  const long = l.loaf.filter((f) => f.ms > 50).sort((a, b) => b.ms - a.ms).slice(0, 8);
  console.log(`  long animation frames (over 50 ms): ${l.loaf.filter((f) => f.ms > 50).length}; the longest, with rendering (of it style and layout) and scripts over 2 ms:`);
  for (const f of long) console.log(`    ${f.ms.toFixed(0)} ms: rendering ${f.render.toFixed(0)} (${f.layout.toFixed(0)}); ${f.scripts.filter((x) => x.ms > 2).map((x) => `${x.who} ${x.ms.toFixed(0)}${x.forced > 1 ? ` (forced layout ${x.forced.toFixed(0)})` : ''}`).join('; ') || 'no script over 2 ms'}`);
}

/** `baseline`: a blank board (no parts, no solves): the same drag over empty space, so the figures show what the machine's load alone does. */
async function measure(page: Page, name: string, baseline = false): Promise<Figures> {
  if (baseline) await page.waitForFunction(() => Boolean((window as unknown as { __dewline?: { controller?: unknown } }).__dewline?.controller), null, { timeout: 120_000 });
  else await waitSettled(page);
  await page.evaluate(INSTALL);
  const parts = await page.evaluate(() => (window as unknown as { __dewline: { snapshot(): { parts: unknown[] } } }).__dewline.snapshot().parts.length);
  await page.waitForTimeout(1000); // idle frames
  const fb = await page.evaluate(() => {
    const d = (window as unknown as { __dewline: { partBox(id: string): { minX: number; minY: number; maxX: number; maxY: number } | null; toClient(x: number, y: number): { x: number; y: number } } }).__dewline;
    const b = d.partBox('footing');
    if (!b) {
      const r = document.querySelector('[data-testid="board-canvas"]')!.getBoundingClientRect();
      return { x: r.left + r.width / 2, y: r.top + r.height / 2 };
    }
    return d.toClient(b.minX + 0.15, (b.minY + b.maxY) / 2);
  });
  await page.mouse.move(fb.x, fb.y);
  const cdp = PROFILE ? await page.context().newCDPSession(page) : null;
  if (cdp) {
    await cdp.send('Profiler.enable');
    await cdp.send('Profiler.setSamplingInterval', { interval: 200 });
    await cdp.send('Profiler.start');
  }
  if (TRACE) await page.context().browser()!.startTracing(page, { path: TRACE, categories: ['devtools.timeline', 'toplevel', 'cc', 'blink', 'v8.execute', 'disabled-by-default-devtools.timeline'] });
  // Alt held: no snapping, so every 1 px move changes the drawing (a snapped 1 px drag changes it only
  // when the footing reaches the next grid step, about twice a second, which caps the refreshes instead
  // of the board). --snap drags as the earlier tables did.
  if (!SNAP) await page.keyboard.down('Alt');
  if (LAYERS) await page.evaluate(() => { (window as unknown as { __layers: { on: boolean } }).__layers.on = true; });
  const t0 = await page.evaluate(() => performance.now());
  await page.mouse.down();
  // A slow drag, right then back left, one move every 16 ms or so, 1 px per move.
  const steps = Math.round(DRAG_MS / 16);
  const wall0 = Date.now();
  for (let i = 1; i <= steps; i++) {
    const dx = i <= steps / 2 ? i : steps - i;
    await page.mouse.move(fb.x + dx, fb.y);
    const due = wall0 + i * 16 - Date.now();
    if (due > 0) await page.waitForTimeout(due);
  }
  const t1 = await page.evaluate(() => performance.now());
  if (LAYERS) {
    const lt = await page.evaluate(() => (window as unknown as { __bench: { tasks: { at: number; ms: number }[] } }).__bench.tasks);
    console.log(`${name}: long tasks from the drag's start (ms after it, duration): ${lt.filter((x) => x.at + x.ms >= t0 && x.at <= t1).map((x) => `${(x.at - t0).toFixed(0)}: ${x.ms.toFixed(0)}`).join(', ') || 'none'}`);
    const l = await page.evaluate(() => { const w = (window as unknown as { __layers: LayerCounts & { on: boolean } }).__layers; w.on = false; return { clears: w.clears, size: w.size, names: w.names, rafMs: w.rafMs, loaf: w.loaf, times: w.times }; });
    printLayers(name, l, (t1 - t0) / 1000, t0);
  }
  const sizes = await page.evaluate(() => {
    const d = (window as unknown as { __dewline: { results?: unknown; live?: { cells: number } } }).__dewline;
    const c = document.querySelector('[data-testid="board-canvas"]')!.getBoundingClientRect();
    return { json: d.results ? JSON.stringify(d.results).length : 0, field: (d.live?.cells ?? 0) * 8, raster: Math.floor(c.width) * Math.floor(c.height) * 4 };
  });
  if (cdp) printProfile((await cdp.send('Profiler.stop')).profile as unknown as CpuProfile);
  if (TRACE) {
    await page.context().browser()!.stopTracing();
    printTrace(TRACE);
  }
  await page.mouse.move(fb.x + 12, fb.y);
  await page.mouse.up();
  if (!SNAP) await page.keyboard.up('Alt');
  if (!baseline) await waitSettled(page);
  await page.waitForTimeout(200);
  const log = await page.evaluate(() => (window as unknown as { __dewline: { liveLog?: unknown } }).__dewline.liveLog ?? { posts: [], results: [] }) as { posts: { id: number; mesh: string; at: number }[]; results: LogEntry[] };
  const origin = await page.evaluate(() => performance.timeOrigin);
  if (LOG) fs.writeFileSync(LOG, JSON.stringify({ from: origin + t0, to: origin + t1, ...log }, null, 1));
  const b = await page.evaluate(() => (window as unknown as { __bench: { frames: number[]; tasks: { at: number; ms: number }[]; results: { at: number; mesh: string; version: number; ms: number; cells: number; toWorkerMs?: number; backMs?: number }[]; drawn: number[] } }).__bench);
  const idle = intervals(b.frames.filter((t) => t < t0));
  const drag = intervals(b.frames.filter((t) => t >= t0 && t <= t1));
  const tasks = b.tasks.filter((x) => x.at + x.ms >= t0 && x.at <= t1);
  const previews = b.results.filter((r) => r.mesh === 'preview' && r.at >= t0 && r.at <= t1);
  const last = [...b.results].reverse().find((r) => r.mesh === 'default');
  return {
    name,
    parts,
    idleFrameP50: quantile(idle, 0.5),
    dragFrameP50: quantile(drag, 0.5),
    dragFrameP95: quantile(drag, 0.95),
    dragFrameMax: Math.max(...drag),
    framesOver50: drag.filter((d) => d > 50).length,
    dragFrames: drag.length,
    longTasks: tasks.length,
    longestTaskMs: tasks.length ? Math.max(...tasks.map((x) => x.ms)) : 0,
    refreshesPerSecond: previews.length / ((t1 - t0) / 1000),
    drawnPerSecond: b.drawn.filter((t) => t >= t0 && t <= t1).length / ((t1 - t0) / 1000),
    previewResults: previews.length,
    previewSolveMsMedian: quantile(previews.map((r) => r.ms), 0.5),
    previewCells: previews.length ? previews[previews.length - 1].cells : NaN,
    toWorkerMsMedian: quantile(previews.map((r) => r.toWorkerMs ?? NaN).filter(Number.isFinite), 0.5),
    backMsMedian: quantile(previews.map((r) => r.backMs ?? NaN).filter(Number.isFinite), 0.5),
    defaultSolveMs: last?.ms ?? NaN,
    defaultCells: last?.cells ?? NaN,
    dragMs: t1 - t0,
    delivery: deliveryOf(log, origin + t0, origin + t1, sizes),
  };
}

interface CpuProfile { nodes: { id: number; callFrame: { functionName: string; url: string; lineNumber: number }; children?: number[] }[]; samples: number[]; timeDeltas: number[] }

function printProfile(p: CpuProfile) {
  const self = new Map<number, number>();
  p.samples.forEach((id, i) => self.set(id, (self.get(id) ?? 0) + (p.timeDeltas[i] ?? 0) / 1000));
  const byName = new Map<string, number>();
  for (const n of p.nodes) {
    const ms = self.get(n.id) ?? 0;
    const f = n.callFrame;
    const key = `${f.functionName || '(anonymous)'} ${f.url.split('/').pop()}:${f.lineNumber}`;
    byName.set(key, (byName.get(key) ?? 0) + ms);
  }
  console.log('main thread, self time during the drag (ms):');
  for (const [k, ms] of [...byName].sort((a, b) => b[1] - a[1]).slice(0, 25)) console.log(`  ${ms.toFixed(1).padStart(8)}  ${k}`);
}

/** Main-thread time by trace event during the drag, self time (children subtracted), largest first. */
function printTrace(file: string) {
  const raw = JSON.parse(fs.readFileSync(file, 'utf8')) as { traceEvents: { name: string; ph: string; ts: number; dur?: number; pid: number; tid: number; args?: { name?: string } }[] };
  const ev = raw.traceEvents;
  const main = ev.find((e) => e.ph === 'M' && e.name === 'thread_name' && e.args?.name === 'CrRendererMain');
  if (!main) return;
  const xs = ev.filter((e) => e.pid === main.pid && e.tid === main.tid && e.ph === 'X' && e.dur !== undefined).sort((a, b) => a.ts - b.ts || b.dur! - a.dur!);
  const self = new Map<string, number>();
  const stack: { end: number; name: string }[] = [];
  for (const e of xs) {
    while (stack.length && stack[stack.length - 1].end <= e.ts) stack.pop();
    const parent = stack[stack.length - 1];
    if (parent) self.set(parent.name, (self.get(parent.name) ?? 0) - e.dur! / 1000);
    self.set(e.name, (self.get(e.name) ?? 0) + e.dur! / 1000);
    stack.push({ end: e.ts + e.dur!, name: e.name });
  }
  console.log('main thread, trace events by self time during the drag (ms):');
  for (const [k, ms] of [...self].sort((a, b) => b[1] - a[1]).slice(0, 20)) console.log(`  ${ms.toFixed(1).padStart(8)}  ${k}`);
}

const f1 = (v: number) => (Number.isFinite(v) ? v.toFixed(1) : 'n/a');

function report(all: Figures[]) {
  console.log(`\nbench:ui, Chromium ${CHROMIUM_VERSION}, ${os.cpus().length} CPU(s) (${os.cpus()[0]?.model ?? '?'}), viewport 1280x800, drag ${DRAG_MS} ms at one move per 16 ms, ${SNAP ? 'snapping on' : 'Alt held (no snapping)'}`);
  console.log(`load average (1 min) at the start ${LOAD_START.toFixed(2)}, at the end ${os.loadavg()[0].toFixed(2)}: other work on the machine stretches every figure`);
  console.log('targets: >= 10 result refreshes per second while dragging; no main-thread task over 50 ms\n');
  const head = ['section', 'parts', 'idle frame p50 ms', 'drag frame p50 / p95 / max ms', 'drag/idle p50', 'long tasks (longest ms)', 'refreshes/s', 'drawn states/s', 'preview solve ms (cells)', 'refresh interval / solve', 'to worker / back to page ms', 'default solve ms (cells)'];
  console.log(head.join(' | '));
  for (const f of all) {
    const interval = f.refreshesPerSecond > 0 ? 1000 / f.refreshesPerSecond : NaN;
    console.log([
      f.name,
      f.parts,
      f1(f.idleFrameP50),
      `${f1(f.dragFrameP50)} / ${f1(f.dragFrameP95)} / ${f1(f.dragFrameMax)}`,
      f1(f.dragFrameP50 / f.idleFrameP50),
      `${f.longTasks} (${f1(f.longestTaskMs)})`,
      `${f.refreshesPerSecond.toFixed(2)} ${f.refreshesPerSecond >= TARGET_RPS ? 'meets' : 'below'} target`,
      f.drawnPerSecond.toFixed(2),
      `${f1(f.previewSolveMsMedian)} (${f.previewCells})`,
      f1(interval / f.previewSolveMsMedian),
      `${f1(f.toWorkerMsMedian)} / ${f1(f.backMsMedian)}`,
      `${f1(f.defaultSolveMs)} (${f.defaultCells})`,
    ].join(' | '));
  }
  console.log('\ndelivery during the drag (page <-> worker): worker busy share; worker idle gaps with the next request already queued (count, median ms) and waiting for the page to post (count, median ms); requests posted/s; results thrown away; worker ms per preview split into solve / isotherms / raster (medians); result to page ms; message: results JSON bytes, field bytes, raster bytes (transferred)');
  console.log(['section', 'worker busy', 'gaps queued (ms)', 'gaps waiting for page (ms)', 'posts/s', 'thrown', 'solve / iso / raster ms', 'back to page ms', 'JSON / field / raster bytes'].join(' | '));
  for (const f of all) {
    const d = f.delivery;
    if (!f.previewResults) continue;
    console.log([f.name, `${(d.busy * 100).toFixed(0)} %`, `${d.gapsQueued} (${f1(d.gapsQueuedMsMedian)})`, `${d.gapsWaitingPage} (${f1(d.gapsWaitingPageMsMedian)})`, d.postsPerSecond.toFixed(1), d.thrown, `${f1(d.solveMsMedian)} / ${f1(d.isoMsMedian)} / ${f1(d.rasterMsMedian)}`, f1(d.backMsMedian), `${d.resultJsonBytes} / ${d.fieldBytes} / ${d.rasterBytes}`].join(' | '));
  }
  console.log('');
  const base = all.find((f) => f.name.startsWith('baseline'));
  if (base) console.log(`baseline (blank board, the same drag over empty space, no solves): ${base.longTasks} long tasks, longest ${f1(base.longestTaskMs)} ms; this is the machine's load alone\n`);
  for (const f of all.filter((x) => x !== base))
    console.log(`${f.name}: ${f.longestTaskMs <= TARGET_TASK_MS ? 'no task over 50 ms' : `longest task ${f1(f.longestTaskMs)} ms (target 50 ms)`}; ${f.refreshesPerSecond >= TARGET_RPS ? 'refresh target met' : `refreshes ${f.refreshesPerSecond.toFixed(2)}/s, target ${TARGET_RPS}/s`}`);
}

let CHROMIUM_VERSION = '?';
const LOAD_START = os.loadavg()[0];

async function main() {
  const exe = findChromium();
  if (!exe) throw new Error('no Chromium found (set CHROMIUM_PATH)');
  const server = await startServer();
  const browser = await chromium.launch({ executablePath: exe, args: ['--no-sandbox', '--headless', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'] });
  CHROMIUM_VERSION = browser.version();
  const all: Figures[] = [];
  try {
    const cases: { name: string; url: string; file?: string; baseline?: boolean }[] = [
      { name: 'baseline-blank-board', url: '/section?blank=1', baseline: true },
      ...TEMPLATES.map((t) => ({ name: t.name, url: `/section?template=${t.name}` })),
      { name: 'stress-200-parts', url: '/section?open=1', file: JSON.stringify(stressSection(200)) },
    ];
    for (const c of cases) {
      if (ONLY && c.name !== ONLY) continue;
      const ctx = await browser.newContext({ viewport: { width: 1280, height: 800 } });
      if (LAYERS) await ctx.addInitScript(LAYER_PROBE);
      if (c.file) await ctx.addInitScript((text) => sessionStorage.setItem('dewline:open', text), c.file);
      const page = await ctx.newPage();
      await page.goto(server.url + c.url);
      const f = await measure(page, c.name, c.baseline);
      all.push(f);
      console.error(`${c.name}: done (${f.previewResults} preview results in ${f1(f.dragMs)} ms)`);
      await ctx.close();
    }
  } finally {
    await browser.close();
    server.stop();
  }
  report(all);
  if (JSON_OUT) fs.writeFileSync(JSON_OUT, JSON.stringify({ chromium: CHROMIUM_VERSION, cpus: os.cpus().length, dragMs: DRAG_MS, figures: all }, null, 2));
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(new URL(import.meta.url).pathname)) {
  main().catch((e) => {
    console.error(e);
    process.exit(1);
  });
}
