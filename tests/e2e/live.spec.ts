/**
 * Live physics in the browser: the readout equals solveSectionSync (the code path of `dewline solve`)
 * on the same snapshot, and thinning the slab-edge break raises psi_g and lowers the slab-edge surface temperature.
 */
import { expect, test } from '@playwright/test';
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { solveSectionSync } from '../../lib/thermal/section';
import type { SectionResults } from '../../lib/thermal/types';
import type { Page } from '@playwright/test';
import { fieldAt } from '../../components/live/colour';
import type { GridField } from '../../components/live/colour';
import { cutLayers, cutProfile, profileRange } from '../../components/live/cutline';
import { probeAt } from '../../components/live/probe';
import { lookupMaterial, resolveSection } from '../../lib/section/resolve';
import type { SectionSnapshot } from '../../lib/section/schema';
import { formatLength, formatQuantity } from '../../lib/units';

test.setTimeout(300_000);

type W = { __dewline: { results: SectionResults; live: { version: number; mesh: string }; controller: { section: { get(): { version: number } }; updatePart(id: string, p: Record<string, unknown>): string | null }; snapshot(): unknown } };

test('readout follows the drawing and equals the solver on the same snapshot and the CLI on the saved file', async ({ page }, testInfo) => {
  await page.goto('/section?template=slab-edge-break');
  await page.waitForFunction(() => (window as unknown as W).__dewline?.results?.mesh.level === 'default', null, { timeout: 240_000 });
  await expect(page.getByTestId('live-readout')).toHaveAttribute('data-stale', 'no', { timeout: 120_000 });
  await page.screenshot({ path: 'test-results/live/before.png' });
  const before = await page.evaluate(() => { const w = window as unknown as W; return { r: w.__dewline.results, snap: w.__dewline.snapshot() }; });
  const ref = solveSectionSync(before.snap as never, { mesh: 'default' });
  expect(before.r.psiGround!.psiG).toBeCloseTo(ref.psiGround!.psiG, 9);
  expect(before.r.coldest!.t).toBeCloseTo(ref.coldest!.t, 9);
  await expect(page.getByTestId('live-psig')).toHaveText(`${ref.psiGround!.psiG.toFixed(3)} W/(m·K)`);

  // Thin the slab-edge break from 25 mm to 5 mm by typing in its field.
  const v0 = await page.evaluate(() => (window as unknown as W).__dewline.controller.section.get().version);
  const eb = (await page.evaluate(() => (window as unknown as Live).__dewline.partBox('edge')))!;
  const ec = await toClient(page, (eb.minX + eb.maxX) / 2, (eb.minY + eb.maxY) / 2);
  await page.mouse.click(ec.x, ec.y);
  await page.getByTestId('field-thickness').fill('5 mm');
  await page.getByTestId('field-thickness').press('Enter');
  await expect.poll(async () => ((await snap(page)).parts.find((p) => p.id === 'edge') as unknown as { thickness: number }).thickness).toBeCloseTo(0.005, 12);
  await page.waitForFunction((v) => { const w = window as unknown as W; return w.__dewline.live.version > v && w.__dewline.live.mesh === 'default'; }, v0, { timeout: 240_000 });
  await expect(page.getByTestId('live-readout')).toHaveAttribute('data-stale', 'no', { timeout: 120_000 });
  await page.screenshot({ path: 'test-results/live/thinner-break.png' });
  const after = await page.evaluate(() => { const w = window as unknown as W; return { r: w.__dewline.results, snap: w.__dewline.snapshot() }; });
  const ref2 = solveSectionSync(after.snap as never, { mesh: 'default' });
  expect(after.r.psiGround!.psiG).toBeCloseTo(ref2.psiGround!.psiG, 9);
  expect(after.r.coldest!.t).toBeCloseTo(ref2.coldest!.t, 9);
  expect(after.r.psiGround!.psiG).toBeGreaterThan(before.r.psiGround!.psiG);
  // The slab edge runs colder with a thinner break. (The section's single coldest point sits at the sill
  // plate corner, which the closer slab warms, so the slab's own surfaces are the ones to watch.)
  const slabMin = (r: typeof after.r) => Math.min(...r.surfaces.filter((x) => x.partId === 'slab').map((x) => x.tMin));
  expect(slabMin(after.r)).toBeLessThan(slabMin(before.r) - 1);

  // The command line on the saved file gives the same numbers as the readout.
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('save').click()]);
  const saved = testInfo.outputPath('thinner-break.dewline.json');
  await download.saveAs(saved);
  const cli = spawnSync(process.execPath, [path.resolve('bin/dewline.mjs'), 'solve', saved, '--json'], { encoding: 'utf8', maxBuffer: 256 * 1024 * 1024 });
  expect(cli.status, cli.stderr).toBe(0);
  const fromCli = JSON.parse(cli.stdout) as SectionResults;
  expect(fromCli.psiGround!.psiG).toBeCloseTo(after.r.psiGround!.psiG, 9);
  expect(fromCli.coldest!.t).toBeCloseTo(after.r.coldest!.t, 9);
  expect(fromCli.l2d!).toBeCloseTo(after.r.l2d!, 9);
  await expect(page.getByTestId('live-psig')).toHaveText(formatQuantity('psi', fromCli.psiGround!.psiG, 'si'));
});

