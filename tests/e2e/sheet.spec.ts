/**
 * The builder's sheet in Debian's chromium: its numbers equal solveSectionSync (the code path of
 * `dewline solve`) on the same document; SVG, PNG and PDF downloads; the server-made PDF rendered with
 * pdftoppm and read with pdftotext (poppler-utils); a shared room loaded once over /sync/<key>.
 */
import { expect, test, type Page } from '@playwright/test';
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import WebSocket from 'ws';
import * as Y from 'yjs';
import { WebsocketProvider } from 'y-websocket';
import { glaserForSection } from '../../lib/moisture/cut';
import { EXAMPLE_MONTHS } from '../../lib/moisture/glaser';
import { writeSnapshot } from '../../lib/section/doc';
import type { SectionSnapshot } from '../../lib/section/schema';
import { templateByName } from '../../lib/section/templates';
import { solveSectionSync } from '../../lib/thermal/section';
import type { SectionResults } from '../../lib/thermal/types';

test.setTimeout(300_000);
const out = 'test-results/sheet';
fs.mkdirSync(out, { recursive: true });

type W = { __dewlineSheet: { snapshot: SectionSnapshot; results: SectionResults } };

async function openSheet(page: Page, query: string) {
  await page.goto(`/sheet?${query}`);
  await page.waitForSelector('[data-ready="yes"]', { timeout: 240_000, state: 'attached' });
}

const num = async (page: Page, testId: string, attr = 'data-value') => Number(await page.getByTestId(testId).getAttribute(attr));

async function compareWithSolver(page: Page, snapshot: SectionSnapshot) {
  const ref = solveSectionSync(snapshot, { mesh: 'default' });
  for (const z of ref.zones) expect(await num(page, `sheet-phi-${z.id}`)).toBeCloseTo(z.phi, 9);
  expect(await num(page, 'sheet-balance')).toBeCloseTo(ref.energyBalance, 12);
  if (ref.l2d !== null) expect(await num(page, 'sheet-l2d')).toBeCloseTo(ref.l2d, 9);
  if (ref.psi) expect(await num(page, 'sheet-psi')).toBeCloseTo(ref.psi.psi, 9);
  if (ref.psiGround) {
    expect(await num(page, 'sheet-psig')).toBeCloseTo(ref.psiGround.psiG, 9);
    await expect(page.getByTestId('sheet-psig')).toHaveText(`${ref.psiGround.psiG.toFixed(3)} W/(m·K)`);
  }
  expect(await num(page, 'sheet-coldest')).toBeCloseTo(ref.coldest!.t, 9);
  await expect(page.getByTestId('sheet-coldest')).toContainText(`${ref.coldest!.t.toFixed(1)} °C`);
  expect(await num(page, 'sheet-dewpoint')).toBeCloseTo(ref.conditions!.design.dewPoint!, 12);
  await expect(page.getByTestId('sheet-verdict')).toContainText(ref.verdict);
  // One row per verdict surface, each with the solver's state and coldest temperature.
  const rows = page.locator('[data-testid="sheet-surfaces"] tbody tr');
  await expect(rows).toHaveCount(ref.surfaces.length);
  for (const s of ref.surfaces) {
    const row = page.locator(`[data-testid="sheet-surfaces"] tr[data-segment="${s.id}"]`);
    await expect(row).toHaveAttribute('data-state', s.state);
    expect(Number(await row.getAttribute('data-tmin'))).toBeCloseTo(s.tMin, 9);
  }
  // Glaser along the same cuts, from the same field.
  const g = glaserForSection(snapshot, ref, { months: EXAMPLE_MONTHS });
  for (const o of g) {
    const el = page.locator(`.sheet-glaser[data-cut="${o.cut.id}"]`);
    await expect(el).toHaveCount(1);
    if (o.check) expect(Number(await el.getAttribute('data-rate'))).toBeCloseTo(o.check.rate, 9);
    else await expect(el.getByTestId('glaser-problem')).toContainText(o.problem!.slice(0, 40));
  }
  return ref;
}

