/**
 * The drawing board in Chromium, as a person uses it: pointer, keyboard and the side panel. Every check
 * reads the document itself (window.__dewline.snapshot()), and screenshots are kept as test artifacts.
 */
import { expect, test } from '@playwright/test';
import type { Page, TestInfo } from '@playwright/test';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { resolveSection } from '../../lib/section/resolve';
import { templateByName } from '../../lib/section/templates';
import { formatLength } from '../../lib/units';

test.setTimeout(240_000);

type Box = { minX: number; minY: number; maxX: number; maxY: number };
type Snap = { name: string; parts: { id: string; kind: string; locked: boolean; thickness?: number; points?: [number, number][] }[] };
type Dew = {
  snapshot(): Snap;
  partBox(id: string): Box | null;
  toClient(x: number, y: number): { x: number; y: number };
  selection(): { parts: string[]; zones: string[] };
  view(): { k: number; ox: number; oy: number };
  canUndo(): number;
};
/** Run `fn` on window.__dewline in the page (the function travels as its source text). */
const dew = <T>(page: Page, fn: (d: Dew) => T) =>
  page.evaluate((src) => new Function('d', `return (${src})(d)`)((window as unknown as { __dewline: unknown }).__dewline), fn.toString()) as Promise<T>;

async function openTemplate(page: Page, name = 'slab-edge-break') {
  await page.goto(`/section?template=${name}`);
  await page.waitForFunction(() => Boolean((window as unknown as { __dewline?: { controller?: unknown } }).__dewline?.controller), null, { timeout: 90_000 });
  await expect(page.getByTestId('board-canvas').locator('canvas').first()).toBeVisible();
}

const snapshot = (page: Page) => page.evaluate(() => (window as unknown as { __dewline: Dew }).__dewline.snapshot());
const box = (page: Page, id: string) => page.evaluate((i) => (window as unknown as { __dewline: Dew }).__dewline.partBox(i), id);
const client = (page: Page, x: number, y: number) => page.evaluate(([a, b]) => (window as unknown as { __dewline: Dew }).__dewline.toClient(a, b), [x, y] as const);
async function centreOf(page: Page, id: string) {
  const b = await box(page, id);
  expect(b, `part ${id} is drawn`).not.toBeNull();
  return client(page, (b!.minX + b!.maxX) / 2, (b!.minY + b!.maxY) / 2);
}
const part = (s: Snap, id: string) => s.parts.find((p) => p.id === id);

async function shot(page: Page, info: TestInfo, name: string) {
  const file = info.outputPath(`${name}.png`);
  await page.screenshot({ path: file });
  await info.attach(name, { path: file, contentType: 'image/png' });
}

/** A slow drag with the mouse: down, `steps` moves, up. */
async function drag(page: Page, from: { x: number; y: number }, dx: number, dy: number, steps = 12) {
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  await page.mouse.move(from.x + dx, from.y + dy, { steps });
  await page.mouse.up();
}