// ---- probe, cut lines, psi settings, results during a drag -------------------------------------------


type Live = { __dewline: { results: SectionResults; live: { version: number; mesh: string; refreshes: number; stale: boolean }; snapshot(): SectionSnapshot; partBox(id: string): { minX: number; minY: number; maxX: number; maxY: number } | null; toClient(x: number, y: number): { x: number; y: number }; view(): { k: number }; controller: { section: { get(): { version: number } }; pointer: { get(): { w: [number, number] } | null } } } };

const gridOf = (r: SectionResults): GridField => {
  const t = new Float64Array(r.field.t.length);
  r.field.t.forEach((v, k) => (t[k] = v === null ? NaN : v));
  return { xs: r.field.xs, ys: r.field.ys, nx: r.field.xs.length - 1, ny: r.field.ys.length - 1, t };
};

/** Wait until the page shows default-mesh results for the drawing as it is now. */
async function settled(page: Page) {
  await page.waitForFunction(() => {
    const w = window as unknown as Live;
    return w.__dewline?.live?.mesh === 'default' && w.__dewline.live.version === w.__dewline.controller.section.get().version;
  }, null, { timeout: 240_000 });
  await expect(page.getByTestId('live-readout')).toHaveAttribute('data-stale', 'no', { timeout: 120_000 });
}
const snap = (page: Page) => page.evaluate(() => (window as unknown as Live).__dewline.snapshot());
const toClient = (page: Page, x: number, y: number) => page.evaluate(([a, b]) => (window as unknown as Live).__dewline.toClient(a, b), [x, y] as const);

