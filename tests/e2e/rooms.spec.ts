/**
 * Shared rooms in a real browser: two (or three) browser contexts on one room against the real server
 * (server/main.ts, started by playwright.config.ts). Each context is a separate person: its own
 * storage, its own websocket.
 */
import { expect, test, type Browser, type BrowserContext, type Page } from '@playwright/test';
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { templateByName } from '../../lib/section/templates';

test.setTimeout(300_000);

/* eslint-disable @typescript-eslint/no-explicit-any */
type Snap = { name: string; parts: { id: string; thickness?: number }[] };

const contexts: BrowserContext[] = [];
async function person(browser: Browser): Promise<Page> {
  const ctx = await browser.newContext();
  contexts.push(ctx);
  return ctx.newPage();
}
test.afterEach(async () => {
  for (const c of contexts.splice(0)) await c.close();
});

/** Waits for the room's board and a live connection ('live' for edit links, 'read-only' for view links). */
async function ready(page: Page, status: 'live' | 'read-only' = 'live') {
  await page.waitForFunction(() => Boolean((window as any).__dewline?.controller), null, { timeout: 120_000 });
  await expect(page.getByTestId('connection')).toHaveAttribute('data-status', status, { timeout: 30_000 });
}

const snap = (page: Page): Promise<Snap> => page.evaluate(() => (window as any).__dewline.snapshot());
const thickness = async (page: Page, id: string) => (await snap(page)).parts.find((p) => p.id === id)?.thickness;

/** From the home page, with "Shared room" ticked: a new room from a template; returns the edit and view URLs. */
async function newRoom(page: Page, template = 'slab-edge-break') {
  await page.goto('/');
  await page.getByTestId('start-shared').check();
  await page.getByTestId(`template-${template}`).click();
  await page.waitForURL(/\/s\/[A-Za-z0-9_-]{22}$/);
  await ready(page);
  const editUrl = page.url();
  const viewUrl = await page.getByTestId('view-link').inputValue();
  expect(viewUrl).toMatch(/\/s\/[A-Za-z0-9_-]{22}$/);
  expect(viewUrl).not.toBe(editUrl);
  return { editUrl, viewUrl };
}

async function setName(page: Page, name: string) {
  await page.getByTestId('my-name').fill(name);
  await page.getByTestId('my-name').press('Enter');
}

test('two people on one edit link: edits, presence, pointer, selection and per-person undo', async ({ browser }) => {
  const a = await person(browser);
  const { editUrl } = await newRoom(a);
  const tpl = templateByName('slab-edge-break')!.build();
  expect((await snap(a)).parts.map((p) => p.id).sort()).toEqual(tpl.parts.map((p) => p.id).sort());

  const b = await person(browser);
  await b.goto(editUrl);
  await ready(b);
  // the starting section was written once: the second person sees the same parts, not a second copy
  expect((await snap(b)).parts.map((p) => p.id).sort()).toEqual(tpl.parts.map((p) => p.id).sort());

  await setName(a, 'Site consultant');
  await setName(b, 'Framing lead');
  await expect(a.getByTestId('person').filter({ hasText: 'Framing lead' })).toBeVisible();
  await expect(b.getByTestId('person').filter({ hasText: 'Site consultant' })).toBeVisible();
  // the name is remembered by the browser
  expect(await a.evaluate(() => localStorage.getItem('dewline:name'))).toBe('Site consultant');

  // an edit in one appears in the other (5 s), and the other's overlay refreshes
  const v0 = await b.evaluate(() => (window as any).__dewline.live?.version ?? 0);
  const t0 = Date.now();
  expect(await a.evaluate(() => (window as any).__dewline.controller.updatePart('edge', { thickness: 0.005 }))).toBeNull();
  await expect.poll(() => thickness(b, 'edge'), { timeout: 5_000, intervals: [20] }).toBe(0.005);
  console.log(`edit reached the second browser in ${Date.now() - t0} ms (includes polling)`);
  await b.waitForFunction((v) => ((window as any).__dewline.live?.version ?? 0) > v, v0, { timeout: 120_000 });

  // the other person's pointer shows, with their name
  const box = await a.getByTestId('board-canvas').boundingBox();
  await a.mouse.move(box!.x + box!.width / 2, box!.y + box!.height / 2);
  await a.mouse.move(box!.x + box!.width / 2 + 20, box!.y + box!.height / 2 + 10);
  await expect(b.locator('[data-testid="peer-pointer"][data-name="Site consultant"]')).toBeVisible({ timeout: 5_000 });
  // and their selection, outlined
  await a.evaluate(() => (window as any).__dewline.select(['slab']));
  await expect(b.getByTestId('peer-selection-slab')).toBeVisible({ timeout: 5_000 });
  await b.screenshot({ path: 'test-results/rooms/other-persons-pointer.png' });

  // per-person undo: B's own edit survives A's undo
  expect(await b.evaluate(() => (window as any).__dewline.controller.updatePart('stem', { thickness: 0.25 }))).toBeNull();
  await expect.poll(() => thickness(a, 'stem'), { timeout: 5_000 }).toBe(0.25);
  await a.evaluate(() => (window as any).__dewline.undo());
  expect(await thickness(a, 'edge')).toBe(0.025);
  expect(await thickness(a, 'stem')).toBe(0.25);
  await expect.poll(() => thickness(b, 'edge'), { timeout: 5_000 }).toBe(0.025);
  expect(await thickness(b, 'stem')).toBe(0.25);

  // renaming the room (the section's name) reaches the other person
  const title = a.getByLabel('Section name');
  await title.fill('Larch Lane slab, rev B');
  await title.press('Enter');
  await expect.poll(async () => (await snap(b)).name, { timeout: 5_000 }).toBe('Larch Lane slab, rev B');
  await expect(b).toHaveTitle(/Larch Lane slab, rev B/);
  // both pages link to the print sheet of their own key
  expect(await a.getByTestId('sheet-link').getAttribute('href')).toBe(`/sheet?key=${editUrl.split('/s/')[1]}`);
  await a.screenshot({ path: 'test-results/rooms/two-people.png' });
});

