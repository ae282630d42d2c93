'use client';
/**
 * The live layer over the parts: the temperature colours (a screen raster, redrawn when the results or
 * the view change), isotherms, optional heat-flow marks, the verdict segments and the coldest point, all
 * in one Konva layer, so a new result changes one canvas; the probe label has a layer of its own.
 */
import { useEffect, useLayoutEffect, useMemo, useRef } from 'react';
import { Circle, Group, Image as KImage, Layer, Line, Rect, Text } from 'react-konva';
import { useBoard } from '@/components/board/Canvas';
import { useStore, useStoreFields } from '@/components/board/store';
import { toScreen } from '@/components/board/view';
import { formatQuantity } from '@/lib/units';
import type { ScreenView } from './colour';
import { buildLut, levels, rangeOf, rasterFrame, rasterize } from './colour';
import { flowMarks, isotherms } from './contours';
import type { LiveSession } from './session';
import { RASTER_ALPHA, rasterScale } from './session';
import { styleFor } from './segments';
import type { LiveOptions } from './options';
import { probeAt } from './probe';

const LUT = buildLut();
const sameView = (a: ScreenView, b: ScreenView) => a.k === b.k && a.ox === b.ox && a.oy === b.oy;

/** What the overlay draws from: a solver progress message or a new request does not redraw it. */
const SHOWN = ['results', 'field', 'iso', 'stale', 'raster', 'mesh'] as const;