test('the probe shows temperature and material under the pointer, and surface RH over a verdict surface', async ({ page }, info) => {
  await page.goto('/section?template=slab-edge-break');
  await settled(page);
  const s = await snap(page);
  const ref = solveSectionSync(s, { mesh: 'default' });
  const field = gridOf(ref);
  const solids = resolveSection(s).solids;
  const k = await page.evaluate(() => (window as unknown as Live).__dewline.view().k);

  // Over the middle of the slab.
  const slab = (await page.evaluate(() => (window as unknown as Live).__dewline.partBox('slab')))!;
  const p = await toClient(page, slab.minX + 0.3, (slab.minY + slab.maxY) / 2);
  await page.mouse.move(p.x, p.y);
  await expect(page.getByTestId('probe-t')).not.toHaveText('–');
  const w = (await page.evaluate(() => (window as unknown as Live).__dewline.controller.pointer.get()))!.w;
  const expected = probeAt(solids, field, ref.surfaces, w[0], w[1], 6 / k);
  expect(expected.partId).toBe('slab');
  expect(expected.t).toBeCloseTo(fieldAt(field, w[0], w[1]), 12);
  await expect(page.getByTestId('probe-t')).toHaveText(formatQuantity('temperature', expected.t!, 'si', 2));
  await expect(page.getByTestId('probe-material')).toHaveText(lookupMaterial(resolveSection(s).materials, expected.materialId!)!.name);
  await expect(page.getByTestId('probe-surface')).toHaveCount(0);

  // Over the coldest verdict surface.
  const seg = ref.surfaces.find((x) => x.id === ref.coldest!.segmentId)!;
  const q = await toClient(page, (seg.from[0] + seg.to[0]) / 2, (seg.from[1] + seg.to[1]) / 2);
  await page.mouse.move(q.x, q.y);
  await expect(page.getByTestId('probe-surface')).toBeVisible();
  const w2 = (await page.evaluate(() => (window as unknown as Live).__dewline.controller.pointer.get()))!.w;
  const e2 = probeAt(solids, field, ref.surfaces, w2[0], w2[1], 6 / k);
  expect(e2.segment).not.toBeNull();
  await expect(page.getByTestId('probe-rh')).toHaveText(`${(e2.segment!.rhSurfaceMax * 100).toFixed(1)} %`);
  await expect(page.getByTestId('probe-tmin')).toHaveText(formatQuantity('temperature', e2.segment!.tMin, 'si', 2));
  const file = info.outputPath('probe.png');
  await page.screenshot({ path: file });
  await info.attach('probe', { path: file, contentType: 'image/png' });
});