test('the view link follows edits live, shows no editing controls, and the server refuses its writes', async ({ browser }) => {
  const a = await person(browser);
  const { viewUrl } = await newRoom(a);
  const v = await person(browser);
  await v.goto(viewUrl);
  await ready(v, 'read-only');
  await expect(v.getByTestId('room')).toHaveAttribute('data-role', 'view');
  await expect(v.getByTestId('links')).toHaveCount(0);
  await expect(v.getByTestId('history')).toHaveCount(0);
  await expect(v.getByTestId('undo')).toBeDisabled();
  await expect(v.getByTestId('open')).toHaveCount(0); // a view link cannot replace the document
  await expect(v.getByTestId('save')).toBeVisible(); // but can still save a copy to a file
  await expect(v.getByTestId('status')).toContainText('View only.');
  expect(await v.getByTestId('sheet-link').getAttribute('href')).toBe(`/sheet?key=${viewUrl.split('/s/')[1]}`);

  expect(await a.evaluate(() => (window as any).__dewline.controller.updatePart('edge', { thickness: 0.04 }))).toBeNull();
  await expect.poll(() => thickness(v, 'edge'), { timeout: 5_000 }).toBe(0.04);

  // the builder on the view link is still seen: name and pointer reach the editor
  await setName(v, 'Builder on site');
  await expect(a.getByTestId('person').filter({ hasText: 'Builder on site' })).toBeVisible({ timeout: 5_000 });
  const vb = await v.getByTestId('board-canvas').boundingBox();
  await v.mouse.move(vb!.x + vb!.width / 3, vb!.y + vb!.height / 3);
  await v.mouse.move(vb!.x + vb!.width / 3 + 15, vb!.y + vb!.height / 3 + 5);
  await expect(a.locator('[data-testid="peer-pointer"][data-name="Builder on site"]')).toBeVisible({ timeout: 5_000 });

  // the board refuses the viewer's edit ...
  const refusal = await v.evaluate(() => (window as any).__dewline.controller.updatePart('edge', { thickness: 0.09 }));
  expect(refusal).toContain('view-only');
  // ... and a write straight into the viewer's document never leaves the viewer
  await v.evaluate(() => (window as any).__dewline.doc.getMap('section').set('name', 'Changed from the view link'));
  expect(await a.evaluate(() => (window as any).__dewline.controller.updatePart('edge', { thickness: 0.05 }))).toBeNull();
  await expect.poll(() => thickness(v, 'edge'), { timeout: 5_000 }).toBe(0.05);
  // the editor has received a later edit through the same server, and never the viewer's
  expect((await snap(a)).name).toBe('Slab on ground, slab-edge break');
  await v.reload();
  await ready(v, 'read-only');
  expect((await snap(v)).name).toBe('Slab on ground, slab-edge break');
  expect(await thickness(v, 'edge')).toBe(0.05);
});