test('edit a template: type a thickness, drag the wall, draw a polygon, undo twice, save and reopen', async ({ page }, info) => {
  await openTemplate(page);
  const start = await snapshot(page);
  expect(part(start, 'edge')!.thickness).toBeCloseTo(0.025, 12);

  // Select the slab-edge board by clicking it on the canvas.
  await page.mouse.click(...Object.values(await centreOf(page, 'edge')) as [number, number]);
  await expect.poll(() => dew(page, (d) => d.selection().parts)).toEqual(['edge']);
  await expect(page.getByTestId('part-panel')).toBeVisible();

  // Type a new thickness with its unit.
  const field = page.getByTestId('field-thickness');
  await field.fill('40 mm');
  await field.press('Enter');
  await expect.poll(async () => part(await snapshot(page), 'edge')!.thickness).toBeCloseTo(0.04, 12);
  await expect(field).toHaveValue('40 mm');
  await shot(page, info, '1-thickness-typed');

  // A bad entry is refused at the field and changes nothing.
  await field.fill('-3 mm');
  await field.press('Enter');
  await expect(page.getByTestId('field-thickness-error')).toHaveText('must be greater than 0, got -3 mm');
  expect(part(await snapshot(page), 'edge')!.thickness).toBeCloseTo(0.04, 12);
  await field.press('Escape');

  // Drag the framed wall 40 px to the right, without snapping (Alt), in a slow multi-step drag.
  const k = await dew(page, (d) => d.view().k);
  const wall0 = (await box(page, 'wall'))!;
  await page.keyboard.down('Alt');
  await drag(page, await centreOf(page, 'wall'), 40, 0);
  await page.keyboard.up('Alt');
  const wall1 = (await box(page, 'wall'))!;
  expect(wall1.minX - wall0.minX).toBeCloseTo(40 / k, 6);
  expect(wall1.minY).toBeCloseTo(wall0.minY, 9);
  await shot(page, info, '2-wall-dragged');

  // Draw a free polygon in the room: four clicks, then a click on the first vertex closes it.
  await page.keyboard.press('p');
  const corners: [number, number][] = [[1.0, 0.6], [1.4, 0.6], [1.4, 1.0], [1.1, 1.1]];
  await page.keyboard.down('Alt');
  for (const [x, y] of corners) {
    const p = await client(page, x, y);
    await page.mouse.click(p.x, p.y);
  }
  const first = await client(page, ...corners[0]);
  await page.mouse.click(first.x + 2, first.y - 1);
  await page.keyboard.up('Alt');
  const withPoly = await snapshot(page);
  const poly = withPoly.parts.find((p) => p.kind === 'polygon');
  expect(poly, 'a polygon part was added').toBeTruthy();
  const pb = (await box(page, poly!.id))!;
  const tol = 1.5 / k; // a click lands within a pixel and a half of where it was aimed
  expect(pb.minX).toBeCloseTo(1.0, 1);
  expect(Math.abs(pb.minX - 1.0)).toBeLessThan(tol);
  expect(Math.abs(pb.maxX - 1.4)).toBeLessThan(tol);
  expect(Math.abs(pb.minY - 0.6)).toBeLessThan(tol);
  expect(Math.abs(pb.maxY - 1.1)).toBeLessThan(tol);
  expect(poly!.points!.length).toBe(5); // a closed ring: four vertices and the first repeated
  await shot(page, info, '3-polygon-drawn');

  // Undo twice: the polygon goes, then the drag; the typed thickness stays.
  await page.getByTestId('undo').click();
  await page.getByTestId('undo').click();
  const undone = await snapshot(page);
  expect(undone.parts.some((p) => p.kind === 'polygon')).toBe(false);
  const wall2 = (await box(page, 'wall'))!;
  expect(wall2.minX).toBeCloseTo(wall0.minX, 9);
  expect(part(undone, 'edge')!.thickness).toBeCloseTo(0.04, 12);
  expect(undone.parts.map((p) => p.id).sort()).toEqual(start.parts.map((p) => p.id).sort());

  // Save to a file: the file is the document.
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('save').click()]);
  expect(download.suggestedFilename()).toBe('slab-on-ground-slab-edge-break.dewline.json');
  const saved = info.outputPath('saved.dewline.json');
  await download.saveAs(saved);
  const savedJson = JSON.parse(fs.readFileSync(saved, 'utf8'));
  expect(savedJson).toEqual(await snapshot(page));

  // Change the document, then open the saved file: the same document comes back.
  await page.mouse.click(...Object.values(await centreOf(page, 'footing')) as [number, number]);
  await page.keyboard.press('Delete');
  expect((await snapshot(page)).parts.some((p) => p.id === 'footing')).toBe(false);
  await page.getByTestId('file-input').setInputFiles(saved);
  await expect.poll(() => snapshot(page)).toEqual(savedJson);
  await expect(page.getByTestId('status')).toContainText(`Opened '${savedJson.name}'`);
  await shot(page, info, '4-reopened');
});

