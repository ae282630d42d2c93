'use client';
/** The home page's three ways in: a blank section, a template, or a section file. */
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { formatProblem } from '@/lib/section/errors';
import { TEMPLATES } from '@/lib/section/templates';
import { parseSectionText } from '@/lib/section/validate';

export const OPEN_KEY = 'dewline:open';

export function StartPanel() {
  const router = useRouter();
  const [problems, setProblems] = useState<string[] | null>(null);

  async function openFile(file: File) {
    const text = await file.text();
    const v = parseSectionText(text);
    if (!v.ok) {
      setProblems(v.problems.map((p) => `${file.name}: ${formatProblem(p)}`));
      return;
    }
    setProblems(null);
    sessionStorage.setItem(OPEN_KEY, JSON.stringify(v.section));
    router.push('/section?open=1');
  }

  return (
    <div className="start">
      <section className="start-card">
        <h2>Blank section</h2>
        <p>An empty board: place soil, footing, wall, slab and zones from the palette.</p>
        <a className="button" href="/section?blank=1" data-testid="start-blank">
          Start blank
        </a>
      </section>
      <section className="start-card">
        <h2>From a template</h2>
        <ul className="template-list">
          {TEMPLATES.map((t) => (
            <li key={t.name}>
              <a href={`/section?template=${encodeURIComponent(t.name)}`} data-testid={`template-${t.name}`}>
                {t.build().name}
              </a>
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
  );
}
