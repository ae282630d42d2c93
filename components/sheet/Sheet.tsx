/**
 * The builder's sheet: one printable page set for a section and its results. Pure presentation over
 * the snapshot, the results of solveSection (the same code path as `dewline solve`) and the Glaser
 * outcomes. Every headline number is also on a data- attribute at full precision, for tests.
 */
import { Caution } from '@/components/Caution';
import { glaserChartSvg } from '@/lib/render/glaser-chart';
import { renderSectionSvg } from '@/lib/render/svg';
import type { CutOutcome } from '@/lib/moisture/cut';
import type { Material } from '@/lib/materials/material';
import { resolveSection } from '@/lib/section/resolve';
import type { SectionSnapshot } from '@/lib/section/schema';
import type { SectionResults, SurfaceState } from '@/lib/thermal/types';
import { formatLength, formatQuantity, type UnitSystem } from '@/lib/units';

export interface SheetMeta {
  /** Where the section came from: a template name, "file", or the room. */
  source: string;
  roomName: string | null;
  /** Date of the sheet, ISO yyyy-mm-dd (UTC). */
  date: string;
  /** Changes recorded in the document (sum of its Yjs state vector). */
  revision: number;
  units: UnitSystem;
  paper: 'a4' | 'letter';
}

const STATE_TEXT: Record<SurfaceState, string> = { fine: 'fine', 'mould risk': 'mould risk (surface RH ≥ 80 % at the coldest-month mean)', condensation: 'condensation (below the design-day dew point)' };
const STATE_MARK: Record<SurfaceState, string> = { fine: '○', 'mould risk': '◇', condensation: '✕' };

/**
 * Drawing scale for the page: the largest common scale (smallest N) at which the drawing fits 160 mm wide and
 * 175 mm high, so that with its 2 x 6.35 mm padding it stays inside the printable width of A4 and Letter
 * (186 mm with 12 mm margins) and prints at true scale.
 */
export function sheetScale(width: number, height: number): number {
  for (const n of [5, 10, 20, 25, 50, 100, 200]) if ((width * 1000) / n <= 160 && (height * 1000) / n <= 175) return n;
  return 500;
}

export const SHEET_CAUTIONS = [
  'This sheet is a screening aid for steady two-dimensional heat flow under the stated conditions, not a design approval.',
  'Frost protection of footings and shallow foundations: local codes govern.',
  'Radon and soil gas control: local codes and licensed professionals govern.',
  'Foam plastic insulation left exposed inside a building needs a thermal barrier or ignition barrier as local codes require.',
  'Drainage, damp-proofing and waterproofing are not checked here; follow local codes and manufacturers\' instructions.',
  'Structure (footings, walls, anchorage, bearing of insulation under load) is outside this check: licensed professionals govern.',
  'Mould and condensation also depend on air leakage, moisture sources, built-in moisture and time.',
];