test('multi-select with shift-click and with a box, then delete; undo brings them back', async ({ page }, info) => {
  await openTemplate(page);
  const n0 = (await snapshot(page)).parts.length;
  await page.mouse.click(...Object.values(await centreOf(page, 'footing')) as [number, number]);
  await page.keyboard.down('Shift');
  await page.mouse.click(...Object.values(await centreOf(page, 'plate')) as [number, number]);
  await page.keyboard.up('Shift');
  await expect.poll(() => dew(page, (d) => [...d.selection().parts].sort())).toEqual(['footing', 'plate']);
  await expect(page.getByTestId('multi-panel')).toBeVisible();
  await shot(page, info, 'multi-selected');
  await page.getByTestId('delete').click();
  const after = await snapshot(page);
  expect(after.parts.length).toBe(n0 - 2);
  expect(after.parts.some((p) => p.id === 'footing' || p.id === 'plate')).toBe(false);
  await page.keyboard.press('Control+z');
  expect((await snapshot(page)).parts.length).toBe(n0);

  // A box dragged from empty space (above the model) selects every part entirely inside it.
  const from: [number, number] = [-0.05, 1.7], to: [number, number] = [0.3, -0.15];
  const a = await client(page, ...from), b = await client(page, ...to);
  await drag(page, a, b.x - a.x, b.y - a.y, 10);
  const r = { minX: from[0], maxX: to[0], minY: to[1], maxY: from[1] };
  const inside = [...resolveSection((await snapshot(page)) as never).parts.values()].filter((p) => p.box.minX >= r.minX && p.box.maxX <= r.maxX && p.box.minY >= r.minY && p.box.maxY <= r.maxY).map((p) => p.id).sort();
  expect(inside).toEqual(['edge', 'plate', 'wall']);
  await expect.poll(() => dew(page, (d) => [...d.selection().parts].sort())).toEqual(inside);
  await shot(page, info, 'box-selected');
  await page.keyboard.press('Delete');
  expect((await snapshot(page)).parts.length).toBe(n0 - 3);
});

test('a locked part cannot be dragged; unlocked it can', async ({ page }, info) => {
  await openTemplate(page);
  const c = await centreOf(page, 'footing');
  await page.mouse.click(c.x, c.y);
  await page.getByTestId('lock').click();
  await expect.poll(async () => part(await snapshot(page), 'footing')!.locked).toBe(true);
  const b0 = (await box(page, 'footing'))!;
  await drag(page, c, 50, 30);
  expect(await box(page, 'footing')).toEqual(b0);
  await expect(page.getByTestId('status')).toContainText('is locked');
  await shot(page, info, 'locked-drag-refused');
  // The lock is in the document and can be undone like any edit; unlocked, the same drag moves it.
  await page.getByTestId('lock').click();
  expect(part(await snapshot(page), 'footing')!.locked).toBe(false);
  const stem0 = (await box(page, 'stem'))!, plate0 = (await box(page, 'plate'))!;
  await drag(page, c, 50, 0);
  const b1 = (await box(page, 'footing'))!;
  expect(b1.minX).toBeGreaterThan(b0.minX);
  // Joined parts follow: the stem wall on the footing, the sill plate on the stem wall (snapping may round the move, but all move alike).
  expect((await box(page, 'stem'))!.minX - stem0.minX).toBeCloseTo(b1.minX - b0.minX, 9);
  expect((await box(page, 'plate'))!.minX - plate0.minX).toBeCloseTo(b1.minX - b0.minX, 9);
});

test('the help overlay lists the shortcuts and closes', async ({ page }, info) => {
  await openTemplate(page);
  await expect(page.getByTestId('help-overlay')).toHaveCount(0);
  await page.getByTestId('help').click();
  const help = page.getByTestId('help-overlay');
  await expect(help).toBeVisible();
  await expect(help).toContainText('Undo your last change');
  await expect(help).toContainText('Draw a free polygon');
  await shot(page, info, 'help-open');
  await page.keyboard.press('Escape');
  await expect(help).toHaveCount(0);
  // The ? key opens it too, and the Close button shuts it.
  await page.keyboard.press('?');
  await expect(help).toBeVisible();
  await help.getByRole('button', { name: 'Close' }).click();
  await expect(help).toHaveCount(0);
});

