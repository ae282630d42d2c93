/** The view transform: world <-> screen, zoom about a point, pan, fit, grid and scale-bar steps. */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { MAX_K, MIN_K, boxToScreen, fitBox, gridSpacing, niceStep, panBy, patternBucket, scaleBar, toScreen, toWorld, visibleBox, zoomAt } from './view';

const views = fc.record({ k: fc.double({ min: MIN_K, max: MAX_K, noNaN: true }), ox: fc.double({ min: -1e4, max: 1e4, noNaN: true }), oy: fc.double({ min: -1e4, max: 1e4, noNaN: true }) });

describe('view', () => {
  it('maps y up in the world to y down on the screen', () => {
    const v = { k: 100, ox: 400, oy: 300 };
    expect(toScreen(v, [0, 0])).toEqual([400, 300]);
    expect(toScreen(v, [1, 1])).toEqual([500, 200]);
    expect(toWorld(v, 500, 200)).toEqual([1, 1]);
  });

  it('toWorld undoes toScreen for any view', () => {
    fc.assert(
      fc.property(views, fc.double({ min: -100, max: 100, noNaN: true }), fc.double({ min: -100, max: 100, noNaN: true }), (v, x, y) => {
        const [sx, sy] = toScreen(v, [x, y]);
        const [wx, wy] = toWorld(v, sx, sy);
        expect(wx).toBeCloseTo(x, 6);
        expect(wy).toBeCloseTo(y, 6);
      }),
    );
  });

  it('zooming keeps the world point under the pointer in place', () => {
    fc.assert(
      fc.property(views, fc.double({ min: 0, max: 1280, noNaN: true }), fc.double({ min: 0, max: 800, noNaN: true }), fc.double({ min: 0.2, max: 5, noNaN: true }), (v, sx, sy, f) => {
        const before = toWorld(v, sx, sy);
        const z = zoomAt(v, sx, sy, f);
        const after = toWorld(z, sx, sy);
        expect(after[0]).toBeCloseTo(before[0], 6);
        expect(after[1]).toBeCloseTo(before[1], 6);
        expect(z.k).toBeGreaterThanOrEqual(MIN_K);
        expect(z.k).toBeLessThanOrEqual(MAX_K);
      }),
    );
  });

  it('zoom is clamped to the limits', () => {
    expect(zoomAt({ k: MAX_K, ox: 0, oy: 0 }, 10, 10, 10).k).toBe(MAX_K);
    expect(zoomAt({ k: MIN_K, ox: 0, oy: 0 }, 10, 10, 0.01).k).toBe(MIN_K);
  });

  it('panning moves the screen image by the pixels dragged', () => {
    const v = { k: 50, ox: 10, oy: 20 };
    const p = panBy(v, 30, -5);
    expect(toScreen(p, [2, 3])[0] - toScreen(v, [2, 3])[0]).toBeCloseTo(30, 9);
    expect(toScreen(p, [2, 3])[1] - toScreen(v, [2, 3])[1]).toBeCloseTo(-5, 9);
  });

  it('fitBox centres the box inside the margin, and the visible box contains it', () => {
    const b = { minX: -0.5, minY: -1.2, maxX: 2.5, maxY: 1.6 };
    const v = fitBox(b, 1000, 600, 32);
    const r = boxToScreen(v, b);
    expect(r.x + r.width / 2).toBeCloseTo(500, 6);
    expect(r.y + r.height / 2).toBeCloseTo(300, 6);
    expect(r.x).toBeGreaterThanOrEqual(32 - 1e-9);
    expect(r.y).toBeGreaterThanOrEqual(32 - 1e-9);
    expect(Math.min(r.x, r.y)).toBeCloseTo(32, 6); // the tighter axis touches the margin
    const vis = visibleBox(v, 1000, 600);
    expect(vis.minX).toBeLessThanOrEqual(b.minX);
    expect(vis.maxX).toBeGreaterThanOrEqual(b.maxX);
    expect(vis.minY).toBeLessThanOrEqual(b.minY);
    expect(vis.maxY).toBeGreaterThanOrEqual(b.maxY);
  });

  it('grid and scale bar use round steps of the unit system', () => {
    const si = gridSpacing(1000, 'si'); // 1 px per mm
    expect(si.minor * 1000).toBeGreaterThanOrEqual(10 - 1e-9);
    expect(si.minor).toBeCloseTo(0.01, 12);
    expect(Math.round(si.major / si.minor)).toBeGreaterThanOrEqual(4);
    const ip = gridSpacing(1000, 'ip');
    expect(ip.minor / 0.0254).toBeCloseTo(Math.round(ip.minor / 0.0254 * 16) / 16, 9); // whole sixteenths of an inch
    const bar = scaleBar(250, 'si');
    expect(bar.pixels).toBeGreaterThanOrEqual(60);
    expect(bar.pixels).toBe(bar.metres * 250);
    expect(niceStep(1e-3, 'si', 60)).toBe(100); // beyond the largest step: the largest
  });

  it('pattern scale changes once per octave of zoom', () => {
    expect(patternBucket(100)).toBe(64);
    expect(patternBucket(127)).toBe(64);
    expect(patternBucket(128)).toBe(128);
  });
});
