'use client';
/**
 * The sheet page: loads the section (?template=NAME, ?open=1 from sessionStorage as the home page leaves
 * it, or ?key=ROOMKEY once over ws://<host>/sync/<key> with y-websocket), solves it with the same
 * solveSection as `dewline solve` (default mesh), runs the Glaser check and shows the sheet with
 * print, PDF, PNG and SVG downloads. Options: ?units=ip, ?paper=letter.
 */
import { useEffect, useState } from 'react';
import * as Y from 'yjs';
import { glaserForSection, type CutOutcome } from '@/lib/moisture/cut';
import { EXAMPLE_MONTHS } from '@/lib/moisture/glaser';
import { renderSectionSvg } from '@/lib/render/svg';
import { docFromSnapshot, readSection } from '@/lib/section/doc';
import { formatProblem } from '@/lib/section/errors';
import type { SectionSnapshot } from '@/lib/section/schema';
import { TEMPLATES, templateByName } from '@/lib/section/templates/index';
import { parseSectionText } from '@/lib/section/validate';
import { solveSection } from '@/lib/thermal/section';
import type { SectionResults } from '@/lib/thermal/types';
import type { UnitSystem } from '@/lib/units';
import { Sheet, sheetCss, sheetScale, type SheetMeta } from './Sheet';

export const OPEN_KEY = 'dewline:open';

type Loaded = { ok: true; doc: Y.Doc; source: string; roomName: string | null } | { ok: false; title: string; lines: string[] };
type Ready = { snapshot: SectionSnapshot; results: SectionResults; glaser: CutOutcome[]; meta: SheetMeta };

/** Changes recorded in a document: the sum of its state vector's clocks. */
export function revisionOf(doc: Y.Doc): number {
  let n = 0;
  for (const clock of Y.decodeStateVector(Y.encodeStateVector(doc)).values()) n += clock;
  return n;
}

async function loadRoom(key: string): Promise<Loaded> {
  if (!/^[A-Za-z0-9_-]{16,64}$/.test(key)) return { ok: false, title: 'This room link is not valid', lines: ['A room key is 22 letters, digits, - or _. Check the link you were sent.'] };
  const { WebsocketProvider } = await import('y-websocket');
  const doc = new Y.Doc();
  const proto = location.protocol === 'https:' ? 'wss' : 'ws';
  const provider = new WebsocketProvider(`${proto}://${location.host}/sync`, key, doc, { disableBc: true });
  // The server's role message (type 100); read and ignored here, the sheet only reads.
  (provider.messageHandlers as unknown as Record<number, unknown>)[100] = () => {};
  try {
    const synced = await new Promise<boolean | string>((resolve) => {
      const timer = setTimeout(() => resolve('timeout'), 20_000);
      provider.on('sync', (s: boolean) => { if (s) { clearTimeout(timer); resolve(true); } });
      provider.on('connection-close', (e: CloseEvent | null) => { if (e && e.code >= 4400 && e.code < 4500) { clearTimeout(timer); resolve(`closed ${e.code}`); } });
    });
    if (synced !== true) return { ok: false, title: 'The room could not be loaded', lines: [synced === 'closed 4404' ? 'The room key is unknown or has been revoked.' : `The sync server did not answer (${synced}).`] };
    return { ok: true, doc, source: 'shared room', roomName: (doc.getMap('section').get('name') as string | undefined) ?? null };
  } finally {
    provider.destroy();
  }
}