test('a bad file gives the same messages as `dewline check` and leaves the board unchanged', async ({ page }, info) => {
  const s = templateByName('slab-edge-break')!.build() as unknown as { parts: Record<string, unknown>[]; zones: Record<string, unknown>[] };
  s.parts.find((p) => p.id === 'edge')!.thickness = 0;
  s.zones[0].kind = 'sauna';
  const file = info.outputPath('broken.dewline.json');
  fs.writeFileSync(file, JSON.stringify(s, null, 2));
  // The command line, run for real: each line is `FILE: path: reason`.
  const cli = spawnSync(process.execPath, [path.resolve('bin/dewline.mjs'), 'check', file], { encoding: 'utf8' });
  expect(cli.status).not.toBe(0);
  const cliLines = cli.stderr.trim().split('\n').map((l) => l.slice(`${file}: `.length));
  expect(cliLines.length).toBeGreaterThanOrEqual(2);

  await openTemplate(page);
  const before = await snapshot(page);
  await page.getByTestId('file-input').setInputFiles(file);
  const modal = page.getByTestId('file-problems');
  await expect(modal).toBeVisible();
  const shown = (await modal.locator('pre').innerText()).trim().split('\n');
  expect(shown).toEqual(cliLines);
  await shot(page, info, 'bad-file');
  expect(await snapshot(page)).toEqual(before);
  await modal.getByRole('button', { name: 'Close' }).click();
  await expect(modal).toHaveCount(0);
});

test.describe('tablet', () => {
  test.use({ hasTouch: true, viewport: { width: 1024, height: 768 } });
  test('a tap selects a part and a one-finger drag moves it', async ({ page }, info) => {
    await openTemplate(page);
    const c = await centreOf(page, 'footing');
    await page.touchscreen.tap(c.x, c.y);
    await expect.poll(() => dew(page, (d) => d.selection().parts)).toEqual(['footing']);
    await shot(page, info, 'tablet-tap-selected');
    // A one-finger drag through the touch protocol (Chromium turns it into pointer events of type touch).
    const b0 = (await box(page, 'footing'))!;
    const cdp = await page.context().newCDPSession(page);
    const touch = (type: 'touchStart' | 'touchMove' | 'touchEnd', x: number, y: number) => cdp.send('Input.dispatchTouchEvent', { type, touchPoints: type === 'touchEnd' ? [] : [{ x, y, id: 1 }] });
    // Once selected, the footing shows its handles, and a finger near one takes the handle (20 px reach):
    // grab the body a fifth of the way along, away from them.
    const g = await client(page, b0.minX + 0.2 * (b0.maxX - b0.minX), (b0.minY + b0.maxY) / 2);
    await page.waitForTimeout(500); // a finger comes back later than a double tap would
    await touch('touchStart', g.x, g.y);
    for (let i = 1; i <= 10; i++) {
      await touch('touchMove', g.x + i * 6, g.y);
      await page.waitForTimeout(30);
    }
    await touch('touchEnd', g.x + 60, g.y);
    await expect.poll(async () => (await box(page, 'footing'))!.minX).toBeGreaterThan(b0.minX + 0.05);
    await shot(page, info, 'tablet-dragged');
  });
});

/**
 * The first steps of docs/board-usage.md, as written there: from a blank board, with the palette, typed
 * values and joins, the footing, the stem wall, the slab-edge break and the room land exactly where the
 * slab-edge template has them. With DEWLINE_WRITE_DOCS=1 the screenshot is written to docs/img/board.png.
 */
