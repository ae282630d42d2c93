/** The home page as a person uses it: open a template and see it drawn; a bad file is refused with its field path. */
import { expect, test } from '@playwright/test';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { templateByName } from '../../lib/section/templates';

test('home page opens a template and the section is drawn', async ({ page }) => {
  await page.goto('/');
  await expect(page.getByRole('heading', { name: 'Dewline' })).toBeVisible();
  await expect(page.getByText('Screening aid.')).toBeVisible();
  await page.getByTestId('template-slab-edge-break').click();
  await page.waitForURL(/\/section\?template=slab-edge-break/);
  await page.waitForFunction(() => Boolean((window as any).__dewline?.doc), null, { timeout: 60_000 });
  const ids = await page.evaluate(() => {
    const s = (window as any).__dewline.snapshot();
    return s.parts ? s.parts.map((p: { id: string }) => p.id) : null;
  });
  const expected = templateByName('slab-edge-break')!.build().parts.map((p) => p.id);
  expect(ids?.sort()).toEqual([...expected].sort());
  const canvas = page.locator('canvas').first();
  await expect(canvas).toBeVisible();
  // The drawing is not blank: the canvas holds many distinct colours (fills, zones, outlines).
  const colours = await canvas.evaluate((c: HTMLCanvasElement) => {
    const ctx = c.getContext('2d')!;
    const { data } = ctx.getImageData(0, 0, c.width, c.height);
    const seen = new Set<number>();
    for (let i = 0; i < data.length; i += 4 * 97) seen.add((data[i] << 16) | (data[i + 1] << 8) | data[i + 2]);
    return seen.size;
  });
  expect(colours).toBeGreaterThan(8);
  await page.screenshot({ path: 'test-results/home-template.png' });
});

test('opening a broken file shows the field path and reason, and stays on the home page', async ({ page }) => {
  const s = templateByName('slab-edge-break')!.build() as any;
  s.parts.find((p: any) => p.kind === 'slab').thickness = -0.02;
  const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'dewline-e2e-')), 'broken.json');
  fs.writeFileSync(file, JSON.stringify(s));
  await page.goto('/');
  await page.getByTestId('open-file').setInputFiles(file);
  const problems = page.getByTestId('open-problems');
  await expect(problems).toContainText(/broken\.json: parts\[\d+\]\.thickness: must be greater than 0, got -0\.02 m/);
  expect(new URL(page.url()).pathname).toBe('/');
});

test('opening a valid file loads it on the section page', async ({ page }) => {
  const s = templateByName('crawlspace-unvented')!.build();
  const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'dewline-e2e-')), 'crawl.json');
  fs.writeFileSync(file, JSON.stringify(s));
  await page.goto('/');
  await page.getByTestId('open-file').setInputFiles(file);
  await page.waitForURL(/\/section\?open=1/);
  await page.waitForFunction(() => Boolean((window as any).__dewline?.doc), null, { timeout: 60_000 });
  const name = await page.evaluate(() => (window as any).__dewline.snapshot().name);
  expect(name).toBe(s.name);
});