test('a cut line is drawn, saved, charted with its layers, used for psi with an editable convention, and deleted', async ({ page }, info) => {
  await page.goto('/section?template=slab-edge-break');
  await settled(page);
  const cuts0 = (await snap(page)).cuts.length;

  // Draw a cut across the framed wall, from the outdoor air to the room (Alt: no snapping).
  await page.getByTestId('cut-tool').click();
  const a = await toClient(page, -0.3, 1.0), b = await toClient(page, 0.5, 1.0);
  await page.keyboard.down('Alt');
  await page.mouse.move(a.x, a.y);
  await page.mouse.down();
  await page.mouse.move(b.x, b.y, { steps: 8 });
  await page.mouse.up();
  await page.keyboard.up('Alt');
  const s1 = await snap(page);
  expect(s1.cuts.length).toBe(cuts0 + 1);
  const cut = s1.cuts[s1.cuts.length - 1];
  const k = await page.evaluate(() => (window as unknown as Live).__dewline.view().k);
  expect(Math.abs(cut.from[0] + 0.3)).toBeLessThan(1.5 / k);
  expect(Math.abs(cut.to[0] - 0.5)).toBeLessThan(1.5 / k);
  expect(Math.abs(cut.from[1] - 1.0)).toBeLessThan(1.5 / k);

  // Its chart: temperatures from the solver's field, one row per solid layer crossed.
  await expect(page.getByTestId('cut-chart')).toBeVisible();
  const ref = solveSectionSync(s1, { mesh: 'default' });
  const solids = resolveSection(s1).solids;
  const layers = cutLayers(solids, cut.from, cut.to).filter((l) => l.partId);
  expect(layers.length).toBeGreaterThanOrEqual(2); // the framed wall is more than one layer
  await expect(page.getByTestId('cut-layer-length')).toHaveText(layers.map((l) => formatLength(l.s1 - l.s0, 'si')));
  await expect(page.getByTestId('cut-boundary')).toHaveCount(cutLayers(solids, cut.from, cut.to).length - 1);
  const range = profileRange(cutProfile(gridOf(ref), solids, cut.from, cut.to))!;
  await expect(page.getByTestId('cut-min')).toHaveText(formatQuantity('temperature', range.lo, 'si', 2));
  await expect(page.getByTestId('cut-max')).toHaveText(formatQuantity('temperature', range.hi, 'si', 2));
  let file = info.outputPath('cut-line.png');
  await page.screenshot({ path: file });
  await info.attach('cut-line', { path: file, contentType: 'image/png' });

  // Use it as the flanking wall's reference cut: psi appears and equals the solver on the document.
  await expect(page.getByTestId('live-psi')).toHaveCount(0);
  await page.getByTestId('cut-to-flanking').click();
  const len = page.getByTestId('flanking-length-0');
  await len.fill('1.4 m');
  await len.press('Enter');
  await expect.poll(async () => (await snap(page)).analysis.flanking[0]?.length).toBeCloseTo(1.4, 9);
  await settled(page);
  const s2 = await snap(page);
  const r2 = solveSectionSync(s2, { mesh: 'default' });
  expect(r2.psi).not.toBeNull();
  await expect(page.getByTestId('live-psi')).toHaveText(formatQuantity('psi', r2.psi!.psi, 'si'));
  await expect(page.getByText('psi (internal dimensions)')).toBeVisible();

  // Change the convention and the length measured under it: the document and the readout follow.
  await page.getByTestId('live-convention').selectOption('external');
  await len.fill('1.6 m');
  await len.press('Enter');
  await expect.poll(async () => (await snap(page)).analysis).toMatchObject({ convention: 'external', flanking: [{ length: 1.6 }] });
  await settled(page);
  await expect(page.getByText('psi (external dimensions)')).toBeVisible();
  const r3 = solveSectionSync(await snap(page), { mesh: 'default' });
  await expect(page.getByTestId('live-psi')).toHaveText(formatQuantity('psi', r3.psi!.psi, 'si'));
  // The longer flanking length takes U l more off psi (ISO 10211: psi = L2D - sum U_j l_j).
  expect(r3.psi!.psi).toBeCloseTo(r2.psi!.psi - 0.2 * r2.psi!.flanking[0].u, 9);
  file = info.outputPath('psi-external.png');
  await page.screenshot({ path: file });
  await info.attach('psi-external', { path: file, contentType: 'image/png' });

  // A bad length is refused at the field and changes nothing.
  await len.fill('-2 m');
  await len.press('Enter');
  await expect(page.getByTestId('flanking-length-0-error')).toContainText('must be at least 0');
  expect((await snap(page)).analysis.flanking[0].length).toBeCloseTo(1.6, 9);

  // Delete the cut: gone from the document (the flanking element keeps its own copy of the line).
  await page.getByTestId(`cut-delete-${cut.id}`).click();
  expect((await snap(page)).cuts.map((c) => c.id)).not.toContain(cut.id);
});