test('a newcomer rebuilds the slab-edge junction from a blank board, as docs/board-usage.md says', async ({ page }, info) => {
  await page.goto('/section?blank=1');
  await page.waitForFunction(() => Boolean((window as unknown as { __dewline?: { controller?: unknown } }).__dewline?.controller), null, { timeout: 90_000 });
  const canvas = page.getByTestId('board-canvas');
  const cb = (await canvas.boundingBox())!;
  const panel = page.getByTestId('part-panel');
  const type = async (testId: string, text: string) => {
    const f = page.getByTestId(testId);
    await f.fill(text);
    await f.press('Enter');
    await expect(page.getByTestId(`${testId}-error`)).toHaveCount(0);
  };
  const idOf = async (kind: string) => (await snapshot(page)).parts.filter((p) => p.kind === kind).at(-1)!.id;
  const join = async (to: string, its: string, self: string) => {
    await panel.getByText('Join to a part').click();
    await page.getByTestId('join-to').selectOption({ label: to });
    await panel.getByLabel('Its point').selectOption({ label: its });
    await panel.getByLabel("This part's point").selectOption({ label: self });
    await page.getByTestId('join').click();
    await expect(page.getByTestId('join-info')).toBeVisible();
  };

  // Step 1: the footing. Palette, click on the board, then the exact values (a bare number is in mm).
  await page.getByTestId('palette-footing').click();
  await page.mouse.click(cb.x + cb.width * 0.3, cb.y + cb.height * 0.7);
  await type('field-name', 'Footing');
  await type('field-width', '600');
  await type('field-depth', '250 mm');
  await type('field-x', '-200');
  await type('field-y', '-1.2 m');

  // Step 2: the stem wall, joined on top of the footing (it follows the footing from now on).
  await page.getByTestId('palette-foundation-wall').click();
  await page.mouse.click(cb.x + cb.width * 0.6, cb.y + cb.height * 0.3);
  await type('field-name', 'Stem wall');
  await type('field-thickness', '200');
  await type('field-height', '1150');
  await join('Footing', 'top center', 'bottom center');

  // Step 3: the slab-edge break: a vertical board whose top-left sits on the stem wall's top-right.
  await page.getByTestId('palette-board').click();
  await page.mouse.click(cb.x + cb.width * 0.7, cb.y + cb.height * 0.5);
  await type('field-name', 'Slab-edge break');
  await page.getByTestId('field-placement').selectOption('slab-edge');
  await page.getByTestId('field-orientation').selectOption('vertical');
  await type('field-thickness', '25 mm');
  await type('field-length', '300');
  await join('Stem wall', 'top right', 'top left');

  // Step 4: the room: the indoor-air zone dragged out, then typed exactly.
  await page.getByTestId('palette-zone-indoor').click();
  await page.mouse.move(cb.x + cb.width * 0.75, cb.y + cb.height * 0.2);
  await page.mouse.down();
  await page.mouse.move(cb.x + cb.width * 0.9, cb.y + cb.height * 0.3, { steps: 4 });
  await page.mouse.up();
  const zp = page.getByTestId('zone-panel');
  await expect(zp).toBeVisible();
  for (const [label, text] of [['Name', 'Living room'], ['x', '60'], ['y', '200'], ['Width', '4.14 m'], ['Height', '1.4 m']] as const) {
    const f = zp.getByLabel(label, { exact: true });
    await f.fill(text);
    await f.press('Enter');
  }

  // The result sits exactly where the template has it.
  const tpl = resolveSection(templateByName('slab-edge-break')!.build());
  const mine = await snapshot(page);
  const want: [string, string][] = [['footing', 'footing'], ['foundation-wall', 'stem'], ['board', 'edge']];
  for (const [kind, tid] of want) {
    const got = (await box(page, await idOf(kind)))!;
    const ref = tpl.parts.get(tid)!.box;
    for (const k of ['minX', 'minY', 'maxX', 'maxY'] as const) expect(got[k], `${tid}.${k}`).toBeCloseTo(ref[k], 9);
  }
  const room = (mine as unknown as { zones: { name: string; shape: { x: number; y: number; width: number; height: number } }[] }).zones.find((z) => z.name === 'Living room')!;
  const tplRoom = templateByName('slab-edge-break')!.build().zones.find((z) => z.id === 'room')!;
  expect(room.shape).toMatchObject({ type: 'rect' });
  for (const k of ['x', 'y', 'width', 'height'] as const) expect(room.shape[k]).toBeCloseTo((tplRoom.shape as typeof room.shape)[k], 9);

  // The screenshot for the guide: the break selected, its handles and typed values in view.
  await page.getByRole('button', { name: 'Whole section' }).click();
  const edge = await centreOf(page, await idOf('board'));
  await page.mouse.click(edge.x, edge.y);
  await expect(panel).toBeVisible();
  const out = process.env.DEWLINE_WRITE_DOCS ? path.resolve('docs/img/board.png') : info.outputPath('board.png');
  fs.mkdirSync(path.dirname(out), { recursive: true });
  await page.screenshot({ path: out });
  await info.attach('board', { path: out, contentType: 'image/png' });
});