test('the sheet equals the solver on the slab-edge template and carries the cautions', async ({ page }) => {
  await openSheet(page, 'template=slab-edge-break');
  const snap = await page.evaluate(() => (window as unknown as W).__dewlineSheet.snapshot);
  // The page solved exactly the template's document.
  expect(snap).toEqual(templateByName('slab-edge-break')!.build());
  await compareWithSolver(page, snap);
  await expect(page.getByTestId('sheet-name')).toHaveText('Slab on ground, slab-edge break');
  await expect(page.getByTestId('sheet-date')).toHaveText(new Date().toISOString().slice(0, 10));
  expect(Number(await page.getByTestId('sheet-revision').getAttribute('data-revision'))).toBeGreaterThan(0);
  // Drawing with the field, isotherms and one mark per verdict surface.
  const drawing = page.getByTestId('sheet-drawing');
  await expect(drawing.locator('[data-layer="field"]')).toHaveCount(1);
  expect(await drawing.locator('[data-isotherm]').count()).toBeGreaterThan(3);
  // Cautions next to the verdict, beside the Glaser check and in their own section.
  await expect(page.locator('[data-testid="sheet-results"] .caution')).toContainText('licensed professionals govern');
  await expect(page.locator('[data-testid="sheet-glaser"] .caution')).toContainText('Screening aid');
  for (const t of ['Frost protection', 'Radon', 'thermal barrier', 'waterproofing', 'Structure']) await expect(page.getByTestId('sheet-cautions')).toContainText(t);
  // Glaser: the template's saved cut runs from the room through the floor into the ground and is checked itself.
  await expect(page.locator('.sheet-glaser[data-cut="edge-cut"] svg[data-chart="glaser"]')).toHaveCount(1);
  await expect(page.locator('.sheet-glaser[data-cut="edge-cut"] [data-testid="glaser-problem"]')).toHaveCount(0);
  await page.screenshot({ path: `${out}/slab-sheet.png`, fullPage: true });
  // Print media hides the tool bar, and the drawing is not shrunk on an A4-wide page (so 1:N holds on paper).
  await page.emulateMedia({ media: 'print' });
  await expect(page.getByTestId('sheet-tools')).toBeHidden();
  await page.setViewportSize({ width: Math.round((186 / 25.4) * 96), height: 1000 });
  const sizes = await drawing.locator('svg').first().evaluate((el) => ({ attr: Number(el.getAttribute('width')), shown: el.getBoundingClientRect().width }));
  expect(Math.abs(sizes.shown - sizes.attr)).toBeLessThan(0.5);
  await page.emulateMedia({ media: 'screen' });
});

test('SVG, PNG and PDF downloads from the sheet', async ({ page }) => {
  await openSheet(page, 'template=crawlspace-unvented');
  const save = async (testId: string) => {
    const [d] = await Promise.all([page.waitForEvent('download', { timeout: 200_000 }), page.getByTestId(testId).click()]);
    const p = path.join(out, d.suggestedFilename());
    await d.saveAs(p);
    return { name: d.suggestedFilename(), bytes: fs.readFileSync(p) };
  };
  const svg = await save('download-svg');
  expect(svg.name).toMatch(/\.svg$/);
  const text = svg.bytes.toString('utf8');
  expect(text.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
  expect(text).toContain('data-layer="field"');
  const plain = (await save('download-svg-plain')).bytes.toString('utf8');
  expect(plain).not.toContain('data-layer="field"');
  const png = await save('download-png');
  // PNG signature and IHDR size (PNG specification, ISO/IEC 15948) equal the SVG's size.
  expect(png.bytes.subarray(0, 8).toString('hex')).toBe('89504e470d0a1a0a');
  const [, w, h] = /width="(\d+)" height="(\d+)"/.exec(text)!;
  expect(png.bytes.readUInt32BE(16)).toBe(Number(w));
  expect(png.bytes.readUInt32BE(20)).toBe(Number(h));
  // At a chosen scale: 1:5 is twice the size of 1:10 (drawing area; the 24 px padding stays).
  await page.getByTestId('picture-scale').selectOption('10');
  const s10 = (await save('download-svg-plain')).bytes.toString('utf8');
  await page.getByTestId('picture-scale').selectOption('5');
  const s5 = (await save('download-svg-plain')).bytes.toString('utf8');
  const wOf = (x: string) => Number(/width="(\d+)"/.exec(x)![1]);
  expect(Math.abs((wOf(s5) - 48) - 2 * (wOf(s10) - 48))).toBeLessThanOrEqual(2);
  expect(s5).toContain('scale 1:5');
  const pdf = await save('download-pdf');
  expect(pdf.bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
});

function pdfFacts(file: string) {
  const info = execFileSync('pdfinfo', [file], { encoding: 'utf8' });
  const pages = Number(/Pages:\s+(\d+)/.exec(info)![1]);
  const [, pw, ph] = /Page size:\s+([\d.]+) x ([\d.]+) pts/.exec(info)!;
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'dewline-pdf-'));
  execFileSync('pdftoppm', ['-r', '40', '-png', file, path.join(dir, 'page')]);
  const rendered = fs.readdirSync(dir).filter((f) => f.endsWith('.png'));
  // Page 1 as a grey map (binary PGM: header, then one byte per pixel) to see that it is not blank.
  execFileSync('pdftoppm', ['-r', '40', '-gray', '-f', '1', '-l', '1', '-singlefile', file, path.join(dir, 'first')]);
  const pgm = fs.readFileSync(path.join(dir, 'first.pgm'));
  const header = /^P5\s+(\d+)\s+(\d+)\s+255\s/.exec(pgm.subarray(0, 40).toString('latin1'))!;
  const px = pgm.subarray(header[0].length);
  let dark = 0;
  for (const v of px) if (v < 250) dark++;
  const inked = dark / px.length;
  const text = execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' });
  return { pages, width: Number(pw), height: Number(ph), rendered: rendered.map((f) => path.join(dir, f)), text, inked };
}

