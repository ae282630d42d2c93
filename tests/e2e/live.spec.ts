/**
 * Live physics in the browser: the readout equals solveSectionSync (the code path of `dewline solve`)
 * on the same snapshot, and thinning the slab-edge break raises psi_g and lowers the slab-edge surface temperature.
 */
import { expect, test } from '@playwright/test';
import { solveSectionSync } from '../../lib/thermal/section';
import type { SectionResults } from '../../lib/thermal/types';

test.setTimeout(300_000);

type W = { __dewline: { results: SectionResults; live: { version: number; mesh: string }; controller: { section: { get(): { version: number } }; updatePart(id: string, p: Record<string, unknown>): string | null }; snapshot(): unknown } };

test('readout follows the drawing and equals the solver on the same snapshot', async ({ page }) => {
  await page.goto('/section?template=slab-edge-break');
  await page.waitForFunction(() => (window as unknown as W).__dewline?.results?.mesh.level === 'default', null, { timeout: 240_000 });
  await expect(page.getByTestId('live-readout')).toHaveAttribute('data-stale', 'no', { timeout: 120_000 });
  await page.screenshot({ path: 'test-results/live/before.png' });
  const before = await page.evaluate(() => { const w = window as unknown as W; return { r: w.__dewline.results, snap: w.__dewline.snapshot() }; });
  const ref = solveSectionSync(before.snap as never, { mesh: 'default' });
  expect(before.r.psiGround!.psiG).toBeCloseTo(ref.psiGround!.psiG, 9);
  expect(before.r.coldest!.t).toBeCloseTo(ref.coldest!.t, 9);
  await expect(page.getByTestId('live-psig')).toHaveText(`${ref.psiGround!.psiG.toFixed(3)} W/(m·K)`);

  // Thin the slab-edge break from 25 mm to 5 mm through the board's named operation.
  const v0 = await page.evaluate(() => (window as unknown as W).__dewline.controller.section.get().version);
  expect(await page.evaluate(() => (window as unknown as W).__dewline.controller.updatePart('edge', { thickness: 0.005 }))).toBeNull();
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
});