export async function loadStart(search: string, stored: string | null): Promise<Loaded> {
  const q = new URLSearchParams(search);
  const key = q.get('key');
  if (key) return loadRoom(key);
  const t = q.get('template');
  if (t) {
    const tpl = templateByName(t);
    if (!tpl) return { ok: false, title: `There is no template named '${t}'`, lines: TEMPLATES.map((x) => `${x.name}: ${x.description}`) };
    return { ok: true, doc: docFromSnapshot(tpl.build()), source: `template ${t}`, roomName: null };
  }
  if (q.get('open')) {
    if (stored === null) return { ok: false, title: 'No file to open', lines: ['Open a section file from the home page first.'] };
    const v = parseSectionText(stored);
    if (!v.ok) return { ok: false, title: 'This file cannot be opened', lines: v.problems.map(formatProblem) };
    return { ok: true, doc: docFromSnapshot(v.section), source: 'file', roomName: null };
  }
  return { ok: false, title: 'Which section?', lines: ['Open the sheet from a section: /sheet?template=NAME, /sheet?open=1 or /sheet?key=ROOMKEY.', ...TEMPLATES.map((x) => `template ${x.name}: ${x.description}`)] };
}

function download(name: string, blob: Blob) {
  const a = document.createElement('a');
  a.href = URL.createObjectURL(blob);
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(a.href), 10_000);
}

async function svgToPngBlob(svg: string, width: number, height: number): Promise<Blob> {
  const img = new Image();
  const url = URL.createObjectURL(new Blob([svg], { type: 'image/svg+xml' }));
  try {
    await new Promise<void>((resolve, reject) => { img.onload = () => resolve(); img.onerror = () => reject(new Error('the drawing could not be rasterised')); img.src = url; });
    const canvas = document.createElement('canvas');
    canvas.width = width; canvas.height = height;
    const ctx = canvas.getContext('2d')!;
    ctx.fillStyle = '#fff';
    ctx.fillRect(0, 0, width, height);
    ctx.drawImage(img, 0, 0, width, height);
    return await new Promise<Blob>((resolve, reject) => canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('no PNG'))), 'image/png'));
  } finally {
    URL.revokeObjectURL(url);
  }
}

const slug = (s: string) => s.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'section';

