'use client';
/**
 * The home page's three ways in: a blank section, a template, or a section file; each opens on this
 * computer only (/section) or, with "Shared room" ticked, in a new room with its own edit and view
 * links (/s/<editKey>).
 */
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { createRoom } from '@/lib/collab/api';
import { pendingKey } from '@/lib/collab/initial';
import { formatProblem } from '@/lib/section/errors';
import type { SectionSnapshot } from '@/lib/section/schema';
import { blankSection, TEMPLATES, templateByName } from '@/lib/section/templates';
import { parseSectionText } from '@/lib/section/validate';

export const OPEN_KEY = 'dewline:open';

/**
 * Creates a room and leaves its starting section for the edit page, which writes it into the shared
 * document once (see lib/collab/initial.ts); returns the edit page's path.
 */
export async function startRoom(start: SectionSnapshot): Promise<string> {
  const keys = await createRoom();
  sessionStorage.setItem(pendingKey(keys.editKey), JSON.stringify(start));
  return `/s/${keys.editKey}`;
}

export function StartPanel() {
  const router = useRouter();
  const [problems, setProblems] = useState<string[] | null>(null);
  const [shared, setShared] = useState(false);
  const [busy, setBusy] = useState(false);
  const [roomError, setRoomError] = useState<string | null>(null);

  async function openShared(start: SectionSnapshot) {
    setBusy(true);
    setRoomError(null);
    try {
      router.push(await startRoom(start));
    } catch (err) {
      setRoomError(`The shared room could not be made: ${(err as Error).message}`);
      setBusy(false);
    }
  }

  async function openFile(file: File) {
    const text = await file.text();
    const v = parseSectionText(text);
    if (!v.ok) {
      setProblems(v.problems.map((p) => `${file.name}: ${formatProblem(p)}`));
      return;
    }
    setProblems(null);
    if (shared) {
      await openShared(v.section);
      return;
    }
    sessionStorage.setItem(OPEN_KEY, JSON.stringify(v.section));
    router.push('/section?open=1');
  }

  /** A link that opens locally, or (shared) makes a room from the same start. */
  const startLink = (href: string, start: () => SectionSnapshot, testid: string, label: string) => (
    <a
      className={testid === 'start-blank' ? 'button' : undefined}
      href={href}
      data-testid={testid}
      aria-disabled={busy}
      onClick={(e) => {
        if (!shared) return;
        e.preventDefault();
        if (!busy) void openShared(start());
      }}
    >
      {label}
    </a>
  );

  return (
    <>
      <label className="start-shared" style={{ display: "block", margin: "0 0 1rem" }}>
        <input type="checkbox" checked={shared} onChange={(e) => setShared(e.target.checked)} data-testid="start-shared" />{' '}
        <strong>Shared room</strong>: start on a link that others can open to edit or watch with you
      </label>
      {roomError && (
        <p className="problems" role="alert" data-testid="room-problem">
          {roomError}
        </p>
      )}
      <div className="start">
        <section className="start-card">
          <h2>Blank section</h2>
          <p>An empty board: place soil, footing, wall, slab and zones from the palette.</p>
          {startLink('/section?blank=1', () => blankSection(), 'start-blank', shared ? 'Start blank room' : 'Start blank')}
        </section>
        <section className="start-card">
          <h2>From a template</h2>
          <ul className="template-list">
            {TEMPLATES.map((t) => (
              <li key={t.name}>
                {startLink(`/section?template=${encodeURIComponent(t.name)}`, () => templateByName(t.name)!.build(), `template-${t.name}`, t.build().name)}
                <span>{t.description}</span>
              </li>
            ))}
          </ul>
        </section>
        <section className="start-card">
          <h2>Open a file</h2>
          <p>A Dewline section file (.json).</p>
          <label className="button">
            Choose file
            <input
              type="file"
              accept=".json,application/json"
              data-testid="open-file"
              style={{ display: 'none' }}
              onChange={(e) => {
                const f = e.target.files?.[0];
                if (f) void openFile(f);
                e.target.value = '';
              }}
            />
          </label>
          {problems && (
            <div className="problems" role="alert" data-testid="open-problems">
              <strong>This file cannot be opened:</strong>
              <ul>
                {problems.map((p) => (
                  <li key={p}>{p}</li>
                ))}
              </ul>
            </div>
          )}
        </section>
      </div>
    </>
  );
}
