/**
 * Node only: Debian's chromium (or $CHROMIUM_PATH) through playwright-core, for rasterising an SVG to PNG
 * and printing a page to PDF.
 */
import fs from 'node:fs';
import { chromium, type Browser } from 'playwright-core';

const CANDIDATES = ['/usr/bin/chromium', '/usr/bin/chromium-browser', '/usr/lib/chromium/chromium', '/snap/bin/chromium', '/usr/bin/google-chrome'];

export function chromiumPath(): string {
  const env = process.env.CHROMIUM_PATH;
  if (env) {
    if (fs.existsSync(env)) return env;
    throw new Error(`CHROMIUM_PATH is ${env}, which does not exist`);
  }
  const p = CANDIDATES.find((c) => fs.existsSync(c));
  if (!p) throw new Error(`no Chromium found (looked at $CHROMIUM_PATH, then ${CANDIDATES.join(', ')}); on Debian: apt-get install chromium`);
  return p;
}

export async function launchChromium(): Promise<Browser> {
  return chromium.launch({ executablePath: chromiumPath(), args: ['--no-sandbox', '--headless', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'] });
}

/** PNG bytes of an SVG of width x height CSS pixels, at `density` device pixels per CSS pixel. */
export async function svgToPng(svg: string, width: number, height: number, density = 1): Promise<Buffer> {
  const browser = await launchChromium();
  try {
    const page = await browser.newPage({ viewport: { width: Math.ceil(width), height: Math.ceil(height) }, deviceScaleFactor: density });
    await page.setContent(`<!doctype html><html><head><style>html,body{margin:0;padding:0;background:#fff}svg{display:block}</style></head><body>${svg}</body></html>`, { waitUntil: 'load' });
    return await page.screenshot({ type: 'png', clip: { x: 0, y: 0, width: Math.ceil(width), height: Math.ceil(height) } });
  } finally {
    await browser.close();
  }
}

/** PDF bytes of a page at a URL, printed with its own @page rules (A4 unless the page says otherwise). */
export async function urlToPdf(url: string, opts: { format?: 'A4' | 'Letter'; waitForSelector?: string; timeoutMs?: number; sessionStorage?: Record<string, string> } = {}): Promise<Buffer> {
  const browser = await launchChromium();
  try {
    const page = await browser.newPage();
    if (opts.sessionStorage) await page.addInitScript((entries: [string, string][]) => { for (const [k, v] of entries) sessionStorage.setItem(k, v); }, Object.entries(opts.sessionStorage));
    await page.goto(url, { waitUntil: 'load', timeout: opts.timeoutMs ?? 120_000 });
    if (opts.waitForSelector) await page.waitForSelector(opts.waitForSelector, { timeout: opts.timeoutMs ?? 120_000, state: 'attached' });
    await page.emulateMedia({ media: 'print' });
    return await page.pdf({ format: opts.format ?? 'A4', printBackground: true, preferCSSPageSize: false, margin: { top: '12mm', bottom: '12mm', left: '12mm', right: '12mm' } });
  } finally {
    await browser.close();
  }
}