export function LiveOverlay({ live, options }: { live: LiveSession; options: LiveOptions }) {
  const c = useBoard();
  const st = useStoreFields(live.state, SHOWN);
  const v = useStore(c.view);
  const size = useStore(c.size);
  const system = useStore(c.ui).system;
  const opt = useStore(options);
  const canvas = useMemo(() => (typeof document !== 'undefined' ? document.createElement('canvas') : null), []);
  const pixels = useRef<ImageData | null>(null);
  const imgRef = useRef<import('konva/lib/shapes/Image').Image | null>(null);
  const range = useMemo(() => (st.results ? rangeOf(st.results.zones.filter((z) => z.touches).map((z) => z.design.t)) : null), [st.results]);

  // While previews are shown (a drag), the whole layer draws at a lower resolution and the browser scales
  // its canvas up: a quarter of the pixels for Chromium to rasterise per result, where most of a long
  // frame went (colours, lines and marks alike; they are sharp again with the release's result).
  const scale = rasterScale(st.mesh);
  const layerRef = useRef<import('konva/lib/Layer').Layer | null>(null);
  useLayoutEffect(() => {
    const lc = layerRef.current?.getCanvas();
    if (lc && lc.getPixelRatio() !== scale) {
      lc.setPixelRatio(scale);
      layerRef.current?.batchDraw();
    }
  });

  // The colours: one screen raster per result or view, kept in one canvas and drawn as one image.
  useEffect(() => {
    if (!canvas || !st.field || !range || !opt.colours) return;
    const fr = rasterFrame(v, size.width, size.height, scale);
    const { width: w, height: h } = fr;
    if (canvas.width !== w || canvas.height !== h) { canvas.width = w; canvas.height = h; }
    const ctx = canvas.getContext('2d')!;
    const ras = st.raster;
    if (ras && ras.width === w && ras.height === h && sameView(ras.view, fr.view)) {
      // Painted by the worker for this very view: copy it in.
      ctx.putImageData(new ImageData(ras.pixels as Uint8ClampedArray<ArrayBuffer>, w, h), 0, 0);
    } else {
      if (!pixels.current || pixels.current.width !== w || pixels.current.height !== h) pixels.current = ctx.createImageData(w, h);
      rasterize(st.field, range, LUT, fr.view, w, h, pixels.current.data, RASTER_ALPHA);
      ctx.putImageData(pixels.current, 0, 0);
    }
    imgRef.current?.getLayer()?.batchDraw();
  }, [canvas, st.field, st.raster, range, v, size, opt.colours, scale]);

  // The worker traces the isotherms with each solve; only a change of interval is traced here, once.
  const lines = useMemo(() => {
    if (!st.field || !range || !opt.isotherms) return [];
    if (st.iso && st.iso.step === opt.step) return st.iso.lines;
    return isotherms(st.field, levels(range, opt.step));
  }, [st.field, st.iso, range, opt.isotherms, opt.step]);
  const marks = useMemo(() => (st.field && opt.flow ? flowMarks(st.field, Math.max(3, Math.round(Math.sqrt((st.field.nx * st.field.ny) / 900)))) : []), [st.field, opt.flow]);
  const r = st.results;
  const px = 1 / v.k;
  // World-space drawing (isotherms, flow marks, verdict segments): new nodes only for new results or a zoom.
  const world = useMemo(() => {
    if (!r) return null;
    return (
      <>
        {lines.map((iso) => iso.lines.map((pts, i) => (
          <Line key={`${iso.value}-${i}`} points={pts} stroke={iso.value === 0 ? '#ffffff' : 'rgba(20,20,20,0.55)'} strokeWidth={iso.value === 0 ? 1.6 : 0.9} strokeScaleEnabled={false} listening={false} perfectDrawEnabled={false} />
        )))}
        {marks.map((m, i) => {
          const L = 9 * px;
          return <Line key={`f${i}`} points={[m.x - m.dx * L * 0.5, m.y - m.dy * L * 0.5, m.x + m.dx * L * 0.5, m.y + m.dy * L * 0.5]} stroke="rgba(255,255,255,0.8)" strokeWidth={1} strokeScaleEnabled={false} listening={false} perfectDrawEnabled={false} />;
        })}
        {r.surfaces.map((s) => {
          const sty = styleFor(s.state);
          const pts = [s.from[0], s.from[1], s.to[0], s.to[1]];
          // The stroke is not scaled (Konva strokes it in screen pixels), so the dash is in pixels too:
          // dashes of 1/k px cost tens of ms to rasterise per result and drew the line as solid.
          return (
            <Group key={s.id} listening={false}>
              <Line points={pts} stroke="#ffffff" strokeWidth={sty.width + 3} strokeScaleEnabled={false} opacity={0.85} perfectDrawEnabled={false} />
              <Line points={pts} stroke={sty.stroke} strokeWidth={sty.width} dash={sty.dash.length ? sty.dash : undefined} strokeScaleEnabled={false} lineCap={s.state === 'condensation' ? 'round' : 'butt'} perfectDrawEnabled={false} />
            </Group>
          );
        })}
      </>
    );
  }, [r, lines, marks, px]);
  // Screen-space marks (segment glyphs, the coldest point's label): new nodes for new results or a view change.
  const marksOnScreen = useMemo(() => {
    if (!r) return null;
    return (
      <>
        {r.surfaces.map((s) => {
          const sty = styleFor(s.state);
          const [x, y] = toScreen(v, [(s.from[0] + s.to[0]) / 2, (s.from[1] + s.to[1]) / 2]);
          const hollow = s.kind === 'hidden';
          if (sty.glyph === 'ring') return <Circle key={`g${s.id}`} x={x} y={y} radius={4} stroke={sty.stroke} strokeWidth={2} fill={hollow ? '#fff' : sty.stroke} />;
          if (sty.glyph === 'diamond') return <Rect key={`g${s.id}`} x={x} y={y} width={9} height={9} offsetX={4.5} offsetY={4.5} rotation={45} stroke="#fff" strokeWidth={1} fill={hollow ? '#fff' : sty.stroke} />;
          return (
            <Group key={`g${s.id}`} x={x} y={y}>
              <Circle radius={7} fill="#fff" stroke={sty.stroke} strokeWidth={hollow ? 1 : 0} />
              <Line points={[-4, -4, 4, 4]} stroke={sty.stroke} strokeWidth={2.5} />
              <Line points={[-4, 4, 4, -4]} stroke={sty.stroke} strokeWidth={2.5} />
            </Group>
          );
        })}
        {r.coldest && (() => {
          const [x, y] = toScreen(v, r.coldest.at);
          const text = `coldest ${formatQuantity('temperature', r.coldest.t, system)}${r.coldest.fRsi !== null ? ` · fRsi ${r.coldest.fRsi.toFixed(2)}` : ''}`;
          const w = text.length * 6.4 + 12;
          return (
            <Group x={x} y={y} listening={false}>
              <Line points={[0, 0, 14, -22]} stroke="#111" strokeWidth={1.2} />
              <Circle radius={4} fill="#111" stroke="#fff" strokeWidth={1.5} />
              <Rect x={14} y={-34} width={w} height={20} fill="#111" cornerRadius={3} opacity={0.9} />
              <Text x={20} y={-29} text={text} fontSize={11} fontFamily="system-ui, sans-serif" fill="#fff" />
            </Group>
          );
        })()}
      </>
    );
  }, [r, v, system]);
  if (!r || !st.field) return null;
  // Preview results (a drag under way) are drawn dimmed throughout, rather than dimmed and undimmed as
  // each result catches up with the drawing and the next move leaves it behind (a redraw each time).
  const dim = st.stale || st.mesh === 'preview';
  const note = st.mesh === 'preview' ? 'Preview on a coarse mesh while you drag' : st.stale ? 'Updating: the colours show the previous drawing' : null;
  // One layer (one canvas for the compositor to take) for colours, lines and marks.
  return (
    <>
      <Layer ref={layerRef} name="live" listening={false}>
        {opt.colours && <KImage ref={imgRef} image={canvas ?? undefined} x={0} y={0} width={size.width} height={size.height} opacity={dim ? 0.55 : 1} listening={false} />}
        <Group x={v.ox} y={v.oy} scaleX={v.k} scaleY={-v.k} opacity={dim ? 0.6 : 1} listening={false}>
          {world}
        </Group>
        <Group listening={false}>{marksOnScreen}</Group>
        {note && <Text x={10} y={10} text={note} fontSize={12} fill="#7a3b00" fontStyle="bold" listening={false} />}
      </Layer>
      <ProbeLayer live={live} />
    </>
  );
}

