'use client';
/**
 * The local section page: builds a Y.Doc from a template, a blank section or an opened file, and mounts
 * the board on it. Exposes the document for tests as window.__dewline.
 */
import dynamic from 'next/dynamic';
import { useEffect, useMemo, useState } from 'react';
import * as Y from 'yjs';
import { docFromSnapshot, readSection } from '@/lib/section/doc';
import { formatProblem } from '@/lib/section/errors';
import type { SectionSnapshot } from '@/lib/section/schema';
import { blankSection, templateByName, TEMPLATES } from '@/lib/section/templates/index';
import { parseSectionText } from '@/lib/section/validate';
import type { BoardController } from '@/components/board/controller';
import LiveBoard from '@/components/live/LiveBoard';
import { boardTestHook } from '@/components/board/test-hook';
import { SheetLink } from '@/components/sheet/SheetLink';

const Board = dynamic(() => import('@/components/board/Board'), { ssr: false, loading: () => <p style={{ padding: 24 }}>Loading the board…</p> });

export const OPEN_KEY = 'dewline:open';

type Start = { ok: true; snapshot: SectionSnapshot } | { ok: false; title: string; lines: string[] };

/** What the address asks for: ?template=NAME, ?blank=1 or ?open=1 (the file's text in sessionStorage). */
export function startFrom(search: string, stored: string | null): Start {
  const q = new URLSearchParams(search);
  const t = q.get('template');
  if (t) {
    const tpl = templateByName(t);
    if (!tpl) return { ok: false, title: `There is no template named '${t}'`, lines: TEMPLATES.map((x) => `${x.name}: ${x.description}`) };
    return { ok: true, snapshot: tpl.build() };
  }
  if (q.get('open')) {
    if (stored === null) return { ok: false, title: 'No file to open', lines: ['Open a section file from the home page.'] };
    const v = parseSectionText(stored);
    if (!v.ok) return { ok: false, title: 'This file cannot be opened', lines: v.problems.map(formatProblem) };
    return { ok: true, snapshot: v.section };
  }
  return { ok: true, snapshot: blankSection() };
}

export default function SectionPage() {
  const [start, setStart] = useState<Start | null>(null);
  useEffect(() => {
    let stored: string | null = null;
    try {
      stored = sessionStorage.getItem(OPEN_KEY);
    } catch {
      stored = null;
    }
    setStart(startFrom(window.location.search, stored));
  }, []);
  const doc = useMemo(() => (start?.ok ? docFromSnapshot(start.snapshot) : null), [start]);
  const origin = useMemo(() => ({ who: 'local board' }), []);
  useEffect(() => {
    if (start?.ok) document.title = `${start.snapshot.name} · Dewline`;
  }, [start]);

  if (!start) return <p style={{ padding: 24 }}>Loading…</p>;
  if (!start.ok)
    return (
      <main style={{ padding: 24, maxWidth: 720 }}>
        <h1 style={{ fontSize: 20 }}>{start.title}</h1>
        <pre data-testid="start-problems" style={{ whiteSpace: 'pre-wrap' }}>{start.lines.join('\n')}</pre>
        <p><a href="/">Back to the start page</a></p>
      </main>
    );
  return (
    <>
      <LiveBoard doc={doc!} origin={origin} onReady={(c) => expose(doc!, c)} />
      <SheetLink doc={doc!} />
    </>
  );
}

function expose(doc: Y.Doc, c: BoardController) {
  window.__dewline = boardTestHook(doc, c);
}