export function Sheet({ snapshot, results, glaser, meta }: { snapshot: SectionSnapshot; results: SectionResults; glaser: CutOutcome[]; meta: SheetMeta }) {
  const u = meta.units;
  const T = (t: number | null | undefined) => (t === null || t === undefined ? 'n/a' : formatQuantity('temperature', t, u));
  const resolved = resolveSection(snapshot);
  const box = resolved.bounds;
  const draft = renderSectionSvg(snapshot, results, { scale: 10, units: u });
  const scale = sheetScale(draft.box.maxX - draft.box.minX, draft.box.maxY - draft.box.minY);
  const drawing = scale === 10 ? draft : renderSectionSvg(snapshot, results, { scale, units: u });
  const used = new Map<string, Material>();
  for (const s of resolved.solids) {
    const m = resolved.materials.get(s.materialId);
    if (m && !used.has(m.id)) used.set(m.id, m);
  }
  const parts = snapshot.parts;
  const c = results.conditions;
  const zoneName = (id: string) => results.zones.find((z) => z.id === id)?.name || id;
  const verdictNote = results.verdict === 'fine' ? 'No verdict surface is at risk under the stated conditions.' : `At least one surface shows ${results.verdict}.`;
  return (
    <article className={`sheet sheet-${meta.paper}`} data-testid="sheet" data-ready="yes" data-verdict={results.verdict}>
      <header className="sheet-head">
        <div>
          <h1 data-testid="sheet-name">{snapshot.name}</h1>
          {snapshot.description && <p className="sheet-desc">{snapshot.description}</p>}
        </div>
        <dl className="sheet-meta">
          <dt>Room</dt><dd data-testid="sheet-room">{meta.roomName ?? '(not shared)'}</dd>
          <dt>Source</dt><dd>{meta.source}</dd>
          <dt>Date</dt><dd data-testid="sheet-date">{meta.date}</dd>
          <dt>Revision</dt><dd data-testid="sheet-revision" data-revision={meta.revision}>{meta.revision}</dd>
        </dl>
      </header>
      <Caution compact />

      <section className="sheet-block">
        <h2>Section drawing</h2>
        <figure className="sheet-drawing" data-testid="sheet-drawing" data-scale={scale} dangerouslySetInnerHTML={{ __html: drawing.svg }} />
        <p className="sheet-small">Scale 1:{scale} when printed at 100 %. Model extent {formatLength(box.maxX - box.minX, u)} × {formatLength(box.maxY - box.minY, u)}; the drawing shows the junction. Colours: design-day temperatures from the surface-temperature run; white lines: isotherms every 2 K.</p>
        <h3>Main parts</h3>
        <table className="sheet-table" data-testid="sheet-parts">
          <thead><tr><th>Part</th><th>Kind</th><th>Material</th><th>Size</th></tr></thead>
          <tbody>
            {parts.filter((p) => p.kind !== 'soil').map((p) => {
              const b = resolved.parts.get(p.id)?.box;
              const m = resolved.materials.get(p.material);
              return <tr key={p.id}><td>{p.name || p.id}</td><td>{p.kind}</td><td>{m?.name ?? p.material}</td><td>{b ? `${formatLength(b.maxX - b.minX, u)} × ${formatLength(b.maxY - b.minY, u)}` : ''}</td></tr>;
            })}
          </tbody>
        </table>
      </section>

      <section className="sheet-block">
        <h2>Materials</h2>
        <table className="sheet-table" data-testid="sheet-materials">
          <thead><tr><th>Material</th><th>λ</th><th>μ or sd</th><th>Source (λ; vapour)</th></tr></thead>
          <tbody>
            {[...used.values()].map((m) => (
              <tr key={m.id} data-material={m.id}>
                <td>{m.name}</td>
                <td>{formatQuantity('conductivity', m.lambda, u)}</td>
                <td>{m.sd !== null ? `sd ${m.sd} m${m.sdHumid !== null ? ` (winter; humid season ${m.sdHumid} m)` : ''}` : m.mu !== null ? `μ ${m.mu}` : 'n/a'}</td>
                <td className="sheet-small">{m.source.lambda}; {m.source.mu}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      <section className="sheet-block">
        <h2>Conditions</h2>
        <table className="sheet-table" data-testid="sheet-conditions">
          <thead><tr><th>Zone</th><th>Kind</th><th>Design day</th><th>Coldest-month mean</th><th>Surface resistance (heat flow; surface temperature)</th></tr></thead>
          <tbody>
            {results.zones.map((z) => (
              <tr key={z.id}>
                <td>{z.name || z.id}</td><td>{z.kind}</td>
                <td>{T(z.design.t)}{z.design.rh !== null ? `, ${z.design.rh} % RH` : ''}</td>
                <td>{T(z.month.t)}{z.month.rh !== null ? `, ${z.month.rh} % RH` : ''}</td>
                <td className="sheet-small">{z.rsHeat}; {z.rsSurface}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <p className="sheet-small">The conditions are the section&apos;s own (examples in the templates, not code values).</p>
      </section>

      <section className="sheet-block" data-testid="sheet-results">
        <h2>Results</h2>
        <table className="sheet-table">
          <tbody>
            {results.zones.map((z) => (
              <tr key={z.id}><th>Heat flow from {z.name || z.id} (design day)</th><td data-testid={`sheet-phi-${z.id}`} data-value={z.phi}>{formatQuantity('heat-flow-per-length', z.phi, u)}</td></tr>
            ))}
            <tr><th>Energy balance (ISO 10211)</th><td data-testid="sheet-balance" data-value={results.energyBalance}>{results.energyBalance.toExponential(2)}</td></tr>
            {results.l2d !== null && <tr><th>L2D, indoor zone {zoneName(results.indoorZoneId ?? '')}</th><td data-testid="sheet-l2d" data-value={results.l2d}>{formatQuantity('psi', results.l2d, u)}</td></tr>}
            {results.psi && <tr><th>psi = L2D − Σ U_j l_j ({results.psi.convention} dimensions; {results.psi.flanking.map((f) => `${f.name || f.id}: U ${f.u.toFixed(3)} W/(m²·K) × ${formatLength(f.length, u)}`).join('; ')})</th><td data-testid="sheet-psi" data-value={results.psi.psi}>{formatQuantity('psi', results.psi.psi, u)}</td></tr>}
            {results.psiGround && (
              <tr>
                <th>psi_g = L2D − 0.5 B′ U_floor − h_w U_wall (ISO 13370 floor: B′ {results.psiGround.characteristicDimension} m, U_floor {results.psiGround.uFloor.toFixed(3)} W/(m²·K); h_w {formatLength(results.psiGround.wallHeight, u)}{results.psiGround.uWall !== null ? `, U_wall ${results.psiGround.uWall.toFixed(3)} W/(m²·K)` : ''})</th>
                <td data-testid="sheet-psig" data-value={results.psiGround.psiG}>{formatQuantity('psi', results.psiGround.psiG, u)}</td>
              </tr>
            )}
            {results.couplings.length > 2 && results.couplings.map((k) => <tr key={`${k.a}-${k.b}`}><th>Coupling L {zoneName(k.a)} – {zoneName(k.b)}</th><td>{formatQuantity('psi', k.l, u)}</td></tr>)}
            {c && <tr><th>Dew point (design day, indoor)</th><td data-testid="sheet-dewpoint" data-value={c.design.dewPoint ?? ''}>{T(c.design.dewPoint)}</td></tr>}
            {c && <tr><th>Mould limit (80 % surface RH, coldest month)</th><td data-testid="sheet-mould" data-value={c.month.mouldLimit ?? ''}>{T(c.month.mouldLimit)}</td></tr>}
            {c && c.month.fRsiMin !== null && <tr><th>fRsi,min (ISO 13788)</th><td data-testid="sheet-frsimin" data-value={c.month.fRsiMin}>{c.month.fRsiMin.toFixed(3)}</td></tr>}
            {results.coldest && (
              <tr>
                <th>Coldest verdict surface (design day) at ({formatLength(results.coldest.at[0], u)}, {formatLength(results.coldest.at[1], u)}){results.coldest.fRsi !== null ? ', fRsi' : ''}</th>
                <td data-testid="sheet-coldest" data-value={results.coldest.t} data-frsi={results.coldest.fRsi ?? ''}>{T(results.coldest.t)}{results.coldest.fRsi !== null ? `, fRsi ${results.coldest.fRsi.toFixed(3)}` : ''}</td>
              </tr>
            )}
            <tr><th>Verdict</th><td data-testid="sheet-verdict">{STATE_MARK[results.verdict]} {results.verdict}</td></tr>
          </tbody>
        </table>
        <p className="sheet-verdict-note">{verdictNote}</p>
        <Caution compact />
        <h3>Verdict surfaces</h3>
        <table className="sheet-table" data-testid="sheet-surfaces">
          <thead><tr><th>State</th><th>Surface</th><th>Coldest (design day)</th><th>fRsi</th><th>Highest surface RH (coldest month)</th></tr></thead>
          <tbody>
            {results.surfaces.map((s) => (
              <tr key={s.id} data-segment={s.id} data-state={s.state} data-tmin={s.tMin}>
                <td>{STATE_MARK[s.state]} {STATE_TEXT[s.state]}</td>
                <td>{s.kind === 'hidden' ? 'hidden: ' : ''}{parts.find((p) => p.id === s.partId)?.name || s.partId} ({zoneName(s.zoneId)}), {formatLength(s.length, u)}</td>
                <td>{T(s.tMin)}</td>
                <td>{s.fRsi !== null ? s.fRsi.toFixed(3) : 'n/a'}{c?.month.fRsiMin != null ? ` vs ${c.month.fRsiMin.toFixed(3)}` : ''}</td>
                <td>{(s.rhSurfaceMax * 100).toFixed(0)} %</td>
              </tr>
            ))}
          </tbody>
        </table>
        {results.warnings.length > 0 && <ul className="sheet-small" data-testid="sheet-warnings">{results.warnings.map((w) => <li key={w}>{w}</li>)}</ul>}
      </section>

      <section className="sheet-block sheet-break" data-testid="sheet-glaser">
        <h2>Interstitial condensation: Glaser check (ISO 13788)</h2>
        <p className="sheet-small">Along each saved cut (or a default cut through the wall when no saved cut ends in air or ground at both ends): the layers crossed, sd = μ d (membranes by their own sd; a variable-permeance retarder by its winter sd), temperatures at the interfaces from the 2-D field, saturation pressure, and the vapour pressure line from the warm side to the cold side. Monthly figures use example monthly outdoor conditions of our own (not climate data for any place).</p>
        {glaser.map((o) => (
          <div key={o.cut.id} className="sheet-glaser" data-cut={o.cut.id} data-saved={o.saved ? 'yes' : 'no'} data-rate={o.check?.rate ?? ''}>
            <h3>{o.cut.name || o.cut.id}{o.saved ? '' : ' (default cut)'}</h3>
            {o.problem && <p className="sheet-problem" data-testid="glaser-problem">Not checked: {o.problem}</p>}
            {o.check && (
              <>
                <p>
                  From {o.check.warm.name} ({T(o.check.warm.t)}, {(o.check.warm.rh * 100).toFixed(0)} % RH{o.check.warm.rhAssumed ? ', assumed' : ''}, p {o.check.warm.p.toFixed(0)} Pa) to {o.check.cold.name} ({T(o.check.cold.t)}, {(o.check.cold.rh * 100).toFixed(0)} % RH{o.check.cold.rhAssumed ? ', assumed' : ''}, p {o.check.cold.p.toFixed(0)} Pa).{' '}
                  <strong data-testid="glaser-result">{o.check.condensation.length ? `Condensation at ${o.check.condensation.map((k) => `${k.where} (${T(k.t)}): ${k.rate.toFixed(3)} g/(m²·h)`).join('; ')}.` : 'No interstitial condensation at the design day.'}</strong>
                </p>
                <figure className="sheet-chart" dangerouslySetInnerHTML={{ __html: glaserChartSvg(o.check) }} />
                <table className="sheet-table">
                  <thead><tr><th>Layer (warm side first)</th><th>d</th><th>λ</th><th>μ</th><th>sd</th><th>sd from</th></tr></thead>
                  <tbody>
                    {o.check.layers.map((l, i) => <tr key={i}><td>{l.name}</td><td>{formatLength(l.thickness, u)}</td><td>{formatQuantity('conductivity', l.lambda, u)}</td><td>{l.mu ?? '—'}</td><td>{l.sd.toFixed(3)} m</td><td>{l.sdFrom}</td></tr>)}
                  </tbody>
                </table>
                <table className="sheet-table">
                  <thead><tr><th>Interface</th><th>Temperature</th><th>p_sat</th><th>p</th><th>Rate</th></tr></thead>
                  <tbody>
                    {o.check.points.filter((p) => p.boundary >= 0).map((p) => (
                      <tr key={p.boundary}>
                        <td>{p.boundary === 0 ? 'warm face' : p.boundary === o.check!.layers.length ? 'cold face' : `${o.check!.layers[p.boundary - 1].name} | ${o.check!.layers[p.boundary].name}`}</td>
                        <td>{T(p.t)}</td><td>{p.pSat.toFixed(0)} Pa</td><td>{p.p.toFixed(0)} Pa</td><td>{p.rate > 0 ? `${p.rate.toFixed(3)} g/(m²·h)` : '—'}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
                {o.check.monthly && (
                  <p className="sheet-small" data-testid="glaser-monthly">
                    Monthly (ISO 13788): {o.check.monthly.start < 0 ? 'no month has condensation.' : `condensation starts in ${o.check.monthly.months[0].month}; most water held ${(o.check.monthly.maxHeld * 1000).toFixed(1)} g/m² (${o.check.monthly.maxMonth}); ${o.check.monthly.driesOut ? 'it dries out within the year' : 'it does not dry out within the year'}.`}
                    {o.check.monthly.start >= 0 && ` By month: ${o.check.monthly.months.map((m) => `${m.month} ${(m.total * 1000).toFixed(1)}`).join(', ')} g/m².`}
                  </p>
                )}
                <ul className="sheet-small">{o.check.notes.map((n) => <li key={n}>{n}</li>)}</ul>
              </>
            )}
          </div>
        ))}
        <Caution compact />
      </section>

      <section className="sheet-block">
        <h2>Assumptions</h2>
        <ul className="sheet-small" data-testid="sheet-assumptions">
          {results.assumptions.map((a) => <li key={a.topic}><strong>{a.topic}:</strong> {a.text} <em>({a.source})</em></li>)}
          <li><strong>mesh cells:</strong> {results.mesh.nx} × {results.mesh.ny} = {results.mesh.cells} ({results.mesh.level}); solver residual {results.solver.residual.toExponential(2)}.</li>
        </ul>
      </section>

      <section className="sheet-block" data-testid="sheet-cautions">
        <h2>Cautions</h2>
        <ul>{SHEET_CAUTIONS.map((t) => <li key={t}>{t}</li>)}</ul>
        <Caution />
      </section>
      <footer className="sheet-foot">Dewline sheet · {snapshot.name} · {meta.date} · revision {meta.revision} · screening aid; local codes, manufacturers&apos; instructions and licensed professionals govern.</footer>
    </article>
  );
}

/** Print and screen styles of the sheet, A4 or Letter. */
export function sheetCss(paper: 'a4' | 'letter'): string {
  return `
@page { size: ${paper === 'letter' ? 'letter' : 'A4'} portrait; margin: 12mm; }
.sheet { max-width: ${paper === 'letter' ? '190mm' : '186mm'}; margin: 0 auto; padding: 16px; font: 10pt/1.35 Helvetica, Arial, sans-serif; color: #111; background: #fff; }
.sheet h1 { font-size: 16pt; margin: 0 0 4px; }
.sheet h2 { font-size: 12pt; margin: 14px 0 6px; border-bottom: 1px solid #999; }
.sheet h3 { font-size: 10.5pt; margin: 10px 0 4px; }
.sheet-head { display: flex; justify-content: space-between; gap: 16px; align-items: flex-start; }
.sheet-desc { margin: 0; font-size: 9pt; color: #333; }
.sheet-meta { display: grid; grid-template-columns: auto auto; gap: 0 8px; margin: 0; font-size: 9pt; white-space: nowrap; }
.sheet-meta dt { font-weight: bold; }
.sheet-meta dd { margin: 0; }
.sheet-table { border-collapse: collapse; width: 100%; font-size: 8.5pt; margin: 4px 0; }
.sheet-table th, .sheet-table td { border: 1px solid #bbb; padding: 2px 4px; text-align: left; vertical-align: top; }
.sheet-table thead th { background: #eef0f2; }
.sheet-table tbody th { font-weight: normal; width: 70%; }
.sheet-small { font-size: 8pt; color: #333; }
.sheet-drawing, .sheet-chart { margin: 0; }
.sheet-drawing svg { max-width: 100%; height: auto; }
.sheet-chart svg { max-width: 100%; height: auto; }
.sheet-problem { color: #8a3b00; font-size: 9pt; }
.sheet-foot { margin-top: 16px; font-size: 8pt; color: #444; border-top: 1px solid #999; padding-top: 4px; }
.sheet-tools { display: flex; gap: 8px; justify-content: flex-end; max-width: 186mm; margin: 8px auto 0; font: 10pt Helvetica, Arial, sans-serif; }
.sheet-tools a, .sheet-tools button { padding: 4px 10px; border: 1px solid #777; border-radius: 3px; background: #f6f6f6; color: #111; text-decoration: none; cursor: pointer; font: inherit; }
.sheet table, .sheet figure, .sheet-glaser > p, .sheet-verdict-note { break-inside: avoid; page-break-inside: avoid; }
.sheet h2, .sheet h3 { break-after: avoid; page-break-after: avoid; }
@media print {
  .sheet-tools { display: none; }
  .sheet { padding: 0; max-width: none; }
  .sheet-break { break-before: page; page-break-before: always; }
  .sheet-glaser + .sheet-glaser { break-before: page; page-break-before: always; }
  body { background: #fff; }
}`;
}