test('while a part is dragged fresh results keep arriving; after release the readout equals the solver', async ({ page }, info) => {
  await page.goto('/section?template=slab-edge-break');
  await settled(page);
  const fb = (await page.evaluate(() => (window as unknown as Live).__dewline.partBox('footing')))!;
  const start = await toClient(page, fb.minX + 0.15, (fb.minY + fb.maxY) / 2);
  const seen: { version: number; mesh: string; refreshes: number }[] = [];
  const read = () => page.evaluate(() => { const l = (window as unknown as Live).__dewline.live; return { version: l.version, mesh: l.mesh, refreshes: l.refreshes }; });
  const r0 = await read();
  await page.mouse.move(start.x, start.y);
  await page.mouse.down();
  // A slow drag: 40 steps of 2 px, a tenth of a second apart.
  for (let i = 1; i <= 40; i++) {
    await page.mouse.move(start.x + 2 * i, start.y);
    await page.waitForTimeout(100);
    seen.push(await read());
  }
  const during = await read();
  await page.mouse.up();
  const previews = new Set(seen.filter((x) => x.mesh === 'preview' && x.version > r0.version).map((x) => x.version));
  info.annotations.push({ type: 'results during the drag', description: `${during.refreshes - r0.refreshes} results, ${previews.size} distinct preview versions over ${seen.length} steps` });
  expect(during.refreshes - r0.refreshes).toBeGreaterThanOrEqual(2);
  expect(previews.size).toBeGreaterThanOrEqual(2);
  // Fresh: the versions shown rise during the drag.
  expect(Math.max(...previews)).toBeGreaterThan(Math.min(...previews));

  await settled(page);
  const fb2 = (await page.evaluate(() => (window as unknown as Live).__dewline.partBox('footing')))!;
  expect(fb2.minX).toBeGreaterThan(fb.minX);
  const after = await page.evaluate(() => { const w = window as unknown as Live; return { r: w.__dewline.results, s: w.__dewline.snapshot() }; });
  const ref = solveSectionSync(after.s, { mesh: 'default' });
  expect(after.r.psiGround!.psiG).toBeCloseTo(ref.psiGround!.psiG, 9);
  expect(after.r.coldest!.t).toBeCloseTo(ref.coldest!.t, 9);
  await expect(page.getByTestId('live-psig')).toHaveText(formatQuantity('psi', ref.psiGround!.psiG, 'si'));
  await expect(page.getByTestId('live-coldest')).toHaveText(formatQuantity('temperature', ref.coldest!.t, 'si', 2));
  const file = info.outputPath('after-drag.png');
  await page.screenshot({ path: file });
  await info.attach('after-drag', { path: file, contentType: 'image/png' });
});

type Konvaish = { Konva: { stages: { getLayers(): { name(): string; getCanvas(): { _canvas: HTMLCanvasElement; getPixelRatio(): number } }[]; find(sel: string): { strokeScaleEnabled(): boolean; dash(): number[] | undefined }[] }[] } };
type Logged = { __dewline: { liveLog: { posts: { id: number; mesh: string; at: number }[]; results: { id: number; mesh: string | null; postedAt: number }[] } } };

test('during a drag every result is matched to its own request, the selection is shifted and the live layer drawn at half resolution; after release all is redrawn in place', async ({ page }) => {
  await page.goto('/section?template=basement-inside-framed');
  await settled(page);
  // Dashes of unscaled strokes are in screen pixels (they were 1/k px once: solid-looking and slow to draw).
  const dashes = await page.evaluate(() => (window as unknown as Konvaish).Konva.stages[0].find('Line').filter((l) => l.strokeScaleEnabled() === false && l.dash()?.length).map((l) => Math.min(...l.dash()!)));
  expect(dashes.length).toBeGreaterThan(0);
  expect(Math.min(...dashes)).toBeGreaterThanOrEqual(1);
  const layers = () => page.evaluate(() => {
    const ls = (window as unknown as Konvaish).Konva.stages[0].getLayers();
    const by = (n: string) => ls.find((l) => l.name() === n)!.getCanvas();
    return { shift: by('selection')._canvas.style.transform, ratio: by('live').getPixelRatio(), mesh: (window as unknown as Live).__dewline.live.mesh };
  });
  expect(await layers()).toEqual({ shift: '', ratio: 1, mesh: 'default' });
  const t0 = await page.evaluate(() => performance.timeOrigin + performance.now());
  const fb = (await page.evaluate(() => (window as unknown as Live).__dewline.partBox('footing')))!;
  const start = await toClient(page, fb.minX + 0.15, (fb.minY + fb.maxY) / 2);
  await page.mouse.move(start.x, start.y);
  await page.keyboard.down('Alt'); // no snapping: every move moves the footing by the pointer's own distance
  await page.mouse.down();
  for (let i = 1; i <= 25; i++) {
    await page.mouse.move(start.x + 2 * i, start.y);
    await page.waitForTimeout(60);
  }
  await page.waitForFunction(() => (window as unknown as Live).__dewline.live.mesh === 'preview', null, { timeout: 120_000 });
  await page.waitForTimeout(300);
  const during = await layers();
  const m = /^translate\(([-\d.]+)px, ([-\d.]+)px\)$/.exec(during.shift);
  expect(m, `selection layer transform: '${during.shift}'`).not.toBeNull();
  expect(Number(m![1])).toBeCloseTo(50, 0);
  expect(Math.abs(Number(m![2]))).toBeLessThan(0.5);
  expect(during.ratio).toBe(0.5);
  await page.mouse.up();
  await page.keyboard.up('Alt');
  await settled(page);
  expect(await layers()).toEqual({ shift: '', ratio: 1, mesh: 'default' });
  // Every result the worker sent back since the drag began belongs to the request of that id, with its mesh.
  const log = await page.evaluate(() => (window as unknown as Logged).__dewline.liveLog);
  const posted = new Map(log.posts.filter((p) => p.at >= t0).map((p) => [p.id, p.mesh]));
  const results = log.results.filter((r) => posted.has(r.id));
  expect(results.filter((r) => r.mesh === 'preview').length).toBeGreaterThanOrEqual(2);
  for (const r of results) expect(r.mesh).toBe(posted.get(r.id));
});