const PROBED = ['results', 'field'] as const;

/**
 * A small label beside the pointer: temperature there and, over a verdict surface, its surface RH. Its
 * own layer, so a pointer move redraws only it. The layer stays mounted when there is nothing to show:
 * adding or removing a layer makes react-konva redraw the whole stage (every layer), which at the start
 * and end of a drag was one long main-thread task.
 */
function ProbeLayer({ live }: { live: LiveSession }) {
  return (
    <Layer listening={false}>
      <ProbeLabel live={live} />
    </Layer>
  );
}

function ProbeLabel({ live }: { live: LiveSession }) {
  const c = useBoard();
  const spot = useStore(c.pointer);
  const st = useStoreFields(live.state, PROBED);
  const ui = useStore(c.ui);
  if (!spot || !st.field || !st.results || ui.tool.type !== 'select' || c.isDragging()) return null;
  const tol = (spot.pointerType === 'touch' ? 14 : 6) / c.view.get().k;
  const r = probeAt(c.section.get().resolved.solids, st.field, st.results.surfaces, spot.w[0], spot.w[1], tol);
  if (r.t === null && !r.segment) return null;
  const text = `${r.t === null ? '' : formatQuantity('temperature', r.t, ui.system, 1)}${r.segment ? `${r.t === null ? '' : ' · '}surface RH ${(r.segment.rhSurfaceMax * 100).toFixed(0)} %` : ''}`;
  const w = text.length * 6.2 + 12;
  return (
    <Group x={spot.sx + 14} y={spot.sy + 12}>
      <Rect width={w} height={18} fill="rgba(255,255,255,0.92)" stroke="#5b3f8c" strokeWidth={0.8} cornerRadius={3} />
      <Text x={6} y={4} text={text} fontSize={11} fontFamily="system-ui, sans-serif" fill="#1d232b" />
    </Group>
  );
}
