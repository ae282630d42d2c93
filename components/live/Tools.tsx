'use client';
/**
 * The readout's tools: the probe (what is under the pointer), the cut lines with their temperature
 * charts, and the psi settings (dimension convention and flanking lengths). Every number through lib/units.
 */
import { useMemo, useRef } from 'react';
import { useBoard } from '@/components/board/Canvas';
import { ValueField } from '@/components/board/SidePanel';
import { parseCoordinate } from '@/components/board/fields';
import { useStore, useStoreFields } from '@/components/board/store';
import { lookupMaterial } from '@/lib/section/resolve';
import * as ops from '@/lib/section/ops';
import { newId } from '@/lib/section/ids';
import type { AnalysisSettings, CutRecord } from '@/lib/section/schema';
import type { UnitSystem } from '@/lib/units';
import { formatLength, formatQuantity } from '@/lib/units';
import { chartPaths, cutProfile, profileRange } from './cutline';
import type { ProbeReading } from './probe';
import { probeAt } from './probe';
import type { LiveSession } from './session';

const box: React.CSSProperties = { borderTop: '1px solid #ddd6ca', padding: '8px 10px', fontSize: 12, lineHeight: 1.45 };
const CUT = '#5b3f8c';
/** The probe and the cut charts read the field and results only, not the solver's progress. */
const FIELD = ['field', 'results'] as const;
const CHARTED = ['field', 'stale'] as const;

/** The probe: the pointer over the section shows temperature and material; over a verdict surface its figures too. */
export function Probe({ live, sys }: { live: LiveSession; sys: UnitSystem }) {
  const c = useBoard();
  const spot = useStore(c.pointer);
  const st = useStoreFields(live.state, FIELD);
  // The settled section: during a drag the probe holds still, so the page does no layout on every move.
  const section = useStore(c.settled);
  const held = useRef<ProbeReading | null>(null);
  const reading = useMemo(() => {
    if (c.isDragging()) return held.current;
    if (!spot) return null;
    const tol = (spot.pointerType === 'touch' ? 14 : 6) / c.view.get().k;
    return (held.current = probeAt(section.resolved.solids, st.field, st.results?.surfaces ?? [], spot.w[0], spot.w[1], tol));
  }, [spot, st.field, st.results, section, c]);
  return (
    <div style={box} data-testid="live-probe" aria-live="polite">
      <strong>Probe</strong>{' '}
      {!reading ? (
        <span style={{ color: '#555' }}>point at the section</span>
      ) : (
        <>
          <span style={{ color: '#555' }}>x {formatLength(reading.at[0], sys)}, y {formatLength(reading.at[1], sys)}</span>
          <div>
            Temperature (design day, surface run): <strong data-testid="probe-t">{reading.t === null ? '–' : formatQuantity('temperature', reading.t, sys, 2)}</strong>
          </div>
          <div>
            Material: <strong data-testid="probe-material">{reading.materialId ? lookupMaterial(section.resolved.materials, reading.materialId)?.name ?? reading.materialId : reading.partId ? '–' : 'no solid here'}</strong>
            {reading.materialId && (() => {
              const m = lookupMaterial(section.resolved.materials, reading.materialId);
              return m ? <span style={{ color: '#555' }}> · λ {formatQuantity('conductivity', m.lambda, sys)}</span> : null;
            })()}
          </div>
          {reading.segment && (
            <div data-testid="probe-surface">
              {reading.segment.kind === 'hidden' ? 'Hidden surface' : 'Surface'}: {reading.segment.state}; surface RH up to <strong data-testid="probe-rh">{(reading.segment.rhSurfaceMax * 100).toFixed(1)} %</strong> (coldest month), coldest <strong data-testid="probe-tmin">{formatQuantity('temperature', reading.segment.tMin, sys, 2)}</strong> (design day)
            </div>
          )}
        </>
      )}
    </div>
  );
}

const W = 250, H = 110;

