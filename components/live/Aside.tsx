'use client';
/** The side column: legend, readout, conditions, compare and the caution. Every number goes through lib/units. */
import { memo, useDeferredValue, useState } from 'react';
import { useBoard } from '@/components/board/Canvas';
import { useStore, useStoreFields } from '@/components/board/store';
import { Caution } from '@/components/Caution';
import * as ops from '@/lib/section/ops';
import type { ZoneRecord } from '@/lib/section/schema';
import type { UnitSystem } from '@/lib/units';
import { formatQuantity, parseTemperature } from '@/lib/units';
import { buildLut, colourOf, rangeOf } from './colour';
import { diffResults, headline, signed } from './diff';
import type { LiveOptions } from './options';
import { SEGMENT_STYLES } from './segments';
import type { Baseline, LiveSession, LiveState } from './session';
import type { BoardController } from '@/components/board/controller';
import { Cuts, Probe, PsiSettings } from './Tools';

const LUT = buildLut();
const box: React.CSSProperties = { borderTop: '1px solid #ddd6ca', padding: '8px 10px', fontSize: 12, lineHeight: 1.45 };
const row: React.CSSProperties = { display: 'flex', justifyContent: 'space-between', gap: 8 };

function Row({ label, value, id }: { label: string; value: string; id?: string }) {
  return (
    <div style={row}>
      <span>{label}</span>
      <strong data-testid={id}>{value}</strong>
    </div>
  );
}

/**
 * The readout reads the results as a deferred value: a result from the worker is drawn on the board in
 * the message's task, and the readout (many rows, a layout of the side column) renders after it in
 * React's interruptible passes, so a drag's main-thread tasks stay short. The parts that do not depend
 * on the results are memoised and do not render with every result.
 */
export function LiveAside({ live, options }: { live: LiveSession; options: LiveOptions }) {
  const c = useBoard();
  const st = useDeferredValue(useStoreFields(live.state, READOUT));
  const { system: sys } = useDeferredValue(useStoreFields(c.ui, SYSTEM));
  const opt = useStore(options);
  const base = useStore(live.baseline);
  return <Readout c={c} live={live} options={options} st={st} sys={sys} opt={opt} base={base} />;
}

const SYSTEM = ['system'] as const;