test('handles edit the part’s own parameters; material, duplicate, stacking, zoom and palette drag', async ({ page }, info) => {
  await openTemplate(page);
  const edge = await centreOf(page, 'edge');
  await page.mouse.click(edge.x, edge.y);
  await expect.poll(() => dew(page, (d) => d.selection().parts)).toEqual(['edge']);
  const k = await dew(page, (d) => d.view().k);
  type H = { type: string; handle?: { id: string }; at: [number, number] };
  const handleAt = async (id: string) => {
    const hs = await page.evaluate(() => (window as unknown as { __dewline: { controller: { handles(): H[] } } }).__dewline.controller.handles());
    const h = hs.find((x) => x.type === 'param' && x.handle!.id === id)!;
    return client(page, ...h.at);
  };

  // Drag the break's thickness handle 12 px outwards (Alt: no snapping): the thickness grows by 12 px, the board is not scaled.
  const t0 = part(await snapshot(page), 'edge')!.thickness!;
  const len0 = (part(await snapshot(page), 'edge') as unknown as { length: number }).length;
  await page.keyboard.down('Alt');
  await drag(page, await handleAt('thickness-right'), 12, 0, 6);
  await page.keyboard.up('Alt');
  const t1 = part(await snapshot(page), 'edge')!.thickness!;
  expect(t1 - t0).toBeCloseTo(12 / k, 6);
  expect((part(await snapshot(page), 'edge') as unknown as { length: number }).length).toBe(len0);
  await shot(page, info, 'handle-dragged');
  // Past zero the handle is refused: the thickness stays at its last valid value, above zero.
  await page.keyboard.down('Alt');
  await drag(page, await handleAt('thickness-right'), -40, 0, 8);
  await page.keyboard.up('Alt');
  const t2 = part(await snapshot(page), 'edge')!.thickness!;
  expect(t2).toBeGreaterThan(0);
  expect((await page.evaluate(() => (window as unknown as { __dewline: { snapshot(): { problems?: unknown } } }).__dewline.snapshot())).problems).toBeUndefined();

  // Material from the searchable list.
  await page.getByTestId('material-button').click();
  await page.getByTestId('material-search').fill('mineral wool');
  const first = page.getByTestId('material-picker').locator('[data-testid^="material-"]:not([data-testid="material-search"]):not([data-testid="material-picker"])').first();
  const mid = (await first.getAttribute('data-testid'))!.slice('material-'.length);
  await first.click();
  await expect.poll(async () => (part(await snapshot(page), 'edge') as unknown as { material: string }).material).toBe(mid);

  // Duplicate (Ctrl+D) selects the copy; raise it down the stack with [ and up with ].
  const n0 = (await snapshot(page)).parts.length;
  await page.keyboard.press('Control+d');
  const s1 = await snapshot(page);
  expect(s1.parts.length).toBe(n0 + 1);
  const copy = (await dew(page, (d) => d.selection().parts))[0];
  expect(copy).not.toBe('edge');
  expect(s1.parts.at(-1)!.id).toBe(copy); // a copy goes on top of the stack
  await page.keyboard.press('[');
  const s2 = await snapshot(page);
  expect(s2.parts.findIndex((p) => p.id === copy)).toBe(s1.parts.length - 2);
  await page.keyboard.press('Shift+[');
  expect((await snapshot(page)).parts[0].id).toBe(copy);
  await page.keyboard.press('Delete');
  expect((await snapshot(page)).parts.length).toBe(n0);
  await page.keyboard.press('Control+z');
  await page.keyboard.press('Control+z');
  await page.keyboard.press('Control+Shift+z');
  expect((await snapshot(page)).parts.length).toBe(n0 + 1);

  // Wheel zoom keeps the point under the pointer in place.
  const cb = (await page.getByTestId('board-canvas').boundingBox())!;
  const px = cb.x + 300, py = cb.y + 250;
  const v0 = await dew(page, (d) => d.view());
  await page.mouse.move(px, py);
  await page.mouse.wheel(0, -240);
  await expect.poll(() => dew(page, (d) => d.view().k)).toBeGreaterThan(v0.k * 1.2);
  const v1 = await dew(page, (d) => d.view());
  const sx = px - cb.x, sy = py - cb.y;
  expect((sx - v1.ox) / v1.k).toBeCloseTo((sx - v0.ox) / v0.k, 6);
  expect((sy - v1.oy) / v1.k).toBeCloseTo((sy - v0.oy) / v0.k, 6);

  // A part dragged from the palette onto the board is placed where it is dropped.
  const before = (await snapshot(page)).parts.length;
  await page.getByTestId('palette-membrane').dragTo(page.getByTestId('board-canvas'), { targetPosition: { x: 200, y: 120 } });
  await expect.poll(async () => (await snapshot(page)).parts.length).toBe(before + 1);
  expect((await snapshot(page)).parts.at(-1)!.kind).toBe('membrane');
  await shot(page, info, 'palette-dropped');
});

