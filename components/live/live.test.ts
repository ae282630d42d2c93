import { describe, expect, it } from 'vitest';
import { buildLut, fieldAt, levels, rangeOf, rasterFrame, rasterize } from './colour';
import type { GridField } from './colour';
import { gridToWorld, isotherms } from './contours';
import { diffResults, signed } from './diff';
import { Scheduler, SolveQueue } from './scheduler';
import { SEGMENT_STYLES, worst } from './segments';
import type { SectionResults } from '@/lib/thermal/types';

// A 4 x 3 field, linear in x: t = 10 x (x = cell centre), non-uniform columns; one void cell.
const xs = [0, 0.1, 0.3, 0.6, 1.0], ys = [0, 0.5, 1.0, 2.0];
const cx = (i: number) => (xs[i] + xs[i + 1]) / 2;
function linear(voidCell = -1): GridField {
  const t = new Float64Array(12);
  for (let j = 0; j < 3; j++) for (let i = 0; i < 4; i++) t[j * 4 + i] = j * 4 + i === voidCell ? NaN : 10 * cx(i);
  return { xs, ys, nx: 4, ny: 3, t };
}

describe('colours', () => {
  it('range follows the zone temperatures and the scale runs dark-blue cold to yellow warm (cividis)', () => {
    expect(rangeOf([20, -18, 4])).toEqual({ lo: -18, hi: 20 });
    const lut = buildLut();
    // cividis: the cold end is dark blue (b > r), the warm end bright yellow (r, g > b).
    expect(lut[2]).toBeGreaterThan(lut[0]);
    expect(lut[255 * 3]).toBeGreaterThan(lut[255 * 3 + 2]);
    expect(lut[255 * 3] + lut[255 * 3 + 1]).toBeGreaterThan(lut[0] + lut[1] + 200);
  });
  it('rasterises cells onto screen pixels, transparent in voids and outside', () => {
    const f = linear(5);
    const lut = buildLut();
    // 100 px per metre, origin at the screen's bottom-left of a 100 x 200 px image.
    const w = 110, h = 200, out = new Uint8ClampedArray(w * h * 4);
    rasterize(f, { lo: 0, hi: 10 }, lut, { k: 100, ox: 0, oy: 200 }, w, h, out);
    const px = (sx: number, sy: number) => Array.from(out.slice((sy * w + sx) * 4, (sy * w + sx) * 4 + 4));
    // Pixel at x 0.05 m, y 0.25 m (sy = 200 - 25): cell (0, 0), t = 0.5 -> lut index round(0.05 * 255) = 13.
    expect(px(5, 175)).toEqual([lut[13 * 3], lut[13 * 3 + 1], lut[13 * 3 + 2], 255]);
    // Cell (1, 1) is the void: x 0.2, y 0.75.
    expect(px(20, 125)[3]).toBe(0);
    // x 1.05 m is outside the model.
    expect(px(105, 100)[3]).toBe(0);
    expect(fieldAt(f, 0.45, 1.5)).toBeCloseTo(10 * cx(2));
    expect(Number.isNaN(fieldAt(f, 0.2, 0.75))).toBe(true);
  });
  it('a half-resolution raster paints each pixel with the cell under the centre of the 2 x 2 screen pixels it stands for', () => {
    const f = linear(5);
    const lut = buildLut();
    const view = { k: 100, ox: 3, oy: 205 };
    const full = rasterFrame(view, 111, 201);
    expect(full).toEqual({ view, width: 111, height: 201 });
    const half = rasterFrame(view, 111, 201, 0.5);
    expect(half.width).toBe(55);
    expect(half.height).toBe(100);
    const out = new Uint8ClampedArray(half.width * half.height * 4);
    rasterize(f, { lo: 0, hi: 10 }, lut, half.view, half.width, half.height, out);
    let checked = 0;
    for (let j = 0; j < half.height; j += 7) for (let i = 0; i < half.width; i += 5) {
      // The centre of screen pixels 2i..2i+1, 2j..2j+1 is the screen point (2i + 1, 2j + 1).
      const x = (2 * i + 1 - view.ox) / view.k, y = (view.oy - (2 * j + 1)) / view.k;
      const t = fieldAt(f, x, y);
      const p = (j * half.width + i) * 4;
      if (Number.isNaN(t)) expect(out[p + 3]).toBe(0);
      else {
        const q = Math.round((t / 10) * 255);
        expect([out[p], out[p + 1], out[p + 2], out[p + 3]]).toEqual([lut[q * 3], lut[q * 3 + 1], lut[q * 3 + 2], 255]);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(50);
  });
  it('levels at an interval inside the range', () => {
    expect(levels({ lo: -18, hi: 20 }, 5)).toEqual([-15, -10, -5, 0, 5, 10, 15]);
    expect(levels({ lo: 0, hi: 4 }, 2)).toEqual([2]);
  });
});

describe('isotherms', () => {
  it('maps grid coordinates through the non-uniform cell centres', () => {
    expect(gridToWorld(xs, 0.5)).toBeCloseTo(cx(0));
    expect(gridToWorld(xs, 2)).toBeCloseTo((cx(1) + cx(2)) / 2);
    expect(gridToWorld(xs, 0)).toBe(0);
    expect(gridToWorld(xs, 4)).toBe(1);
  });
  it('a linear field gives a straight vertical isotherm at the right x, without the model edges', () => {
    const iso = isotherms(linear(), [4])[0];
    const pts = iso.lines.flat();
    expect(pts.length).toBeGreaterThanOrEqual(4);
    for (let k = 0; k < pts.length; k += 2) expect(pts[k]).toBeCloseTo(0.4, 9);
    // Nothing along the outer boundary (y = 0 or y = 2 only as end points of the vertical line, never a horizontal run).
    for (const line of iso.lines) for (let k = 0; k + 2 < line.length; k += 2) expect(line[k]).toBeCloseTo(line[k + 2], 9);
  });
  it('does not draw around a void cell', () => {
    // Level 1.0 lies between cells 0 (0.5) and 1 (2.0); with cell (1,1) void the line breaks there instead of circling it.
    const iso = isotherms(linear(5), [1])[0];
    for (const line of iso.lines) for (let k = 0; k < line.length; k += 2) expect(line[k]).toBeLessThan(cx(1));
  });
});

describe('verdict segments', () => {
  it('three states differ in dash and glyph as well as colour', () => {
    const s = Object.values(SEGMENT_STYLES);
    expect(new Set(s.map((x) => x.stroke)).size).toBe(3);
    expect(new Set(s.map((x) => x.glyph)).size).toBe(3);
    expect(new Set(s.map((x) => x.dash.join(','))).size).toBe(3);
    expect(worst(['fine', 'mould risk', 'fine'])).toBe('mould risk');
    expect(worst(['fine', 'condensation', 'mould risk'])).toBe('condensation');
  });
});

describe('compare', () => {
  const res = (psiG: number, t: number, phi: number) => ({ zones: [{ id: 'room', phi }], indoorZoneId: 'room', psiGround: { psiG }, psi: null, coldest: { t }, l2d: 1 }) as unknown as SectionResults;
  it('differences now minus baseline', () => {
    const d = diffResults(res(0.4, 12, 20), res(0.45, 11.5, 21));
    expect(d.psi).toBeCloseTo(0.05);
    expect(d.coldest).toBeCloseTo(-0.5);
    expect(d.phi).toBeCloseTo(1);
    expect(signed(0.05, 3)).toBe('+0.050');
    expect(signed(-0.0001, 3)).toBe('0.000');
  });
});

describe('scheduler', () => {
  it('posts every request at once and keeps it until the worker answers; answers are matched by id', () => {
    const s = new Scheduler<string>();
    expect(s.request('a', 'preview', 1)).toEqual([{ type: 'send', req: { id: 1, snapshot: 'a', mesh: 'preview', version: 1 } }]);
    expect(s.request('b', 'preview', 2)).toEqual([{ type: 'send', req: { id: 2, snapshot: 'b', mesh: 'preview', version: 2 } }]);
    expect(s.request('c', 'default', 2)).toEqual([{ type: 'send', req: { id: 3, snapshot: 'c', mesh: 'default', version: 2 } }]);
    expect(s.get(2)?.snapshot).toBe('b');
    // The worker answered 2 (say it had started it before it saw 3): its own request, not the newest.
    expect(s.done(2)).toEqual({ id: 2, snapshot: 'b', mesh: 'preview', version: 2 });
    expect(s.done(2)).toBeNull(); // answered once
    expect(s.busy).toBe(true);
    expect(s.done(1)?.version).toBe(1);
    expect(s.done(3)?.mesh).toBe('default');
    expect(s.busy).toBe(false);
    expect(Scheduler.fresher(2, 3)).toBe(false);
    expect(Scheduler.fresher(4, 3)).toBe(true);
  });
  it('a stop cancels every unanswered request', () => {
    const s = new Scheduler<string>();
    s.request('a', 'preview', 1);
    s.request('b', 'preview', 2);
    s.done(1);
    s.request('c', 'default', 3);
    expect(s.stop()).toEqual([{ type: 'cancel', id: 2 }, { type: 'cancel', id: 3 }]);
  });
});

describe('solve queue in the worker', () => {
  it('keeps the newest preview waiting behind a running preview and starts it when that one ends', () => {
    const q = new SolveQueue<{ id: number; mesh: 'preview' | 'default' }>();
    expect(q.solve({ id: 1, mesh: 'preview' })).toEqual([{ type: 'start', job: { id: 1, mesh: 'preview' } }]);
    expect(q.solve({ id: 2, mesh: 'preview' })).toEqual([]);
    expect(q.solve({ id: 3, mesh: 'preview' })).toEqual([{ type: 'drop', id: 2 }]);
    expect(q.finished(2)).toEqual([]);
    expect(q.finished(1)).toEqual([{ type: 'start', job: { id: 3, mesh: 'preview' } }]);
    expect(q.finished(3)).toEqual([]);
    expect(q.running).toBeNull();
  });
  it('a default request aborts the running solve and drops the waiting one; a cancel does both', () => {
    const q = new SolveQueue<{ id: number; mesh: 'preview' | 'default' }>();
    q.solve({ id: 1, mesh: 'preview' });
    q.solve({ id: 2, mesh: 'preview' });
    expect(q.solve({ id: 3, mesh: 'default' })).toEqual([{ type: 'abort', id: 1 }, { type: 'drop', id: 2 }, { type: 'start', job: { id: 3, mesh: 'default' } }]);
    expect(q.finished(1)).toEqual([]); // the aborted one ending starts nothing
    expect(q.solve({ id: 4, mesh: 'preview' })).toEqual([{ type: 'abort', id: 3 }, { type: 'start', job: { id: 4, mesh: 'preview' } }]);
    q.solve({ id: 5, mesh: 'preview' });
    expect(q.cancel(4)).toEqual([{ type: 'abort', id: 4 }, { type: 'drop', id: 5 }]);
    expect(q.running).toBeNull();
    expect(q.cancel(9)).toEqual([]);
  });
  it('with messages in flight both ways, every request is answered once and every answer finds its own request', () => {
    let seed = 7;
    const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    type Job = { id: number; mesh: 'preview' | 'default' | 'fine'; snapshot: string };
    type Answer = { type: 'result' | 'cancelled'; id: number; snapshot?: string };
    for (let run = 0; run < 300; run++) {
      const page = new Scheduler<string>();
      const worker = new SolveQueue<Job>();
      const toWorker: ({ type: 'solve'; job: Job } | { type: 'cancel'; id: number })[] = [];
      const toPage: Answer[] = [];
      const started: number[] = [];
      const answered = new Map<number, number>();
      let posted = 0;
      const work = (acts: ReturnType<typeof worker.solve>) => {
        for (const a of acts) {
          if (a.type === 'start') started.push(a.job.id);
          if (a.type === 'drop') toPage.push({ type: 'cancelled', id: a.id });
          if (a.type === 'abort') { toPage.push({ type: 'cancelled', id: a.id }); work(worker.finished(a.id)); }
        }
      };
      const send = (effects: ReturnType<typeof page.request>) => {
        for (const e of effects) toWorker.push(e.type === 'cancel' ? e : { type: 'solve', job: { id: e.req.id, mesh: e.req.mesh, snapshot: e.req.snapshot } });
      };
      const deliverToWorker = () => {
        const m = toWorker.shift();
        if (m) work(m.type === 'cancel' ? worker.cancel(m.id) : worker.solve(m.job));
      };
      const finish = () => {
        const j = worker.running;
        if (!j) return;
        toPage.push({ type: 'result', id: j.id, snapshot: j.snapshot });
        work(worker.finished(j.id));
      };
      const deliverToPage = () => {
        const m = toPage.shift();
        if (!m) return;
        answered.set(m.id, (answered.get(m.id) ?? 0) + 1);
        const req = page.done(m.id);
        // The answer belongs to a request the page posted and still held, and a result is of that very drawing.
        expect(req?.id).toBe(m.id);
        if (m.type === 'result') expect(req?.snapshot).toBe(m.snapshot);
      };
      for (let step = 0; step < 60; step++) {
        const x = rnd();
        if (x < 0.35) { posted++; send(page.request(`s${posted}`, rnd() < 0.8 ? 'preview' : 'default', step)); }
        else if (x < 0.55) deliverToWorker();
        else if (x < 0.7) finish();
        else if (x < 0.95) deliverToPage();
        else send(page.stop());
      }
      // Let everything arrive and every solve end.
      for (let k = 0; k < 1000 && (toWorker.length || toPage.length || worker.running); k++) {
        deliverToWorker();
        finish();
        deliverToPage();
      }
      expect(answered.size).toBe(posted);
      expect([...answered.values()].every((n) => n === 1)).toBe(true);
      expect(page.busy).toBe(false);
      expect(new Set(started).size).toBe(started.length);
    }
  });
});
