'use client';
/** Pick a material: searchable, showing conductivity and its source; or make one of your own (putMaterial). */
import { useMemo, useState } from 'react';
import { LIBRARY_MATERIALS } from '@/lib/materials/library';
import type { FillPattern, Material } from '@/lib/materials/material';
import { FILL_PATTERNS } from '@/lib/materials/material';
import * as ops from '@/lib/section/ops';
import { formatQuantity } from '@/lib/units';
import type { BoardController } from './controller';
import { parseQuantityField } from './fields';
import { fillStyle } from './fills';
import { useStore } from './store';
import css from './board.module.css';

/** Search words against name, id and pattern; every word must match. */
export function matchMaterial(m: { id: string; name: string; pattern: string }, query: string): boolean {
  const hay = `${m.name} ${m.id} ${m.pattern}`.toLowerCase();
  return query.toLowerCase().split(/\s+/).filter(Boolean).every((w) => hay.includes(w));
}

export function MaterialPicker({ c, current, onPick, onClose }: { c: BoardController; current: string; onPick: (id: string) => string | null; onClose: () => void }) {
  const st = useStore(c.settled);
  const { system } = useStore(c.ui);
  const [q, setQ] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [making, setMaking] = useState(false);
  const all = useMemo(() => [...st.snapshot.materials.map((m) => ({ ...m, own: true })), ...LIBRARY_MATERIALS.map((m) => ({ ...m, own: false }))], [st.snapshot.materials]);
  const shown = all.filter((m) => matchMaterial(m, q));
  return (
    <div className={css.modalBack} onClick={onClose}>
      <div className={`${css.modal} ${css.pickerModal}`} role="dialog" aria-label="Materials" data-testid="material-picker" onClick={(e) => e.stopPropagation()}>
        <h2>Materials</h2>
        <input autoFocus placeholder="Search: xps, concrete, batt…" value={q} onChange={(e) => setQ(e.target.value)} data-testid="material-search" className={css.search} />
        <ul className={css.materials}>
          {shown.map((m) => {
            const f = fillStyle(m.pattern as FillPattern);
            return (
              <li key={m.id}>
                <button
                  type="button"
                  className={m.id === current ? css.current : ''}
                  data-testid={`material-${m.id}`}
                  onClick={() => setError(onPick(m.id))}
                >
                  <span className={css.swatch} style={{ background: f.base, borderColor: f.edge }} />
                  <span className={css.matName}>{m.name}{m.own ? ' (this section)' : ''}</span>
                  <span className={css.matLambda}>λ {formatQuantity('conductivity', m.lambda, system)}</span>
                  <span className={css.matSource}>{m.source.lambda}</span>
                </button>
              </li>
            );
          })}
          {!shown.length && <li className={css.muted}>No material matches &lsquo;{q}&rsquo;.</li>}
        </ul>
        {error && <p className={css.fieldError} role="alert">{error}</p>}
        {making ? (
          <NewMaterial
            c={c}
            onDone={(id) => {
              setMaking(false);
              setError(onPick(id));
            }}
          />
        ) : (
          <div className={css.actions}>
            <button type="button" onClick={() => setMaking(true)} data-testid="new-material">New material…</button>
            <button type="button" onClick={onClose}>Close</button>
          </div>
        )}
      </div>
    </div>
  );
}

function NewMaterial({ c, onDone }: { c: BoardController; onDone: (id: string) => void }) {
  const { system } = useStore(c.ui);
  const [name, setName] = useState('');
  const [lambda, setLambda] = useState('');
  const [density, setDensity] = useState('');
  const [mu, setMu] = useState('');
  const [pattern, setPattern] = useState<FillPattern>('board');
  const [source, setSource] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const create = () => {
    const e: Record<string, string> = {};
    if (!name.trim()) e.name = 'give it a name';
    const l = parseQuantityField('conductivity', lambda, system, { gt: 0, max: 1000 });
    if (!l.ok) e.lambda = l.message;
    const d = parseQuantityField('density', density, system, { gt: 0, max: 25000 });
    if (!d.ok) e.density = d.message;
    let muV: number | null = null;
    if (mu.trim()) {
      const m = Number(mu);
      if (!Number.isFinite(m) || m < 1) e.mu = `must be a number of at least 1, got '${mu}'`;
      else muV = m;
    }
    if (!source.trim()) e.source = 'say where the values come from (a table, a data sheet, or "from memory")';
    setErrors(e);
    if (Object.keys(e).length || !l.ok || !d.ok) return;
    const slug = name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 40) || 'material';
    const id = `own-${slug}-${Math.random().toString(36).slice(2, 6)}`;
    const src = source.trim();
    const err = c.action(() => ops.putMaterial(c.doc, c.origin, { id, name: name.trim(), lambda: l.value, mu: muV ?? 1, sd: null, sdHumid: null, density: d.value, airOpen: pattern === 'batt', pattern, source: { lambda: src, mu: muV === null ? 'not given (taken as 1)' : src, density: src } }));
    if (err) setErrors({ form: err });
    else onDone(id);
  };
  const f = (label: string, key: string, v: string, set: (s: string) => void, hint?: string) => (
    <label className={css.field}>
      <span>{label}</span>
      <input value={v} onChange={(e) => set(e.target.value)} placeholder={hint} data-testid={`new-${key}`} aria-invalid={!!errors[key]} className={errors[key] ? css.bad : ''} />
      {errors[key] && <em className={css.fieldError} role="alert">{errors[key]}</em>}
    </label>
  );
  return (
    <div className={css.newMaterial} data-testid="new-material-form">
      <h3>New material (this section only)</h3>
      {f('Name', 'name', name, setName, 'Wood-fibre board, 160 kg/m³')}
      <div className={css.pair}>
        {f(`Conductivity (${system === 'si' ? 'W/(m·K)' : 'Btu·in/(h·ft²·°F)'})`, 'lambda', lambda, setLambda, system === 'si' ? '0.040' : '0.28')}
        {f(`Density (${system === 'si' ? 'kg/m³' : 'lb/ft³'})`, 'density', density, setDensity)}
      </div>
      <div className={css.pair}>
        {f('Vapour resistance factor μ', 'mu', mu, setMu, '1 to 100000')}
        <label className={css.field}>
          <span>Fill</span>
          <select value={pattern} onChange={(e) => setPattern(e.target.value as FillPattern)} data-testid="new-pattern">
            {FILL_PATTERNS.map((p) => <option key={p} value={p}>{p}</option>)}
          </select>
        </label>
      </div>
      {f('Source of the values', 'source', source, setSource, 'data sheet, table, or from memory')}
      {errors.form && <p className={css.fieldError} role="alert">{errors.form}</p>}
      <div className={css.actions}>
        <button type="button" onClick={create} data-testid="create-material">Create and use</button>
      </div>
    </div>
  );
}