test('replacing a link revokes the old one, and the page says so', async ({ browser }) => {
  const a = await person(browser);
  const { editUrl, viewUrl } = await newRoom(a);
  const v = await person(browser);
  await v.goto(viewUrl);
  await ready(v, 'read-only');
  const b = await person(browser);
  await b.goto(editUrl);
  await ready(b);

  await v.screenshot({ path: 'test-results/rooms/view-link.png' });
  await a.getByTestId('rotate-view').click();
  await a.getByTestId('rotate-view-confirm').click();
  await expect(v.getByTestId('revoked')).toContainText('Link revoked', { timeout: 10_000 });
  await expect(v.getByTestId('connection')).toHaveAttribute('data-status', 'revoked');
  await expect.poll(() => a.getByTestId('view-link').inputValue()).not.toBe(viewUrl);
  const newView = await a.getByTestId('view-link').inputValue();
  // the old view link no longer opens the section; the new one does
  const old = await person(browser);
  await old.goto(viewUrl);
  await expect(old.getByTestId('room-unknown')).toBeVisible({ timeout: 30_000 });
  await old.goto(newView);
  await ready(old, 'read-only');

  await a.getByTestId('rotate-edit').click();
  await a.getByTestId('rotate-edit-confirm').click();
  await a.waitForURL((u) => u.pathname.startsWith('/s/') && !editUrl.endsWith(u.pathname), { timeout: 30_000 });
  await ready(a);
  await expect(b.getByTestId('revoked')).toBeVisible({ timeout: 10_000 });
  // the revoked editor's board takes no more edits
  expect(await b.evaluate(() => (window as any).__dewline.controller.updatePart('edge', { thickness: 0.07 }))).toContain('view-only');
  // the editor on the new link still edits, and the view link survived the edit-key change
  expect(await a.evaluate(() => (window as any).__dewline.controller.updatePart('edge', { thickness: 0.03 }))).toBeNull();
  await expect.poll(() => thickness(old, 'edge'), { timeout: 5_000 }).toBe(0.03);
});

test('a named version restores a part someone else deleted, as a new change', async ({ browser }) => {
  const a = await person(browser);
  const { editUrl } = await newRoom(a);
  const b = await person(browser);
  await b.goto(editUrl);
  await ready(b);

  await a.getByTestId('history').click();
  await a.getByTestId('version-name').fill('Before the site meeting');
  await a.getByTestId('version-save').click();
  await expect(a.locator('[data-testid="version"][data-name="Before the site meeting"]')).toBeVisible();

  // B deletes the slab-edge break
  await b.evaluate(() => {
    const d = (window as any).__dewline;
    d.select(['edge']);
    return d.controller.deleteSelection();
  });
  await expect.poll(async () => (await snap(a)).parts.some((p) => p.id === 'edge'), { timeout: 5_000 }).toBe(false);

  // the version can be saved as a section file holding the deleted part
  const downloading = a.waitForEvent('download');
  await a.locator('[data-testid="version"][data-name="Before the site meeting"] button', { hasText: 'File' }).click();
  const file = await (await downloading).path();
  const saved = JSON.parse(fs.readFileSync(file, 'utf8')) as Snap;
  expect(saved.parts.some((p) => p.id === 'edge')).toBe(true);

  await a.locator('[data-testid="version"][data-name="Before the site meeting"] button', { hasText: 'Restore' }).click();
  await expect.poll(async () => (await snap(a)).parts.some((p) => p.id === 'edge'), { timeout: 10_000 }).toBe(true);
  await expect.poll(async () => (await snap(b)).parts.some((p) => p.id === 'edge'), { timeout: 5_000 }).toBe(true);
  expect(await thickness(b, 'edge')).toBe(0.025);
  await expect(a.getByTestId('status')).toContainText('Restored');
  // the restore is A's own change: A's undo takes it back, B's delete is still in history
  await a.evaluate(() => (window as any).__dewline.undo());
  await expect.poll(async () => (await snap(b)).parts.some((p) => p.id === 'edge'), { timeout: 5_000 }).toBe(false);
});