function CutChart({ cut, live, sys }: { cut: CutRecord; live: LiveSession; sys: UnitSystem }) {
  const c = useBoard();
  const st = useStoreFields(live.state, CHARTED);
  const section = useStore(c.settled);
  const profile = useMemo(() => (st.field ? cutProfile(st.field, section.resolved.solids, cut.from, cut.to) : null), [st.field, section, cut]);
  if (!profile) return <p style={{ color: '#555' }}>Waiting for results…</p>;
  const range = profileRange(profile);
  if (!range) return <p data-testid="cut-chart-empty">This cut crosses no solid.</p>;
  const pad = Math.max(0.5, (range.hi - range.lo) * 0.05);
  const r = { lo: range.lo - pad, hi: range.hi + pad };
  const X = (s: number) => (s / profile.length) * W;
  const solidLayers = profile.layers.filter((l) => l.partId);
  return (
    <div data-testid="cut-chart" data-stale={st.stale ? 'yes' : 'no'}>
      <svg width={W + 44} height={H + 30} role="img" aria-label={`Temperature along ${cut.name || 'the cut'}`} style={{ display: 'block', background: '#fff', border: '1px solid #e4ded3' }}>
        <g transform="translate(38,6)">
          {profile.layers.map((l, i) => (i > 0 ? <line key={`b${i}`} x1={X(l.s0)} x2={X(l.s0)} y1={0} y2={H} stroke="#b8b0a3" strokeDasharray="3 2" data-testid="cut-boundary" /> : null))}
          {chartPaths(profile, W, H, r).map((pts, i) => <polyline key={i} points={pts} fill="none" stroke={CUT} strokeWidth={1.6} />)}
          <line x1={0} x2={0} y1={0} y2={H} stroke="#888" />
          <line x1={0} x2={W} y1={H} y2={H} stroke="#888" />
          <text x={-4} y={8} fontSize={9} textAnchor="end">{formatQuantity('temperature', r.hi, sys, 0)}</text>
          <text x={-4} y={H} fontSize={9} textAnchor="end">{formatQuantity('temperature', r.lo, sys, 0)}</text>
          <text x={W} y={H + 14} fontSize={9} textAnchor="end">{formatLength(profile.length, sys)}</text>
          <text x={0} y={H + 14} fontSize={9}>0</text>
        </g>
      </svg>
      <div>
        Along the cut: <strong data-testid="cut-min">{formatQuantity('temperature', range.lo, sys, 2)}</strong> to <strong data-testid="cut-max">{formatQuantity('temperature', range.hi, sys, 2)}</strong>
      </div>
      <table style={{ width: '100%', fontSize: 11 }} data-testid="cut-layers">
        <tbody>
          {solidLayers.map((l, i) => (
            <tr key={i}>
              <td>{lookupMaterial(section.resolved.materials, l.materialId!)?.name ?? l.materialId}</td>
              <td align="right" data-testid="cut-layer-length">{formatLength(l.s1 - l.s0, sys)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** Saved cut lines: draw one, pick one to chart, delete one, or use it as a flanking element's reference cut. */
export function Cuts({ live, sys }: { live: LiveSession; sys: UnitSystem }) {
  const c = useBoard();
  const ui = useStore(c.ui);
  const st = useStore(c.settled);
  const cuts = st.snapshot.cuts;
  const active = cuts.find((x) => x.id === ui.activeCut) ?? null;
  const drawing = ui.tool.type === 'cut';
  return (
    <div style={box} data-testid="live-cuts">
      <strong>Cut lines</strong>{' '}
      <button type="button" disabled={ui.readOnly} aria-pressed={drawing} onClick={() => c.setTool(drawing ? { type: 'select' } : { type: 'cut' })} data-testid="cut-tool" title="C">
        {drawing ? 'Drawing… (Esc)' : 'Draw a cut line'}
      </button>
      {cuts.length > 0 && (
        <ul style={{ listStyle: 'none', padding: 0, margin: '6px 0' }}>
          {cuts.map((cut) => (
            <li key={cut.id} style={{ display: 'flex', gap: 6, alignItems: 'center' }}>
              <label style={{ flex: 1 }}>
                <input type="radio" name="active-cut" checked={ui.activeCut === cut.id} onChange={() => c.patchUi({ activeCut: cut.id })} data-testid={`cut-pick-${cut.id}`} /> {cut.name || 'cut'}
              </label>
              <button type="button" disabled={ui.readOnly} onClick={() => c.deleteCut(cut.id)} data-testid={`cut-delete-${cut.id}`} aria-label={`Delete ${cut.name || 'cut'}`}>Delete</button>
            </li>
          ))}
        </ul>
      )}
      {active && <CutChart cut={active} live={live} sys={sys} />}
      {active && (
        <button type="button" disabled={ui.readOnly} data-testid="cut-to-flanking" onClick={() => c.action(() => ops.setAnalysis(c.doc, c.origin, { flanking: [...st.snapshot.analysis.flanking, { id: newId('f'), name: active.name || 'flanking element', from: active.from, to: active.to, length: 1 }] }))}>
          Use as a flanking element (psi)
        </button>
      )}
    </div>
  );
}

const CONVENTIONS: { value: AnalysisSettings['convention']; label: string }[] = [
  { value: 'internal', label: 'internal' },
  { value: 'overall-internal', label: 'overall internal' },
  { value: 'external', label: 'external' },
];

/** psi settings: the dimension convention and each flanking element's length l_j under it. */
export function PsiSettings({ sys }: { sys: UnitSystem }) {
  const c = useBoard();
  const ui = useStore(c.ui);
  const st = useStore(c.settled);
  const an = st.snapshot.analysis;
  const setFlanking = (i: number, patch: Partial<AnalysisSettings['flanking'][number]>) =>
    c.action(() => ops.setAnalysis(c.doc, c.origin, { flanking: an.flanking.map((f, j) => (j === i ? { ...f, ...patch } : f)) }), { quiet: true });
  return (
    <div style={box} data-testid="live-psi-settings">
      <strong>psi settings</strong>
      <label style={{ display: 'block' }}>
        Dimension convention{' '}
        <select value={an.convention} disabled={ui.readOnly} data-testid="live-convention" onChange={(e) => c.action(() => ops.setAnalysis(c.doc, c.origin, { convention: e.target.value as AnalysisSettings['convention'] }))}>
          {CONVENTIONS.map((x) => <option key={x.value} value={x.value}>{x.label}</option>)}
        </select>
      </label>
      {an.flanking.length === 0 ? (
        <p style={{ color: '#555', margin: '4px 0' }}>No flanking elements: draw a cut line through a flanking wall or floor and use it as one to get psi.</p>
      ) : (
        an.flanking.map((f, i) => (
          <div key={f.id} style={{ display: 'flex', gap: 6, alignItems: 'end' }}>
            <ValueField label={`${f.name || 'flanking'}: length l (${an.convention})`} value={formatLength(f.length, sys)} disabled={ui.readOnly} testId={`flanking-length-${i}`}
              commit={(t) => {
                const r = parseCoordinate(t, sys);
                if (!r.ok) return r.message;
                if (r.value < 0) return `must be at least 0, got ${formatLength(r.value, sys)}`;
                return setFlanking(i, { length: Math.round(r.value * 1e6) / 1e6 });
              }} />
            <button type="button" disabled={ui.readOnly} onClick={() => c.action(() => ops.setAnalysis(c.doc, c.origin, { flanking: an.flanking.filter((_, j) => j !== i) }))} data-testid={`flanking-delete-${i}`}>Remove</button>
          </div>
        ))
      )}
    </div>
  );
}
