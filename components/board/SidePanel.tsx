'use client';
/**
 * The side panel: typed values of the selection in SI or inch-pound. A value is parsed and checked
 * at the field (lib/units and the kind's own limits); a refused value shows the reason under the
 * field and the document is not touched. It reads the settled section, so it does not re-render
 * while a drag is under way.
 */
import { memo, useDeferredValue, useEffect, useState } from 'react';
import { lookupMaterial, partParams } from '@/lib/section/resolve';
import { partKind, PART_KINDS } from '@/lib/section/registry';
import { ANCHORS, ZONE_KINDS } from '@/lib/section/schema';
import type { AnchorName, PartRecord, ZoneRecord } from '@/lib/section/schema';
import * as ops from '@/lib/section/ops';
import type { ParamSpec } from '@/lib/section/params';
import { formatLength, formatQuantity } from '@/lib/units';
import type { UnitSystem } from '@/lib/units';
import { useBoard } from './Canvas';
import type { BoardController } from './controller';
import { ZONE_TITLES } from './controller';
import { parseCoordinate, parseParamField, parseQuantityField, showParam, typicalWarning } from './fields';
import { MaterialPicker } from './MaterialPicker';
import { useStore } from './store';
import css from './board.module.css';

/** A text field that commits on Enter or leaving it; `commit` returns a message to refuse the value. */
export function ValueField({ label, value, commit, testId, warn, disabled }: { label: string; value: string; commit: (text: string) => string | null; testId?: string; warn?: string | null; disabled?: boolean }) {
  const [text, setText] = useState(value);
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    setText(value);
    setError(null);
  }, [value]);
  const done = () => {
    if (text === value) return setError(null);
    const why = commit(text);
    setError(why);
  };
  return (
    <label className={css.field}>
      <span>{label}</span>
      <input
        value={text}
        disabled={disabled}
        data-testid={testId}
        aria-invalid={!!error}
        className={error ? css.bad : ''}
        onChange={(e) => setText(e.target.value)}
        onBlur={done}
        onKeyDown={(e) => {
          if (e.key === 'Enter') done();
          if (e.key === 'Escape') {
            setText(value);
            setError(null);
          }
        }}
      />
      {error && <em className={css.fieldError} role="alert" data-testid={testId ? `${testId}-error` : undefined}>{error}</em>}
      {!error && warn && <em className={css.fieldWarn}>{warn}</em>}
    </label>
  );
}

/**
 * The panel of the selection. It reads the selection and the settled section as deferred values: a
 * click that selects a part and starts a drag is handled at once, and the panel (many fields) renders
 * after it in React's interruptible passes rather than inside the pointer event's task.
 */
export function SidePanel() {
  const c = useBoard();
  const ui = useDeferredValue(useStore(c.ui));
  const st = useDeferredValue(useStore(c.settled));
  const { parts, zones } = ui.selection;
  if (parts.length === 1 && !zones.length) {
    const p = st.snapshot.parts.find((x) => x.id === parts[0]);
    if (p) return <PartPanel key={p.id} c={c} part={p} system={ui.system} readOnly={ui.readOnly} />;
  }
  if (zones.length === 1 && !parts.length) {
    const z = st.snapshot.zones.find((x) => x.id === zones[0]);
    if (z) return <ZonePanel key={z.id} c={c} zone={z} system={ui.system} readOnly={ui.readOnly} />;
  }
  if (parts.length + zones.length > 1) return <MultiPanel c={c} readOnly={ui.readOnly} />;
  return <SectionPanel c={c} />;
}

function Actions({ c, readOnly, locked }: { c: BoardController; readOnly: boolean; locked: boolean }) {
  const ui = useStore(c.ui);
  const hasParts = ui.selection.parts.length > 0;
  return (
    <div className={css.actions}>
      {hasParts && <button type="button" disabled={readOnly} onClick={() => c.duplicateSelection()} data-testid="duplicate" title="Ctrl+D">Duplicate</button>}
      <button type="button" disabled={readOnly} onClick={() => c.deleteSelection()} data-testid="delete" title="Delete">Delete</button>
      {hasParts && (
        <>
          <button type="button" disabled={readOnly} onClick={() => c.restack('up')} title="]">Forward</button>
          <button type="button" disabled={readOnly} onClick={() => c.restack('down')} title="[">Back</button>
          <button type="button" disabled={readOnly} onClick={() => c.toggleLock()} data-testid="lock" title="L">{locked ? 'Unlock' : 'Lock'}</button>
        </>
      )}
    </div>
  );
}