test('edits made offline sync when the connection returns', async ({ browser }) => {
  const a = await person(browser);
  const { editUrl } = await newRoom(a);
  const b = await person(browser);
  await b.goto(editUrl);
  await ready(b);

  await a.context().setOffline(true);
  await expect(a.getByTestId('connection')).toHaveAttribute('data-status', 'offline', { timeout: 10_000 });
  expect(await a.evaluate(() => (window as any).__dewline.controller.updatePart('edge', { thickness: 0.015 }))).toBeNull();
  expect(await b.evaluate(() => (window as any).__dewline.controller.updatePart('stem', { thickness: 0.3 }))).toBeNull();
  // the local copy in IndexedDB holds the offline edit
  await expect
    .poll(
      () =>
        a.evaluate(
          (key) =>
            new Promise<number>((resolve) => {
              const open = indexedDB.open(`dewline-room:${key}`);
              open.onsuccess = () => {
                const tx = open.result.transaction('updates', 'readonly');
                const count = tx.objectStore('updates').count();
                count.onsuccess = () => resolve(count.result);
              };
              open.onerror = () => resolve(-1);
            }),
          editUrl.split('/s/')[1],
        ),
      { timeout: 5_000 },
    )
    .toBeGreaterThan(0);
  await b.waitForTimeout(1_500);
  expect(await thickness(b, 'edge')).toBe(0.025);
  expect(await thickness(a, 'stem')).toBe(0.2);

  await a.context().setOffline(false);
  await expect(a.getByTestId('connection')).toHaveAttribute('data-status', 'live', { timeout: 30_000 });
  await expect.poll(() => thickness(b, 'edge'), { timeout: 10_000 }).toBe(0.015);
  await expect.poll(() => thickness(a, 'stem'), { timeout: 10_000 }).toBe(0.3);
});

test('an edit made offline survives closing the page and reaches the room from the next page in that browser', async ({ browser }) => {
  const a = await person(browser);
  const { editUrl } = await newRoom(a);
  const b = await person(browser);
  await b.goto(editUrl);
  await ready(b);
  const ctx = a.context();
  await ctx.setOffline(true);
  await expect(a.getByTestId('connection')).toHaveAttribute('data-status', 'offline', { timeout: 10_000 });
  expect(await a.evaluate(() => (window as any).__dewline.controller.updatePart('edge', { thickness: 0.012 }))).toBeNull();
  // give y-indexeddb its moment to write, then close the page while still offline
  await a.waitForTimeout(500);
  await a.close();
  await ctx.setOffline(false);
  await b.waitForTimeout(1_000);
  expect(await thickness(b, 'edge')).toBe(0.025);
  const a2 = await ctx.newPage();
  await a2.goto(editUrl);
  await ready(a2);
  await expect.poll(() => thickness(b, 'edge'), { timeout: 10_000 }).toBe(0.012);
});

/** server/main.ts (app and sync on one port) as a child process of the test, so it can be SIGKILLed. */
async function startOwnServer(port: number, db: string): Promise<ChildProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', NODE_ENV: 'production', DEWLINE_DB: db, DEWLINE_LOG_LEVEL: 'warn' },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const t0 = Date.now();
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server exited with ${child.exitCode}`);
    try {
      const r = await fetch(`http://127.0.0.1:${port}/healthz`);
      if (r.ok) return child;
    } catch {
      // not listening yet
    }
    if (Date.now() - t0 > 120_000) throw new Error('server did not start in 120 s');
    await new Promise((r) => setTimeout(r, 250));
  }
}