export default function SheetPage() {
  const [state, setState] = useState<{ phase: 'loading' | 'solving' } | { phase: 'error'; title: string; lines: string[] } | { phase: 'ready'; ready: Ready }>({ phase: 'loading' });
  const [paper, setPaper] = useState<'a4' | 'letter'>('a4');
  const [busy, setBusy] = useState<string | null>(null);
  const [pictureScale, setPictureScale] = useState<number | null>(null);
  useEffect(() => {
    let cancelled = false;
    const q = new URLSearchParams(window.location.search);
    const units: UnitSystem = q.get('units') === 'ip' ? 'ip' : 'si';
    const pp = q.get('paper') === 'letter' ? 'letter' : 'a4';
    setPaper(pp);
    let stored: string | null = null;
    try { stored = sessionStorage.getItem(OPEN_KEY); } catch { stored = null; }
    (async () => {
      const l = await loadStart(window.location.search, stored);
      if (cancelled) return;
      if (!l.ok) { setState({ phase: 'error', title: l.title, lines: l.lines }); return; }
      const v = readSection(l.doc);
      if (!v.ok) { setState({ phase: 'error', title: 'This section has problems', lines: v.problems.map(formatProblem) }); return; }
      setState({ phase: 'solving' });
      try {
        const results = await solveSection(v.section, { mesh: 'default' });
        const glaser = glaserForSection(v.section, results, { months: EXAMPLE_MONTHS });
        const meta: SheetMeta = { source: l.source, roomName: l.roomName, date: new Date().toISOString().slice(0, 10), revision: revisionOf(l.doc), units, paper: pp };
        if (cancelled) return;
        const ready = { snapshot: v.section, results, glaser, meta };
        (window as unknown as { __dewlineSheet?: unknown }).__dewlineSheet = ready;
        document.title = `${v.section.name} · sheet · Dewline`;
        setState({ phase: 'ready', ready });
      } catch (e) {
        setState({ phase: 'error', title: 'The section could not be solved', lines: [(e as Error).message] });
      }
    })();
    return () => { cancelled = true; };
  }, []);

  const css = <style dangerouslySetInnerHTML={{ __html: sheetCss(paper) }} />;
  if (state.phase === 'loading' || state.phase === 'solving') return <main className="sheet-wait">{css}<p style={{ padding: 24 }} data-testid="sheet-wait">{state.phase === 'loading' ? 'Loading the section…' : 'Solving the section (default mesh)…'}</p></main>;
  if (state.phase === 'error')
    return (
      <main style={{ padding: 24, maxWidth: 720 }}>
        <h1 style={{ fontSize: 20 }} data-testid="sheet-error">{state.title}</h1>
        <pre style={{ whiteSpace: 'pre-wrap' }}>{state.lines.join('\n')}</pre>
        <p><a href="/">Back to the start page</a></p>
      </main>
    );
  if (state.phase !== 'ready') return null;
  const { ready } = state;
  const name = slug(ready.snapshot.name);
  const picture = (overlay: boolean) => {
    if (pictureScale) return renderSectionSvg(ready.snapshot, ready.results, { scale: pictureScale, overlay, units: ready.meta.units });
    const r0 = renderSectionSvg(ready.snapshot, ready.results, { scale: 10, overlay, units: ready.meta.units });
    const n = sheetScale(r0.box.maxX - r0.box.minX, r0.box.maxY - r0.box.minY);
    return n === 10 ? r0 : renderSectionSvg(ready.snapshot, ready.results, { scale: n, overlay, units: ready.meta.units });
  };
  const pdfHref = () => {
    const q = new URLSearchParams(window.location.search);
    const p = new URLSearchParams();
    for (const k of ['template', 'key', 'units', 'paper']) { const v = q.get(k); if (v) p.set(k, v); }
    return `/api/sheet.pdf?${p.toString()}`;
  };
  async function pdf() {
    setBusy('Making the PDF…');
    try {
      const q = new URLSearchParams(window.location.search);
      const res = q.get('open')
        ? await fetch(`/api/sheet.pdf?${new URLSearchParams({ units: ready.meta.units, paper }).toString()}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(ready.snapshot) })
        : await fetch(pdfHref());
      if (!res.ok) throw new Error(await res.text());
      download(`${name}-sheet.pdf`, await res.blob());
      setBusy(null);
    } catch (e) {
      setBusy(`PDF failed: ${(e as Error).message}`);
    }
  }
  return (
    <main>
      {css}
      <nav className="sheet-tools" data-testid="sheet-tools">
        <button type="button" onClick={() => window.print()}>Print</button>
        <button type="button" data-testid="download-pdf" onClick={() => void pdf()}>Download PDF</button>
        <button type="button" data-testid="download-png" onClick={() => { const r = picture(true); void svgToPngBlob(r.svg, r.width, r.height).then((b) => download(`${name}.png`, b)); }}>PNG</button>
        <button type="button" data-testid="download-svg" onClick={() => download(`${name}.svg`, new Blob([picture(true).svg], { type: 'image/svg+xml' }))}>SVG</button>
        <button type="button" data-testid="download-svg-plain" onClick={() => download(`${name}-materials.svg`, new Blob([picture(false).svg], { type: 'image/svg+xml' }))}>SVG, materials only</button>
        <select aria-label="Picture scale" value={pictureScale ?? ''} onChange={(e) => setPictureScale(e.target.value ? Number(e.target.value) : null)} data-testid="picture-scale">
          <option value="">pictures at the sheet&apos;s scale</option>
          {[5, 10, 20, 50].map((n) => <option key={n} value={n}>pictures at 1:{n}</option>)}
        </select>
        <select aria-label="Paper" value={paper} onChange={(e) => setPaper(e.target.value === 'letter' ? 'letter' : 'a4')} data-testid="paper">
          <option value="a4">A4</option>
          <option value="letter">Letter</option>
        </select>
        {busy && <span data-testid="sheet-busy">{busy}</span>}
      </nav>
      <Sheet {...ready} meta={{ ...ready.meta, paper }} />
    </main>
  );
}