const Readout = memo(function Readout({ c, live, options, st, sys, opt, base }: { c: BoardController; live: LiveSession; options: LiveOptions; st: Pick<LiveState, (typeof READOUT)[number]>; sys: UnitSystem; opt: ReturnType<LiveOptions['get']>; base: Baseline | null }) {
  const r = st.results;
  const q = (k: Parameters<typeof formatQuantity>[0], v: number | null | undefined, d?: number) => (v === null || v === undefined || !Number.isFinite(v) ? '–' : formatQuantity(k, v, sys, d));
  const h = r ? headline(r) : null;
  const indoor = r?.zones.find((z) => z.id === r.indoorZoneId);
  const coldSeg = r?.coldest ? r.surfaces.find((s) => s.id === r.coldest!.segmentId) : null;
  const coldPart = coldSeg ? c.section.get().resolved.parts.get(coldSeg.partId) : null;
  return (
    <section data-testid="live-readout" data-stale={st.stale ? 'yes' : 'no'} data-version={st.version} aria-label="Heat-flow results">
      <div style={{ ...box, display: 'flex', gap: 6, flexWrap: 'wrap', alignItems: 'center' }}>
        <strong style={{ marginRight: 'auto' }}>Heat flow</strong>
        <Status live={live} />
      </div>
      <div style={box}>
        <label><input type="checkbox" checked={opt.colours} onChange={(e) => options.set({ ...opt, colours: e.target.checked })} data-testid="live-colours" /> temperature colours</label>{' '}
        <label><input type="checkbox" checked={opt.isotherms} onChange={(e) => options.set({ ...opt, isotherms: e.target.checked })} /> isotherms every </label>
        <select value={opt.step} onChange={(e) => options.set({ ...opt, step: Number(e.target.value) })} aria-label="Isotherm interval">
          {[0.5, 1, 2, 5].map((s) => <option key={s} value={s}>{sys === 'si' ? `${s} K` : `${(s * 1.8).toFixed(1)} °F`}</option>)}
        </select>{' '}
        <label><input type="checkbox" checked={opt.flow} onChange={(e) => options.set({ ...opt, flow: e.target.checked })} /> flow direction</label>
        {r?.conditions && <Legend lo={rangeOf(r.zones.filter((z) => z.touches).map((z) => z.design.t)).lo} hi={rangeOf(r.zones.filter((z) => z.touches).map((z) => z.design.t)).hi} dew={r.conditions.design.dewPoint} mould={r.conditions.month.mouldLimit} sys={sys} />}
      </div>
      {r && (
        <div style={box}>
          <Row label="Verdict" value={r.verdict} id="live-verdict" />
          <Row label={`Heat flow from ${indoor?.name || 'indoor'}`} value={q('heat-flow-per-length', indoor?.phi)} id="live-phi" />
          <Row label="L2D" value={q('psi', r.l2d)} id="live-l2d" />
          {r.psi && <Row label={`psi (${r.psi.convention} dimensions)`} value={q('psi', r.psi.psi)} id="live-psi" />}
          {r.psiGround && <Row label="psi_g (ISO 13370 ground)" value={q('psi', r.psiGround.psiG)} id="live-psig" />}
          <Row label="Coldest surface" value={q('temperature', r.coldest?.t, 2)} id="live-coldest" />
          <div style={{ color: '#555' }}>{coldSeg ? `${coldSeg.kind === 'hidden' ? 'hidden surface, ' : ''}${coldPart?.record.name || coldSeg.partId} at x ${q('length', r.coldest!.at[0])}, y ${q('length', r.coldest!.at[1])}` : ''}</div>
          <Row label="fRsi / fRsi,min" value={`${r.coldest?.fRsi != null ? r.coldest.fRsi.toFixed(3) : 'n/a'} / ${r.conditions?.month.fRsiMin != null ? r.conditions.month.fRsiMin.toFixed(3) : 'n/a'}`} id="live-frsi" />
          {r.coldest && r.coldest.fRsi === null && <div style={{ color: '#555' }}>More than two zones: fRsi is not defined; weights {Object.entries(r.coldest.weights).map(([k, w]) => `${k} ${w.toFixed(2)}`).join(', ')}</div>}
          <Row label="Dew point (design day)" value={q('temperature', r.conditions?.design.dewPoint)} id="live-dew" />
          <Row label="Mould limit (coldest month)" value={q('temperature', r.conditions?.month.mouldLimit)} id="live-mould" />
          <Row label="Energy balance" value={r.energyBalance.toExponential(1)} id="live-balance" />
          <Row label="Mesh" value={`${r.mesh.level}, ${r.mesh.cells} cells`} id="live-cells" />
          <Row label="Solve time" value={`${st.lastMs.toFixed(0)} ms`} id="live-ms" />
          <MemoSegmentKey />
          <details>
            <summary>Assumptions ({r.assumptions.length}){r.warnings.length ? `, ${r.warnings.length} warnings` : ''}</summary>
            <ul style={{ paddingLeft: 16 }}>
              {r.warnings.map((w, i) => <li key={`w${i}`} style={{ color: '#8a2c00' }}>{w}</li>)}
              {r.assumptions.map((a, i) => <li key={i}><strong>{a.topic}:</strong> {a.text} <em>({a.source})</em></li>)}
            </ul>
          </details>
          <Caution compact />
        </div>
      )}
      <MemoProbe live={live} sys={sys} />
      <MemoCuts live={live} sys={sys} />
      <MemoPsiSettings sys={sys} />
      <div style={box}>
        <strong>Compare</strong>{' '}
        <button type="button" onClick={() => live.pinBaseline()} disabled={!r} data-testid="live-pin">Pin as baseline</button>{' '}
        {base && <button type="button" onClick={() => c.action(() => ops.replaceSection(c.doc, c.origin, base.snapshot))} data-testid="live-restore">Restore baseline</button>}
        {base && r && h && (() => {
          const d = diffResults(base.results, r);
          return (
            <div data-testid="live-compare">
              {d.psi !== null && <Row label="psi change" value={`${signed(d.psi, 4)} W/(m·K)`} />}
              {d.coldest !== null && <Row label="coldest surface change" value={`${signed(d.coldest, 2)} K`} />}
              {d.phi !== null && <Row label="heat flow change" value={`${signed(d.phi, 2)} W/m`} />}
            </div>
          );
        })()}
      </div>
      <MemoConditions sys={sys} />
    </section>
  );
});