test('a free polygon: a self-crossing close is refused; vertices move, are added from an edge and removed', async ({ page }, info) => {
  await openTemplate(page);
  await page.keyboard.press('p');
  await page.keyboard.down('Alt');
  // A bow tie: Enter is refused with the reason, and nothing is added.
  for (const [x, y] of [[1.0, 0.6], [1.4, 1.0], [1.4, 0.6], [1.0, 1.0]] as [number, number][]) {
    const p = await client(page, x, y);
    await page.mouse.click(p.x, p.y);
  }
  const n0 = (await snapshot(page)).parts.length;
  await page.keyboard.press('Enter');
  await expect(page.getByTestId('status')).toContainText('The polygon cannot close');
  await expect(page.getByTestId('status')).toContainText('cross');
  expect((await snapshot(page)).parts.length).toBe(n0);
  // Backspace takes back all but the first vertex; three others make a simple quadrilateral; Enter closes it.
  for (let i = 0; i < 3; i++) await page.keyboard.press('Backspace');
  for (const [x, y] of [[1.4, 0.6], [1.4, 1.0], [1.0, 1.0]] as [number, number][]) {
    const p = await client(page, x, y);
    await page.mouse.click(p.x, p.y);
  }
  await page.keyboard.press('Enter');
  await page.keyboard.up('Alt');
  const poly = (await snapshot(page)).parts.find((p) => p.kind === 'polygon')!;
  expect(poly.points!.length).toBe(5);
  const k = await dew(page, (d) => d.view().k);
  type H = { type: string; index?: number; after?: number; at: [number, number] };
  const handles = () => page.evaluate(() => (window as unknown as { __dewline: { controller: { handles(): H[] } } }).__dewline.controller.handles());
  const ring = async () => ((await snapshot(page)).parts.find((p) => p.id === poly.id)!.points!).slice(0, -1);

  // Move vertex 2 (the corner at 1.4, 1.0) up by 20 px.
  const v2 = (await handles()).find((h) => h.type === 'vertex' && h.index === 2)!;
  const before = await ring();
  await page.keyboard.down('Alt');
  await drag(page, await client(page, ...v2.at), 0, -20, 5);
  const moved = await ring();
  expect(moved[2][1] - before[2][1]).toBeCloseTo(20 / k, 6);
  expect(moved[2][0]).toBeCloseTo(before[2][0], 9);
  // Drag the midpoint of edge 0 down by 15 px: a new vertex 1.
  const m0 = (await handles()).find((h) => h.type === 'midpoint' && h.after === 0)!;
  await drag(page, await client(page, ...m0.at), 0, 15, 5);
  await page.keyboard.up('Alt');
  const added = await ring();
  expect(added.length).toBe(5);
  expect(added[1][1]).toBeLessThan(before[0][1]);
  await shot(page, info, 'polygon-vertex-added');
  // Double-click that vertex: it is removed again.
  const nv = (await handles()).find((h) => h.type === 'vertex' && h.index === 1)!;
  const p = await client(page, ...nv.at);
  await page.mouse.dblclick(p.x, p.y);
  await expect.poll(async () => (await ring()).length).toBe(4);
});