test('the server makes the PDF with chromium: pages render, text reads, A4 and Letter', async ({ request }) => {
  const res = await request.get('/api/sheet.pdf?template=basement-outside', { timeout: 240_000 });
  expect(res.status(), await res.text().catch(() => '')).toBe(200);
  expect(res.headers()['content-type']).toBe('application/pdf');
  const file = path.join(out, 'basement-outside.pdf');
  fs.writeFileSync(file, await res.body());
  const a4 = pdfFacts(file);
  // A4 is 210 x 297 mm = 595.28 x 841.89 pt (ISO 216; 1 pt = 1/72 in); chromium rounds its paper sizes to
  // whole device pixels (measured here: 595.92 pt wide), so allow 1.5 pt (0.5 mm).
  expect(Math.abs(a4.width - 595.28)).toBeLessThan(1.5);
  expect(Math.abs(a4.height - 841.89)).toBeLessThan(1.5);
  expect(a4.pages).toBeGreaterThanOrEqual(3);
  expect(a4.pages).toBeLessThanOrEqual(10);
  expect(a4.rendered.length).toBe(a4.pages);
  for (const p of a4.rendered) expect(fs.statSync(p).size).toBeGreaterThan(2000);
  // The first page carries the drawing and its colour field: a blank page would have no pixel below 250 of 255
  // (measured here: 19.3 % of pixels on page 1 of basement-outside).
  expect(a4.inked).toBeGreaterThan(0.05);
  const tpl = templateByName('basement-outside')!.build();
  const ref = solveSectionSync(tpl, { mesh: 'default' });
  const flat = a4.text.replace(/\s+/g, ' ');
  expect(flat).toContain(tpl.name);
  expect(flat).toContain('psi_g');
  expect(flat).toContain(`${ref.psiGround!.psiG.toFixed(3)} W/(m·K)`);
  expect(flat).toContain('Screening aid');
  expect(flat).toContain('licensed professionals govern');
  expect(flat).toContain('Glaser check (ISO 13788)');

  const letter = await request.get('/api/sheet.pdf?template=basement-outside&paper=letter', { timeout: 240_000 });
  expect(letter.status()).toBe(200);
  const lf = path.join(out, 'basement-outside-letter.pdf');
  fs.writeFileSync(lf, await letter.body());
  const lt = pdfFacts(lf);
  // US Letter is 8.5 x 11 in = 612 x 792 pt (same allowance as A4).
  expect(Math.abs(lt.width - 612)).toBeLessThan(1.5);
  expect(Math.abs(lt.height - 792)).toBeLessThan(1.5);
  console.log(`PDF page sizes: A4 ${a4.width} x ${a4.height} pt, ${a4.pages} pages, page 1 ${(a4.inked * 100).toFixed(1)} % of pixels not white; Letter ${lt.width} x ${lt.height} pt, ${lt.pages} pages`);
  expect(lt.rendered.length).toBe(lt.pages);

  // Bad input is refused where it enters.
  expect((await request.get('/api/sheet.pdf?template=nope')).status()).toBe(404);
  expect((await request.get('/api/sheet.pdf?template=basement-outside&paper=a3')).status()).toBe(400);
  const broken = await request.post('/api/sheet.pdf', { data: '{"format":"dewline-section","version":1,"parts":[{"kind":"slab"}],"zones":[]}', headers: { 'content-type': 'application/json' } });
  expect(broken.status()).toBe(400);
  expect(await broken.text()).toMatch(/parts\[0\]/);
});