const MemoProbe = memo(Probe);
const MemoCuts = memo(Cuts);
const MemoPsiSettings = memo(PsiSettings);

/** What the readout shows; the solver's progress (busy) is read by the status line alone. */
const READOUT = ['results', 'stale', 'version', 'lastMs'] as const;
const STATUS = ['busy', 'error', 'stopped', 'stale', 'results', 'mesh'] as const;

/** The solver's state: re-rendered on every progress message, and nothing else is. */
function Status({ live }: { live: LiveSession }) {
  const st = useStoreFields(live.state, STATUS);
  return (
    <>
      <span data-testid="live-status" style={{ color: st.stale ? '#8a4b00' : '#2b6a4a' }}>
        {st.error ? `Solver: ${st.error}` : st.busy ? `solving (${st.busy.mesh}) ${(st.busy.elapsedMs / 1000).toFixed(1)} s` : st.stopped ? 'stopped' : st.stale ? 'stale' : st.results ? `up to date (${st.mesh} mesh)` : 'waiting'}
      </span>
      {st.busy ? <button type="button" onClick={() => live.stop()} data-testid="live-stop">Stop</button> : st.stopped ? <button type="button" onClick={() => live.resume()}>Solve</button> : null}
    </>
  );
}

const MemoSegmentKey = memo(function SegmentKey() {
  return (
    <div style={{ margin: '6px 0' }}>
      {Object.entries(SEGMENT_STYLES).map(([k, s]) => (
        <div key={k} style={{ display: 'flex', alignItems: 'center', gap: 6 }}>
          <svg width="34" height="10"><line x1="1" y1="5" x2="33" y2="5" stroke={s.stroke} strokeWidth={s.width} strokeDasharray={s.dash.join(' ')} strokeLinecap={k === 'condensation' ? 'round' : 'butt'} /></svg>
          <span>{s.label}</span>
        </div>
      ))}
      <div style={{ color: '#555' }}>Hollow glyph: a hidden surface, judged as if indoor air reaches it.</div>
    </div>
  );
});

function Legend({ lo, hi, dew, mould, sys }: { lo: number; hi: number; dew: number | null; mould: number | null; sys: UnitSystem }) {
  const r = { lo, hi };
  const stops = Array.from({ length: 11 }, (_, i) => colourOf(lo + ((hi - lo) * i) / 10, r, LUT)).join(', ');
  const pos = (t: number) => `${Math.max(0, Math.min(100, ((t - lo) / (hi - lo)) * 100))}%`;
  return (
    <div data-testid="live-legend" style={{ position: 'relative', margin: '8px 0 22px' }}>
      <div style={{ height: 12, background: `linear-gradient(to right, ${stops})`, borderRadius: 2 }} />
      <span style={{ position: 'absolute', left: 0, top: 14 }}>{formatQuantity('temperature', lo, sys, 0)}</span>
      <span style={{ position: 'absolute', right: 0, top: 14 }}>{formatQuantity('temperature', hi, sys, 0)}</span>
      {dew !== null && <Tick at={pos(dew)} label={`dew ${formatQuantity('temperature', dew, sys)}`} colour={SEGMENT_STYLES.condensation.stroke} />}
      {mould !== null && <Tick at={pos(mould)} label={`mould ${formatQuantity('temperature', mould, sys)}`} colour={SEGMENT_STYLES['mould risk'].stroke} up />}
    </div>
  );
}

function Tick({ at, label, colour, up = false }: { at: string; label: string; colour: string; up?: boolean }) {
  return (
    <span style={{ position: 'absolute', left: at, top: up ? -14 : 0, transform: 'translateX(-1px)', fontSize: 10, color: colour, whiteSpace: 'nowrap' }}>
      <span style={{ display: 'inline-block', width: 2, height: up ? 26 : 12, background: colour, verticalAlign: 'top', marginTop: up ? 0 : 0 }} /> {label}
    </span>
  );
}