test('selecting and dragging a part redraws only the layers it changes: the stage keeps its layers, zones and grid are not redrawn', async ({ page }) => {
  await page.goto('/section?template=basement-inside-framed');
  await settled(page);
  // Count canvas clears per layer (a Konva layer clears its canvas once per draw).
  await page.evaluate(() => {
    const w = window as unknown as { __clears: Map<HTMLCanvasElement, number> };
    w.__clears = new Map();
    const clear = CanvasRenderingContext2D.prototype.clearRect;
    CanvasRenderingContext2D.prototype.clearRect = function (this: CanvasRenderingContext2D, ...a: [number, number, number, number]) {
      w.__clears.set(this.canvas, (w.__clears.get(this.canvas) ?? 0) + 1);
      return clear.apply(this, a);
    };
  });
  const state = () => page.evaluate(() => {
    const ls = (window as unknown as Konvaish).Konva.stages[0].getLayers();
    const clears = (window as unknown as { __clears: Map<HTMLCanvasElement, number> }).__clears;
    const of = (n: string) => clears.get(ls.find((l) => l.name() === n)!.getCanvas()._canvas) ?? 0;
    return { layers: ls.length, zones: of('zones'), grid: of('grid'), selection: of('selection') };
  });
  const fb = (await page.evaluate(() => (window as unknown as Live).__dewline.partBox('footing')))!;
  const start = await toClient(page, fb.minX + 0.15, (fb.minY + fb.maxY) / 2);
  await page.mouse.move(start.x, start.y); // the probe label appears over the section
  await page.waitForTimeout(300);
  const hover = await state();
  await page.keyboard.down('Alt');
  await page.mouse.down();
  await page.waitForTimeout(300);
  const down = await state();
  // Selecting draws the selection; adding or removing a layer would redraw every layer of the stage.
  expect(down.selection).toBeGreaterThan(hover.selection);
  expect(down).toMatchObject({ layers: hover.layers, zones: hover.zones, grid: hover.grid });
  for (let i = 1; i <= 15; i++) {
    await page.mouse.move(start.x + 2 * i, start.y);
    await page.waitForTimeout(40);
  }
  await page.waitForFunction(() => (window as unknown as Live).__dewline.live.mesh === 'preview', null, { timeout: 120_000 });
  expect(await state()).toMatchObject({ layers: hover.layers, zones: hover.zones, grid: hover.grid });
  await page.mouse.up();
  await page.keyboard.up('Alt');
  await settled(page);
  expect((await state()).layers).toBe(hover.layers);
});