test('both people keep their edits when the server is killed and restarted', async ({ browser }) => {
  // a port next to this run's own (DEWLINE_E2E_PORT + 1000), with its own database
  const port = Number(process.env.DEWLINE_E2E_PORT ?? 3417) + 1000;
  const db = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'dewline-e2e-restart-')), 'rooms.sqlite');
  let server = await startOwnServer(port, db);
  try {
    const base = `http://127.0.0.1:${port}`;
    const a = await person(browser);
    await a.goto(base + '/');
    await a.getByTestId('start-shared').check();
    await a.getByTestId('template-slab-edge-break').click();
    await a.waitForURL(/\/s\/[A-Za-z0-9_-]{22}$/);
    await ready(a);
    const editUrl = a.url();
    const b = await person(browser);
    await b.goto(editUrl);
    await ready(b);
    expect(await a.evaluate(() => (window as any).__dewline.controller.updatePart('edge', { thickness: 0.02 }))).toBeNull();
    await expect.poll(() => thickness(b, 'edge'), { timeout: 5_000 }).toBe(0.02);

    server.kill('SIGKILL');
    await new Promise((r) => server.once('exit', r));
    await expect(a.getByTestId('connection')).toHaveAttribute('data-status', 'reconnecting', { timeout: 30_000 });
    await expect(b.getByTestId('connection')).toHaveAttribute('data-status', 'reconnecting', { timeout: 30_000 });
    // both keep editing while the server is down
    expect(await a.evaluate(() => (window as any).__dewline.controller.updatePart('stem', { thickness: 0.22 }))).toBeNull();
    expect(await b.evaluate(() => (window as any).__dewline.controller.updatePart('subslab', { thickness: 0.075 }))).toBeNull();

    server = await startOwnServer(port, db);
    await expect(a.getByTestId('connection')).toHaveAttribute('data-status', 'live', { timeout: 60_000 });
    await expect(b.getByTestId('connection')).toHaveAttribute('data-status', 'live', { timeout: 60_000 });
    await expect.poll(() => thickness(a, 'subslab'), { timeout: 10_000 }).toBe(0.075);
    await expect.poll(() => thickness(b, 'stem'), { timeout: 10_000 }).toBe(0.22);
    // and the server stored all three: a third person gets them from the server alone
    const c = await person(browser);
    await c.goto(editUrl);
    await ready(c);
    const s = await snap(c);
    expect(s.parts.find((p) => p.id === 'edge')?.thickness).toBe(0.02);
    expect(s.parts.find((p) => p.id === 'stem')?.thickness).toBe(0.22);
    expect(s.parts.find((p) => p.id === 'subslab')?.thickness).toBe(0.075);
  } finally {
    server.kill('SIGTERM');
  }
});

test('a section file and a blank board each open into a new room; a bad file makes no room', async ({ browser }) => {
  const a = await person(browser);
  const s = templateByName('crawlspace-unvented')!.build();
  s.name = 'Hollow Oak crawl space';
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'dewline-e2e-'));
  const file = path.join(dir, 'crawl.json');
  fs.writeFileSync(file, JSON.stringify(s));
  await a.goto('/');
  await a.getByTestId('start-shared').check();
  await a.getByTestId('open-file').setInputFiles(file);
  await a.waitForURL(/\/s\/[A-Za-z0-9_-]{22}$/);
  await ready(a);
  expect((await snap(a)).name).toBe('Hollow Oak crawl space');
  expect((await snap(a)).parts.length).toBe(s.parts.length);
  // a reload does not write the file a second time over later edits
  expect(await a.evaluate(() => (window as any).__dewline.controller.updatePart((window as any).__dewline.snapshot().parts[0].id, { name: 'Edited after start' }))).toBeNull();
  await a.reload();
  await ready(a);
  expect((await snap(a)).parts[0]).toMatchObject({ name: 'Edited after start' });

  const broken = JSON.parse(JSON.stringify(s));
  broken.parts[0].kind = 'no-such-kind';
  const bad = path.join(dir, 'bad.json');
  fs.writeFileSync(bad, JSON.stringify(broken));
  await a.goto('/');
  await a.getByTestId('start-shared').check();
  await a.getByTestId('open-file').setInputFiles(bad);
  await expect(a.getByTestId('open-problems')).toContainText('bad.json: parts[0]');
  expect(new URL(a.url()).pathname).toBe('/');

  await a.getByTestId('start-blank').click();
  await a.waitForURL(/\/s\/[A-Za-z0-9_-]{22}$/);
  await ready(a);
  expect((await snap(a)).parts).toEqual([]);
});