/** Example conditions of our own: not code or design values. */
const PRESETS: { name: string; indoor: [number, number, number, number]; outdoor: [number, number]; ground: [number, number] }[] = [
  { name: 'Example: mild coastal', indoor: [20, 50, 20, 55], outdoor: [-5, 5], ground: [6, 7] },
  { name: 'Example: cold inland', indoor: [20, 40, 20, 50], outdoor: [-18, -6], ground: [4, 2] },
  { name: 'Example: very cold, humid room', indoor: [21, 55, 21, 60], outdoor: [-30, -15], ground: [2, 0] },
];

const MemoConditions = memo(function Conditions({ sys }: { sys: UnitSystem }) {
  const c = useBoard();
  const st = useStore(c.settled);
  const zones = st.snapshot.zones;
  const set = (z: ZoneRecord, which: 'design' | 'month', patch: Partial<ZoneRecord['design']>) => c.updateZone(z.id, { [which]: { ...z[which], ...patch } });
  const preset = (i: number) => {
    const p = PRESETS[i];
    c.action(() => {
      for (const z of zones) {
        if (z.kind === 'indoor') ops.updateZone(c.doc, c.origin, z.id, { design: { t: p.indoor[0], rh: p.indoor[1] }, month: { t: p.indoor[2], rh: p.indoor[3] } });
        else if (z.kind === 'outdoor') ops.updateZone(c.doc, c.origin, z.id, { design: { t: p.outdoor[0], rh: z.design.rh }, month: { t: p.outdoor[1], rh: z.month.rh } });
        else if (z.kind === 'ground-surface') ops.updateZone(c.doc, c.origin, z.id, { design: { t: p.ground[0], rh: z.design.rh }, month: { t: p.ground[1], rh: z.month.rh } });
      }
    });
  };
  return (
    <div style={box} data-testid="live-conditions">
      <strong>Conditions</strong>
      <div>
        <select defaultValue="" onChange={(e) => e.target.value !== '' && preset(Number(e.target.value))} aria-label="Example conditions">
          <option value="" disabled>Example conditions (not code values)…</option>
          {PRESETS.map((p, i) => <option key={p.name} value={i}>{p.name}</option>)}
        </select>
      </div>
      <table style={{ width: '100%', fontSize: 12 }}>
        <thead><tr><th align="left">Zone</th><th>Design day</th><th>Coldest month</th></tr></thead>
        <tbody>
          {zones.map((z) => (
            <tr key={z.id}>
              <td>{z.name || z.kind}</td>
              {(['design', 'month'] as const).map((w) => (
                <td key={w}>
                  <TempInput key={`${z.id}-${w}-${z[w].t}-${sys}`} value={z[w].t} sys={sys} onCommit={(t) => set(z, w, { t })} label={`${z.name || z.kind} ${w} temperature`} />
                  {z.kind === 'indoor' || z[w].rh !== null ? (
                    <input key={`${z.id}-${w}-rh-${z[w].rh}`} defaultValue={z[w].rh ?? ''} size={3} aria-label={`${z.name || z.kind} ${w} RH`} onBlur={(e) => { const v = e.target.value.trim(); const n = v === '' ? null : Number(v.replace('%', '')); if (n === null || Number.isFinite(n)) set(z, w, { rh: n }); }} onKeyDown={(e) => e.key === 'Enter' && (e.target as HTMLInputElement).blur()} />
                  ) : null}
                  {z.kind === 'indoor' || z[w].rh !== null ? ' %' : ''}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
});

function TempInput({ value, sys, onCommit, label }: { value: number; sys: UnitSystem; onCommit: (t: number) => void; label: string }) {
  const [text, setText] = useState(formatQuantity('temperature', value, sys));
  return (
    <input value={text} size={7} aria-label={label} onChange={(e) => setText(e.target.value)} onKeyDown={(e) => e.key === 'Enter' && (e.target as HTMLInputElement).blur()}
      onBlur={() => { try { const t = parseTemperature(text, sys); if (Math.abs(t - value) > 1e-9) onCommit(t); } catch { setText(formatQuantity('temperature', value, sys)); } }} />
  );
}

