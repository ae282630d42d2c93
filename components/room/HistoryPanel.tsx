'use client';
/**
 * Named versions of the room: save the section as it is now under a name, list the saved ones, and
 * restore one as a new change (undoable like any edit of yours; nobody's history is rewritten).
 */
import { useEffect, useState } from 'react';
import type { BoardController } from '@/components/board/controller';
import { fetchVersion, listVersions, saveVersion, type VersionInfo } from '@/lib/collab/api';
import { restoreVersion, sectionOfVersion } from '@/lib/collab/versions';
import { fileNameFor } from '@/components/board/Board';
import css from './room.module.css';

const when = (ms: number) => new Date(ms).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });

export function HistoryPanel({ editKey, controller: c, onClose }: { editKey: string; controller: BoardController; onClose: () => void }) {
  const [versions, setVersions] = useState<VersionInfo[] | null>(null);
  const [name, setName] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const reload = () =>
    listVersions(editKey).then(
      (v) => setVersions(v),
      (err: Error) => setError(`The versions cannot be listed: ${err.message}`),
    );
  useEffect(() => {
    void reload();
  }, [editKey]); // eslint-disable-line react-hooks/exhaustive-deps

  const save = async () => {
    const n = name.trim();
    if (!n) {
      setError('Give the version a name first.');
      return;
    }
    setBusy(true);
    setError(null);
    try {
      await saveVersion(editKey, n);
      setName('');
      await reload();
    } catch (err) {
      setError(`Not saved: ${(err as Error).message}`);
    } finally {
      setBusy(false);
    }
  };

  const restore = async (v: VersionInfo) => {
    setBusy(true);
    setError(null);
    try {
      const update = await fetchVersion(editKey, v.id);
      let changed = 0;
      const err = c.action(() => {
        changed = restoreVersion(c.doc, update, c.origin);
      });
      if (err) setError(`Not restored: ${err}`);
      else c.say(changed === 0 ? `'${v.name}' is the same as the section now: nothing to restore.` : `Restored '${v.name}' as a new change (${changed} item${changed === 1 ? '' : 's'}). Undo takes it back.`);
    } catch (err) {
      setError(`Not restored: ${(err as Error).message}`);
    } finally {
      setBusy(false);
    }
  };

  /** The version as a section file, to look at or keep (the board is not touched). */
  const download = async (v: VersionInfo) => {
    setError(null);
    try {
      const s = sectionOfVersion(await fetchVersion(editKey, v.id));
      const blob = new Blob([JSON.stringify(s, null, 2) + '\n'], { type: 'application/json' });
      const url = URL.createObjectURL(blob);
      const a = document.createElement('a');
      a.href = url;
      a.download = fileNameFor(`${s.name} ${v.name}`);
      document.body.appendChild(a);
      a.click();
      a.remove();
      setTimeout(() => URL.revokeObjectURL(url), 1000);
    } catch (err) {
      setError(`Not downloaded: ${(err as Error).message}`);
    }
  };

  return (
    <section className={css.panel} data-testid="history-panel" aria-label="Named versions">
      <div style={{ display: 'flex', justifyContent: 'space-between', alignItems: 'center' }}>
        <h2>Named versions</h2>
        <button type="button" onClick={onClose} aria-label="Close">×</button>
      </div>
      <form
        onSubmit={(e) => {
          e.preventDefault();
          void save();
        }}
      >
        <input value={name} onChange={(e) => setName(e.target.value)} maxLength={80} placeholder="Name, e.g. before the site meeting" aria-label="Version name" data-testid="version-name" />
        <button type="submit" disabled={busy} data-testid="version-save">Save</button>
      </form>
      {error && <p className={css.error} role="alert" data-testid="history-error">{error}</p>}
      {versions === null ? (
        <p>Loading…</p>
      ) : versions.length === 0 ? (
        <p className={css.note}>No named versions yet.</p>
      ) : (
        <ul data-testid="version-list">
          {versions.map((v) => (
            <li key={v.id} data-testid="version" data-name={v.name}>
              <span>
                {v.name}
                <small>{when(v.createdAt)}</small>
              </span>
              <span style={{ display: 'flex', gap: 4 }}>
                <button type="button" onClick={() => void download(v)} data-testid={`download-${v.id}`} title="Save this version as a section file">
                  File
                </button>
                <button type="button" disabled={busy} onClick={() => void restore(v)} data-testid={`restore-${v.id}`}>
                  Restore
                </button>
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