const PartPanel = memo(function PartPanel({ c, part, system, readOnly }: { c: BoardController; part: PartRecord; system: UnitSystem; readOnly: boolean }) {
  const kind = partKind(part.kind)!;
  const st = useStore(c.settled);
  const [picking, setPicking] = useState<string | null>(null);
  const params = partParams(part);
  const rp = st.resolved.parts.get(part.id);
  const mat = lookupMaterial(st.resolved.materials, part.material);
  const off = readOnly || part.locked;
  const set = (patch: Record<string, unknown>) => c.updatePart(part.id, patch);
  const others = st.snapshot.parts.filter((p) => p.id !== part.id);
  const [joinTo, setJoinTo] = useState(part.join?.to ?? others[others.length - 1]?.id ?? '');
  const [anchor, setAnchor] = useState<AnchorName>(part.join?.anchor ?? 'top-left');
  const [self, setSelf] = useState<AnchorName>(part.join?.self ?? 'bottom-left');
  const nameOf = (id: string) => {
    const p = st.snapshot.parts.find((x) => x.id === id);
    return p ? p.name || partKind(p.kind)?.title || p.kind : id;
  };

  return (
    <div className={css.panel} data-testid="part-panel">
      <p className={css.kindTitle}>{kind.title}{part.locked ? ' · locked' : ''}</p>
      <ValueField label="Name" value={part.name} testId="field-name" disabled={off} commit={(t) => set({ name: t })} />
      <p className={css.muted}>{kind.label(params as never, (m) => formatLength(m, system))}</p>
      <div className={css.field}>
        <span>Material</span>
        <button type="button" className={css.materialButton} disabled={off} onClick={() => setPicking('material')} data-testid="material-button">
          {mat ? mat.name : part.material}
          {mat && <small>λ {formatQuantity('conductivity', mat.lambda, system)}</small>}
        </button>
      </div>
      {Object.entries(kind.params).map(([key, spec]) => (
        <ParamField key={key} name={key} spec={spec} value={params[key]} system={system} disabled={off} c={c} part={part} onPick={() => setPicking(key)} />
      ))}
      <h4>Position</h4>
      {part.join ? (
        <>
          <p className={css.muted} data-testid="join-info">
            Joined: its {part.join.self.replace('-', ' ')} on the {part.join.anchor.replace('-', ' ')} of {nameOf(part.join.to)}. It follows that part.
          </p>
          <div className={css.pair}>
            <ValueField label="Offset x" value={formatLength(part.join.dx, system)} disabled={off} testId="field-join-dx" commit={(t) => coord(t, system, (v) => set({ join: { ...part.join!, dx: v } }))} />
            <ValueField label="Offset y" value={formatLength(part.join.dy, system)} disabled={off} testId="field-join-dy" commit={(t) => coord(t, system, (v) => set({ join: { ...part.join!, dy: v } }))} />
          </div>
          <button type="button" disabled={off} onClick={() => c.action(() => ops.detachPart(c.doc, c.origin, part.id))}>Detach (keep it where it is)</button>
        </>
      ) : (
        <div className={css.pair}>
          <ValueField label="x" value={formatLength(rp?.origin[0] ?? part.x ?? 0, system)} disabled={off} testId="field-x" commit={(t) => coord(t, system, (v) => set({ x: v }))} />
          <ValueField label="y" value={formatLength(rp?.origin[1] ?? part.y ?? 0, system)} disabled={off} testId="field-y" commit={(t) => coord(t, system, (v) => set({ y: v }))} />
        </div>
      )}
      {others.length > 0 && (
        <details className={css.join}>
          <summary>{part.join ? 'Join to another part' : 'Join to a part'}</summary>
          <label className={css.field}>
            <span>Part</span>
            <select value={joinTo} onChange={(e) => setJoinTo(e.target.value)} disabled={off} data-testid="join-to">
              {others.map((p) => <option key={p.id} value={p.id}>{p.name || partKind(p.kind)?.title}</option>)}
            </select>
          </label>
          <div className={css.pair}>
            <label className={css.field}>
              <span>Its point</span>
              <select value={anchor} onChange={(e) => setAnchor(e.target.value as AnchorName)} disabled={off}>
                {ANCHORS.map((a) => <option key={a} value={a}>{a.replace('-', ' ')}</option>)}
              </select>
            </label>
            <label className={css.field}>
              <span>This part&apos;s point</span>
              <select value={self} onChange={(e) => setSelf(e.target.value as AnchorName)} disabled={off}>
                {ANCHORS.map((a) => <option key={a} value={a}>{a.replace('-', ' ')}</option>)}
              </select>
            </label>
          </div>
          <button type="button" disabled={off || !joinTo} data-testid="join" onClick={() => c.action(() => ops.joinPart(c.doc, c.origin, part.id, { to: joinTo, anchor, self, dx: 0, dy: 0 }))}>Join</button>
        </details>
      )}
      <Actions c={c} readOnly={readOnly} locked={part.locked} />
      {picking && (
        <MaterialPicker
          c={c}
          current={picking === 'material' ? part.material : String(params[picking])}
          onClose={() => setPicking(null)}
          onPick={(id) => {
            const err = picking === 'material' ? c.setMaterial([part.id], id) : c.updatePart(part.id, { [picking]: id });
            if (!err) setPicking(null);
            return err;
          }}
        />
      )}
    </div>
  );
});