test('a file opened in the browser: sheet and posted PDF', async ({ page, request }) => {
  const s = templateByName('slab-edge-break')!.build();
  s.name = 'Garden studio, thinner break';
  (s.parts.find((p) => p.id === 'edge') as Record<string, unknown>).thickness = 0.01;
  await page.addInitScript((text) => sessionStorage.setItem('dewline:open', text), JSON.stringify(s));
  await openSheet(page, 'open=1');
  const snap = await page.evaluate(() => (window as unknown as W).__dewlineSheet.snapshot);
  await compareWithSolver(page, snap);
  await expect(page.getByTestId('sheet-name')).toHaveText('Garden studio, thinner break');
  const res = await request.post('/api/sheet.pdf', { data: JSON.stringify(s), headers: { 'content-type': 'application/json' }, timeout: 240_000 });
  expect(res.status()).toBe(200);
  const f = path.join(out, 'posted.pdf');
  fs.writeFileSync(f, await res.body());
  expect(pdfFacts(f).text).toContain('Garden studio, thinner break');
});

test('a shared room: the sheet loads the room document once over /sync/<key>', async ({ page, baseURL, request }) => {
  const rooms = await request.post('/api/rooms');
  expect(rooms.status()).toBe(201);
  const { editKey, viewKey } = await rooms.json();
  const doc = new Y.Doc();
  const provider = new WebsocketProvider(`${baseURL!.replace(/^http/, 'ws')}/sync`, editKey, doc, { WebSocketPolyfill: WebSocket as never, disableBc: true });
  (provider.messageHandlers as unknown as Record<number, unknown>)[100] = () => {};
  await new Promise<void>((resolve) => provider.on('sync', (ok: boolean) => ok && resolve()));
  const s = templateByName('basement-inside-framed')!.build();
  s.name = 'Heron Lane basement, room copy';
  writeSnapshot(doc, s);
  // Wait until the server has the update: a second client sees the name.
  const doc2 = new Y.Doc();
  const p2 = new WebsocketProvider(`${baseURL!.replace(/^http/, 'ws')}/sync`, viewKey, doc2, { WebSocketPolyfill: WebSocket as never, disableBc: true });
  (p2.messageHandlers as unknown as Record<number, unknown>)[100] = () => {};
  await expect.poll(() => doc2.getMap('section').get('name'), { timeout: 30_000 }).toBe('Heron Lane basement, room copy');
  p2.destroy();
  provider.destroy();

  await openSheet(page, `key=${viewKey}`);
  await expect(page.getByTestId('sheet-room')).toHaveText('Heron Lane basement, room copy');
  const snap = await page.evaluate(() => (window as unknown as W).__dewlineSheet.snapshot);
  expect(snap.name).toBe('Heron Lane basement, room copy');
  await compareWithSolver(page, snap);

  await page.goto('/sheet?key=AAAAAAAAAAAAAAAAAAAAAA');
  await expect(page.getByTestId('sheet-error')).toHaveText('The room could not be loaded', { timeout: 60_000 });
});

test('the section page links to the sheet of the document as edited', async ({ page, context }) => {
  await page.goto('/section?template=slab-edge-break');
  await page.waitForFunction(() => !!(window as unknown as { __dewline?: { controller?: unknown } }).__dewline?.controller, null, { timeout: 240_000 });
  // Edit through the board's named operation, then open the sheet from the page's link.
  const err = await page.evaluate(() => (window as unknown as { __dewline: { controller: { updatePart(id: string, p: Record<string, unknown>): string | null } } }).__dewline.controller.updatePart('edge', { thickness: 0.04 }));
  expect(err).toBeNull();
  const edited = await page.evaluate(() => (window as unknown as { __dewline: { snapshot(): unknown } }).__dewline.snapshot()) as SectionSnapshot;
  expect((edited.parts.find((p) => p.id === 'edge') as Record<string, unknown>).thickness).toBe(0.04);
  const [sheet] = await Promise.all([context.waitForEvent('page'), page.getByTestId('sheet-link').click()]);
  await sheet.waitForSelector('[data-ready="yes"]', { timeout: 240_000, state: 'attached' });
  const snap = await sheet.evaluate(() => (window as unknown as W).__dewlineSheet.snapshot);
  expect(snap).toEqual(edited);
  await compareWithSolver(sheet, snap);
});
