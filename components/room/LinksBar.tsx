'use client';
/** The edit and view links of a room: shown, copied, and replaced (which revokes the old link). */
import { useState } from 'react';
import type { Role } from '@/lib/collab/api';
import css from './room.module.css';

export function roomLink(key: string): string {
  return `${window.location.origin}/s/${key}`;
}

async function copy(text: string): Promise<boolean> {
  try {
    await navigator.clipboard.writeText(text);
    return true;
  } catch {
    return false;
  }
}

export function LinksBar({ editKey, viewKey, onRotate }: { editKey: string; viewKey: string | null; onRotate: (which: Role) => void }) {
  const [said, setSaid] = useState<string | null>(null);
  const [confirm, setConfirm] = useState<Role | null>(null);
  const one = (which: Role, key: string | null) => {
    const label = which === 'edit' ? 'Edit link' : 'View link';
    const url = key ? roomLink(key) : '';
    return (
      <span className={css.links} style={{ display: 'inline-flex', gap: 4, alignItems: 'center' }}>
        <input readOnly value={url} aria-label={label} data-testid={`${which}-link`} onFocus={(e) => e.target.select()} placeholder="(not available)" />
        <button
          type="button"
          data-testid={`copy-${which}`}
          disabled={!key}
          title={which === 'edit' ? 'Anyone with this link can change the section' : 'Anyone with this link can watch the section, not change it'}
          onClick={async () => setSaid((await copy(url)) ? `${label} copied.` : `Copy the ${label.toLowerCase()} from the box beside the button.`)}
        >
          Copy {which}
        </button>
        <button type="button" data-testid={`rotate-${which}`} onClick={() => setConfirm(which)} title={`Make a new ${label.toLowerCase()}; the old one stops working`}>
          New…
        </button>
      </span>
    );
  };
  return (
    <div className={css.group} data-testid="links">
      {one('edit', editKey)}
      {one('view', viewKey)}
      {confirm && (
        <span role="alertdialog" aria-label="Replace the link" style={{ display: 'inline-flex', gap: 4, alignItems: 'center' }}>
          Everyone using the old {confirm} link loses access.
          <button type="button" data-testid={`rotate-${confirm}-confirm`} onClick={() => { setConfirm(null); onRotate(confirm); }}>
            Replace the {confirm} link
          </button>
          <button type="button" onClick={() => setConfirm(null)}>Cancel</button>
        </span>
      )}
      {said && <span className={css.note} data-testid="copy-note">{said}</span>}
    </div>
  );
}