function coord(text: string, system: UnitSystem, then: (v: number) => string | null): string | null {
  const r = parseCoordinate(text, system);
  return r.ok ? then(r.value) : r.message;
}

function ParamField({ name, spec, value, system, disabled, c, part, onPick }: { name: string; spec: ParamSpec; value: unknown; system: UnitSystem; disabled: boolean; c: BoardController; part: PartRecord; onPick: () => void }) {
  const set = (v: unknown) => c.updatePart(part.id, { [name]: v });
  switch (spec.type) {
    case 'number':
      return (
        <ValueField
          label={spec.label + (spec.quantity === 'sd' ? ' (m)' : '')}
          value={showParam(spec, value, system)}
          testId={`field-${name}`}
          disabled={disabled}
          warn={typeof value === 'number' ? typicalWarning(spec, value, system) : null}
          commit={(t) => {
            const r = parseParamField(spec, t, system);
            return r.ok ? set(r.value) : r.message;
          }}
        />
      );
    case 'choice':
      return (
        <label className={css.field}>
          <span>{spec.label}</span>
          <select value={String(value)} disabled={disabled} data-testid={`field-${name}`} onChange={(e) => set(e.target.value)}>
            {spec.options.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
          </select>
        </label>
      );
    case 'flag':
      return (
        <label className={css.check}>
          <input type="checkbox" checked={!!value} disabled={disabled} data-testid={`field-${name}`} onChange={(e) => set(e.target.checked)} />
          <span>{spec.label}</span>
        </label>
      );
    case 'material': {
      const m = lookupMaterial(c.settled.get().resolved.materials, String(value));
      return (
        <div className={css.field}>
          <span>{spec.label}</span>
          <button type="button" className={css.materialButton} disabled={disabled} onClick={onPick}>{m?.name ?? String(value)}</button>
        </div>
      );
    }
    case 'ring': {
      const n = Array.isArray(value) ? value.length - 1 : 0;
      return (
        <p className={css.muted}>
          {n} vertices. Drag a vertex to move it; drag the small circle on an edge to add one; double-click a vertex (or pick it and press Delete) to remove it.
        </p>
      );
    }
  }
}

const ZonePanel = memo(function ZonePanel({ c, zone, system, readOnly }: { c: BoardController; zone: ZoneRecord; system: UnitSystem; readOnly: boolean }) {
  const set = (patch: Partial<ZoneRecord>) => c.updateZone(zone.id, patch);
  const temp = (which: 'design' | 'month') => (t: string) => {
    const r = parseQuantityField('temperature', t, system, { min: -80, max: 100 });
    return r.ok ? set({ [which]: { ...zone[which], t: Math.round(r.value * 1e6) / 1e6 } }) : r.message;
  };
  const rh = (which: 'design' | 'month') => (t: string) => {
    if (!t.trim()) return zone.kind === 'indoor' && which === 'design' ? 'an indoor zone needs a relative humidity for the dew-point and mould checks' : set({ [which]: { ...zone[which], rh: null } });
    const r = parseQuantityField('relative-humidity', t.replace('%', ''), system, { gt: 0, max: 100 });
    return r.ok ? set({ [which]: { ...zone[which], rh: r.value } }) : r.message;
  };
  const shape = zone.shape;
  const rect = (key: 'x' | 'y' | 'width' | 'height') => (t: string) => {
    if (shape.type !== 'rect') return null;
    const r = parseCoordinate(t, system);
    if (!r.ok) return r.message;
    if ((key === 'width' || key === 'height') && !(r.value > 0)) return `must be greater than 0, got ${formatLength(r.value, system)}`;
    return set({ shape: { ...shape, [key]: r.value } });
  };
  return (
    <div className={css.panel} data-testid="zone-panel">
      <p className={css.kindTitle}>Zone · {ZONE_TITLES[zone.kind]}</p>
      <ValueField label="Name" value={zone.name} disabled={readOnly} commit={(t) => set({ name: t })} />
      <label className={css.field}>
        <span>Kind</span>
        <select value={zone.kind} disabled={readOnly} onChange={(e) => set({ kind: e.target.value as ZoneRecord['kind'] })}>
          {ZONE_KINDS.map((k) => <option key={k} value={k}>{ZONE_TITLES[k]}</option>)}
        </select>
      </label>
      {shape.type === 'rect' && (
        <>
          <div className={css.pair}>
            <ValueField label="x" value={formatLength(shape.x, system)} disabled={readOnly} commit={rect('x')} />
            <ValueField label="y" value={formatLength(shape.y, system)} disabled={readOnly} commit={rect('y')} />
          </div>
          <div className={css.pair}>
            <ValueField label="Width" value={formatLength(shape.width, system)} disabled={readOnly} testId="zone-width" commit={rect('width')} />
            <ValueField label="Height" value={formatLength(shape.height, system)} disabled={readOnly} commit={rect('height')} />
          </div>
        </>
      )}
      <h4>Design day (condensation)</h4>
      <div className={css.pair}>
        <ValueField label="Temperature" value={formatQuantity('temperature', zone.design.t, system)} disabled={readOnly} testId="zone-design-t" commit={temp('design')} />
        <ValueField label="RH %" value={zone.design.rh === null ? '' : String(zone.design.rh)} disabled={readOnly} commit={rh('design')} />
      </div>
      <h4>Coldest month (mould)</h4>
      <div className={css.pair}>
        <ValueField label="Temperature" value={formatQuantity('temperature', zone.month.t, system)} disabled={readOnly} commit={temp('month')} />
        <ValueField label="RH %" value={zone.month.rh === null ? '' : String(zone.month.rh)} disabled={readOnly} commit={rh('month')} />
      </div>
      <ValueField
        label="Surface resistance (auto, or m²K/W)"
        value={zone.rs === 'auto' ? 'auto' : String(zone.rs)}
        disabled={readOnly}
        commit={(t) => {
          if (t.trim().toLowerCase() === 'auto') return set({ rs: 'auto' });
          const r = parseQuantityField('r-value', t, 'si', { min: 0, max: 10 });
          return r.ok ? set({ rs: r.value }) : r.message;
        }}
      />
      <Actions c={c} readOnly={readOnly} locked={false} />
    </div>
  );
});

const MultiPanel = memo(function MultiPanel({ c, readOnly }: { c: BoardController; readOnly: boolean }) {
  const ui = useStore(c.ui);
  const st = useStore(c.settled);
  const [picking, setPicking] = useState(false);
  const parts = st.snapshot.parts.filter((p) => ui.selection.parts.includes(p.id));
  const locked = parts.length > 0 && parts.every((p) => p.locked);
  return (
    <div className={css.panel} data-testid="multi-panel">
      <p className={css.kindTitle}>
        {ui.selection.parts.length} part{ui.selection.parts.length === 1 ? '' : 's'}
        {ui.selection.zones.length ? `, ${ui.selection.zones.length} zone${ui.selection.zones.length === 1 ? '' : 's'}` : ''} selected
      </p>
      <ul className={css.list}>
        {parts.map((p) => <li key={p.id}>{p.name || partKind(p.kind)?.title}{p.locked ? ' (locked)' : ''}</li>)}
      </ul>
      {parts.length > 0 && <button type="button" disabled={readOnly} onClick={() => setPicking(true)}>Material for all…</button>}
      <Actions c={c} readOnly={readOnly} locked={locked} />
      {picking && <MaterialPicker c={c} current="" onClose={() => setPicking(false)} onPick={(id) => { const e = c.setMaterial(ui.selection.parts, id); if (!e) setPicking(false); return e; }} />}
    </div>
  );
});

const SectionPanel = memo(function SectionPanel({ c }: { c: BoardController }) {
  const st = useStore(c.settled);
  const { system } = useStore(c.ui);
  const s = st.snapshot;
  const b = st.resolved.bounds;
  return (
    <div className={css.panel} data-testid="section-panel">
      <p className={css.kindTitle}>Section</p>
      <p>{s.parts.length} parts, {s.zones.length} zones{s.parts.length ? `, ${formatLength(b.maxX - b.minX, system)} × ${formatLength(b.maxY - b.minY, system)}` : ''}.</p>
      {s.description && <p className={css.muted}>{s.description}</p>}
      <h4>Getting started</h4>
      <ol className={css.steps}>
        <li>Pick a part in the palette, then click on the board to place it (or drag it over).</li>
        <li>Drag it to move it; it snaps to other parts&apos; edges and to the grid.</li>
        <li>Drag its square handles to resize, or type sizes here, as <code>50 mm</code>, <code>2 in</code>, <code>5-1/2&quot;</code> or <code>1&apos; 6&quot;</code>.</li>
        <li>Join it to a part so it follows: a wall on a footing, a plate on a wall.</li>
        <li>Add zones for the indoor air, outdoor air and the ground surface.</li>
      </ol>
      <p className={css.muted}>Press <kbd>?</kbd> for every shortcut. Kinds: {PART_KINDS.length}.</p>
    </div>
  );
});