test.describe('tablet pinch', () => {
  test.use({ hasTouch: true, viewport: { width: 1024, height: 768 } });
  test('two fingers pinch to zoom about their midpoint', async ({ page }) => {
    await openTemplate(page);
    const cb = (await page.getByTestId('board-canvas').boundingBox())!;
    const cx = cb.x + cb.width / 2, cy = cb.y + cb.height / 2;
    const v0 = await dew(page, (d) => d.view());
    const cdp = await page.context().newCDPSession(page);
    const at = (d: number) => [{ x: cx - d, y: cy, id: 1 }, { x: cx + d, y: cy, id: 2 }];
    await cdp.send('Input.dispatchTouchEvent', { type: 'touchStart', touchPoints: at(40) });
    for (let d = 45; d <= 80; d += 5) {
      await cdp.send('Input.dispatchTouchEvent', { type: 'touchMove', touchPoints: at(d) });
      await page.waitForTimeout(30);
    }
    await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] });
    const v1 = await dew(page, (d) => d.view());
    expect(v1.k / v0.k).toBeCloseTo(2, 1); // the fingers spread from 80 px to 160 px apart
    const sx = cx - cb.x, sy = cy - cb.y;
    expect(Math.abs((sx - v1.ox) / v1.k - (sx - v0.ox) / v0.k)).toBeLessThan(2 / v1.k);
    expect(Math.abs((sy - v1.oy) / v1.k - (sy - v0.oy) / v0.k)).toBeLessThan(2 / v1.k);
  });
});

test('inch-pound on screen: the scale bar and fields switch, and typed inches land in SI', async ({ page }, info) => {
  await openTemplate(page);
  await expect(page.getByTestId('scale-bar')).toContainText('mm');
  await page.getByTestId('units').click();
  await expect(page.getByTestId('units')).toHaveText('in');
  await expect(page.getByTestId('scale-bar')).not.toContainText('mm');
  const e = await centreOf(page, 'edge');
  await page.mouse.click(e.x, e.y);
  const field = page.getByTestId('field-thickness');
  await expect(field).toHaveValue(formatLength(0.025, 'ip'));
  await field.fill('1-1/2"');
  await field.press('Enter');
  await expect.poll(async () => part(await snapshot(page), 'edge')!.thickness).toBeCloseTo(1.5 * 0.0254, 12); // 1 in = 25.4 mm exactly
  await field.fill('2'); // a bare number is in inches now
  await field.press('Enter');
  await expect.poll(async () => part(await snapshot(page), 'edge')!.thickness).toBeCloseTo(2 * 0.0254, 12);
  await shot(page, info, 'inch-pound');
});
