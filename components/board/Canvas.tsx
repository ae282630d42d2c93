'use client';
/**
 * The drawing: Konva layers that never listen (the controller does its own hit-testing).
 * World layers carry the view transform (metres, y up, flipped here); the top layer draws in screen
 * pixels (handles, guides, dimensions, labels). While a drag is under way the moving parts get a layer
 * of their own between the parts below and above them, so the still parts are not redrawn, and while
 * they only translate, that layer's canvas is shifted rather than redrawn (MovingLayer).
 */
import type { ReactNode } from 'react';
import { createContext, memo, useCallback, useContext, useEffect, useLayoutEffect, useMemo, useRef } from 'react';
import { Layer, Line, Rect, Shape, Stage, Text, Circle, Group } from 'react-konva';
import type { FillPattern } from '@/lib/materials/material';
import { lookupMaterial } from '@/lib/section/resolve';
import { partKind } from '@/lib/section/registry';
import { formatLength, formatQuantity } from '@/lib/units';
import type { BoardController, PointerInput, SectionState } from './controller';
import { fillStyle, fillTile, TILE_RES, ZONE_STYLES } from './fills';
import { boxOf } from './hit';
import type { OutlineItem } from './rigid';
import { rigidShift } from './rigid';
import { keepUnchanged } from './stable';
import { useStore, useStoreFields } from './store';
import { gridSpacing, patternBucket, toScreen } from './view';

export const BoardContext = createContext<BoardController | null>(null);

export function useBoard(): BoardController {
  const c = useContext(BoardContext);
  if (!c) throw new Error('useBoard outside a Board');
  return c;
}

/**
 * A Konva layer in section coordinates: metres, x to the right, y up. Overlays (temperature colours,
 * isotherms, marks) draw inside one of these and follow pan and zoom for free.
 */
export function WorldLayer({ children, opacity, name }: { children?: ReactNode; opacity?: number; name?: string }) {
  const c = useBoard();
  const v = useStore(c.view);
  return (
    <Layer name={name} x={v.ox} y={v.oy} scaleX={v.k} scaleY={-v.k} listening={false} opacity={opacity}>
      {children}
    </Layer>
  );
}

interface SolidItem {
  key: string;
  partId: string;
  flat: number[];
  pattern: FillPattern;
  rank: number;
  locked: boolean;
}

const sameFlat = (a: number[], b: number[]) => a.length === b.length && a.every((v, i) => v === b[i]);

/** Render items with stable identities: an item is reused while its outline and fill are unchanged. */
function useSolidItems(c: BoardController): SolidItem[] {
  const st = useStore(c.section);
  const cache = useRef(new Map<string, SolidItem>());
  return useMemo(() => {
    const next = new Map<string, SolidItem>();
    const out: SolidItem[] = [];
    for (const s of st.resolved.solids) {
      const key = `${s.partId}:${s.piece}`;
      const flat = s.polygon.flatMap(([x, y]) => [x, y]);
      const pattern = (lookupMaterial(st.resolved.materials, s.materialId)?.pattern ?? 'plain') as FillPattern;
      const locked = !!st.resolved.parts.get(s.partId)?.record.locked;
      const old = cache.current.get(key);
      const item = old && old.pattern === pattern && old.rank === s.rank && old.locked === locked && sameFlat(old.flat, flat) ? old : { key, partId: s.partId, flat, pattern, rank: s.rank, locked };
      next.set(key, item);
      out.push(item);
    }
    cache.current = next;
    return out;
  }, [st]);
}

const SolidShape = memo(function SolidShape({ item, scale }: { item: SolidItem; scale: number }) {
  const st = fillStyle(item.pattern);
  const thin = item.pattern === 'membrane';
  const common = { points: item.flat, closed: true, stroke: st.edge, strokeWidth: thin ? 1.5 : 0.8, strokeScaleEnabled: false, perfectDrawEnabled: false, listening: false } as const;
  if (item.pattern === 'plain' || thin) return <Line {...common} fill={st.base} />;
  // Tiles are TILE_RES times oversampled; the world layer is scaled by (k, -k): undo both, per octave of zoom.
  const s = 1 / (scale * TILE_RES);
  return <Line {...common} fillPatternImage={fillTile(item.pattern) as unknown as HTMLImageElement} fillPatternScaleX={s} fillPatternScaleY={-s} fillPatternRepeat="repeat" />;
});

const SolidsLayer = memo(
  function SolidsLayer({ items, scale }: { items: SolidItem[]; scale: number }) {
    return (
      <WorldLayer>
        {items.map((it) => (
          <SolidShape key={it.key} item={it} scale={scale} />
        ))}
      </WorldLayer>
    );
  },
  (a, b) => a.scale === b.scale && a.items.length === b.items.length && a.items.every((x, i) => x === b.items[i]),
);

/**
 * The moving parts during a drag. While they only translate together (a move, not a resize), the layer
 * keeps the drawing it made at the start and the compositor shifts its canvas (a CSS transform): no
 * redraw of the pattern fills on every pointer move. It draws again when the shape changes, the view
 * changes, or the shift passes a quarter of the screen (so parts that were off screen come into view).
 */
function MovingLayer({ items, scale }: { items: SolidItem[]; scale: number }) {
  const c = useBoard();
  const v = useStore(c.view);
  const size = useStore(c.size);
  const layer = useRef<import('konva/lib/Layer').Layer | null>(null);
  const base = useRef<{ items: SolidItem[]; view: typeof v } | null>(null);
  let shift = base.current && base.current.view === v ? rigidShift(base.current.items, items) : null;
  if (shift && (Math.abs(shift[0] * v.k) > size.width / 4 || Math.abs(shift[1] * v.k) > size.height / 4)) shift = null;
  if (!shift) {
    base.current = { items, view: v };
    shift = [0, 0];
  }
  const drawn = base.current!.items;
  const [sx, sy] = [shift[0] * v.k, -shift[1] * v.k];
  useLayoutEffect(() => {
    const el = layer.current?.getCanvas()._canvas;
    if (el) el.style.transform = sx || sy ? `translate(${sx}px, ${sy}px)` : '';
  });
  return (
    <Layer ref={layer} x={v.ox} y={v.oy} scaleX={v.k} scaleY={-v.k} listening={false}>
      <MovingShapes items={drawn} scale={scale} />
    </Layer>
  );
}

const MovingShapes = memo(function MovingShapes({ items, scale }: { items: SolidItem[]; scale: number }) {
  return (
    <>
      {items.map((it) => (
        <SolidShape key={it.key} item={it} scale={scale} />
      ))}
    </>
  );
});

function PartsLayers() {
  const c = useBoard();
  const items = useSolidItems(c);
  const moving = useStore(c.ui).moving;
  const scale = patternBucket(useStore(c.view).k);
  const [below, active, above] = useMemo(() => {
    if (!moving || !moving.size) return [items, [], []] as const;
    const ranks = items.filter((i) => moving.has(i.partId)).map((i) => i.rank);
    const lo = Math.min(...ranks), hi = Math.max(...ranks);
    return [items.filter((i) => i.rank < lo && !moving.has(i.partId)), items.filter((i) => moving.has(i.partId)), items.filter((i) => i.rank > hi || (i.rank > lo && !moving.has(i.partId)))] as const;
  }, [items, moving]);
  return (
    <>
      <SolidsLayer items={below as SolidItem[]} scale={scale} />
      <MovingLayer items={active as SolidItem[]} scale={scale} />
      <SolidsLayer items={above as SolidItem[]} scale={scale} />
    </>
  );
}

/** Zones: redrawn only when a zone's outline or kind changes (not on every move of a part). */
function ZonesLayer() {
  const c = useBoard();
  const st = useStore(c.section);
  const key = st.resolved.zones.map((z) => `${z.zoneId}:${z.kind}:${z.polygon.join(';')}`).join('|');
  const zones = useMemo(() => st.resolved.zones, [key]); // eslint-disable-line react-hooks/exhaustive-deps
  return <ZoneShapes zones={zones} />;
}

const ZoneShapes = memo(function ZoneShapes({ zones }: { zones: SectionState['resolved']['zones'] }) {
  return (
    <WorldLayer name="zones">
      {zones.map((z) => {
        const zs = ZONE_STYLES[z.kind] ?? ZONE_STYLES.fixed;
        return <Line key={z.zoneId} points={z.polygon.flatMap(([x, y]) => [x, y])} closed fill={zs.fill} stroke={zs.edge} strokeWidth={1} dash={[6, 4]} strokeScaleEnabled={false} listening={false} perfectDrawEnabled={false} />;
      })}
    </WorldLayer>
  );
});

/**
 * Grid lines in screen space, faint over the drawing; minor lines at round mm or inch steps. The layer
 * stays mounted when the grid is off (hidden), and its drawing function changes only with the view, the
 * size and the spacing, so selecting or dragging a part does not redraw it.
 */
const GRID_UI = ['grid', 'system'] as const;
function GridLayer() {
  const c = useBoard();
  const v = useStore(c.view);
  const ui = useStoreFields(c.ui, GRID_UI);
  const size = useStore(c.size);
  const { minor, major } = gridSpacing(v.k, ui.system);
  const sceneFunc = useCallback((ctx: import('konva/lib/Context').Context) => {
    const x0 = Math.floor(-v.ox / v.k / minor) * minor;
    const x1 = (size.width - v.ox) / v.k;
    const yTop = v.oy / v.k, yBot = (v.oy - size.height) / v.k;
    const y0 = Math.floor(yBot / minor) * minor;
    const ratio = Math.round(major / minor);
    const draw = (isMajor: boolean) => {
      ctx.beginPath();
      for (let i = Math.round(x0 / minor), x = x0; x <= x1; i++, x = i * minor) {
        if ((i % ratio === 0) !== isMajor) continue;
        const sx = Math.round(x * v.k + v.ox) + 0.5;
        ctx.moveTo(sx, 0);
        ctx.lineTo(sx, size.height);
      }
      for (let i = Math.round(y0 / minor), y = y0; y <= yTop; i++, y = i * minor) {
        if ((i % ratio === 0) !== isMajor) continue;
        const sy = Math.round(-y * v.k + v.oy) + 0.5;
        ctx.moveTo(0, sy);
        ctx.lineTo(size.width, sy);
      }
      ctx.strokeStyle = isMajor ? 'rgba(40, 60, 80, 0.16)' : 'rgba(40, 60, 80, 0.07)';
      ctx.lineWidth = 1;
      ctx.stroke();
    };
    draw(false);
    draw(true);
    // Grade and the reference line, a little stronger.
    ctx.beginPath();
    ctx.moveTo(0, Math.round(v.oy) + 0.5);
    ctx.lineTo(size.width, Math.round(v.oy) + 0.5);
    ctx.moveTo(Math.round(v.ox) + 0.5, 0);
    ctx.lineTo(Math.round(v.ox) + 0.5, size.height);
    ctx.strokeStyle = 'rgba(40, 60, 80, 0.28)';
    ctx.stroke();
  }, [v, size, minor, major]);
  return (
    <Layer name="grid" listening={false} visible={ui.grid}>
      <Shape listening={false} perfectDrawEnabled={false} sceneFunc={sceneFunc} />
    </Layer>
  );
}

const INK = '#1d232b';
const ACCENT = '#0f6b5c';
const GUIDE = '#c2410c';
const CUT = '#5b3f8c';

function DimensionLine({ a, b, text, offset }: { a: [number, number]; b: [number, number]; text: string; offset: [number, number] }) {
  const p = [a[0] + offset[0], a[1] + offset[1]], q = [b[0] + offset[0], b[1] + offset[1]];
  const vertical = Math.abs(a[0] - b[0]) < 1;
  const mid = [(p[0] + q[0]) / 2, (p[1] + q[1]) / 2];
  const tick = 4;
  return (
    <Group listening={false}>
      <Line points={[a[0], a[1], p[0], p[1]]} stroke={ACCENT} strokeWidth={0.7} opacity={0.6} />
      <Line points={[b[0], b[1], q[0], q[1]]} stroke={ACCENT} strokeWidth={0.7} opacity={0.6} />
      <Line points={[p[0], p[1], q[0], q[1]]} stroke={ACCENT} strokeWidth={1} />
      <Line points={[p[0] - tick, p[1] + tick, p[0] + tick, p[1] - tick]} stroke={ACCENT} strokeWidth={1.2} />
      <Line points={[q[0] - tick, q[1] + tick, q[0] + tick, q[1] - tick]} stroke={ACCENT} strokeWidth={1.2} />
      <Label x={vertical ? mid[0] + 6 : mid[0]} y={vertical ? mid[1] : mid[1] + 6} text={text} align={vertical ? 'left' : 'center'} />
    </Group>
  );
}

function Label({ x, y, text, align = 'left', tone = 'ink' }: { x: number; y: number; text: string; align?: 'left' | 'center'; tone?: 'ink' | 'error' }) {
  const w = text.length * 6.6 + 10;
  const left = align === 'center' ? x - w / 2 : x;
  return (
    <Group listening={false} x={left} y={y - 9}>
      <Rect width={w} height={18} fill={tone === 'error' ? '#fff4ed' : 'rgba(251,250,247,0.92)'} stroke={tone === 'error' ? GUIDE : '#c9c3b8'} strokeWidth={0.8} cornerRadius={3} />
      <Text text={text} x={5} y={4} fontSize={11} fontFamily="system-ui, sans-serif" fill={tone === 'error' ? '#8a2c00' : INK} />
    </Group>
  );
}

/** What the selection layer draws, as outlines in screen pixels (keys carry everything else it shows). */
function selectionOutline(c: BoardController, v: ReturnType<BoardController['view']['get']>, ui: ReturnType<BoardController['ui']['get']>, st: SectionState): OutlineItem[] {
  const sp = (p: readonly [number, number]) => toScreen(v, p);
  const item = (key: string, flat: number[]): OutlineItem => ({ key, flat, pattern: '', rank: 0, locked: false });
  const out: OutlineItem[] = [];
  const selParts = ui.selection.parts.map((id) => st.resolved.parts.get(id)).filter((p) => !!p);
  for (const p of selParts) {
    for (const s of st.resolved.solids) if (s.partId === p.id) out.push(item(`so-${s.partId}-${s.piece}`, s.polygon.flatMap((q) => sp(q))));
    out.push(item(`sb-${p.id}-${p.record.locked ? 'locked' : ''}`, [...sp([p.box.minX, p.box.maxY]), ...sp([p.box.maxX, p.box.minY])]));
  }
  for (const z of st.resolved.zones) if (ui.selection.zones.includes(z.zoneId)) out.push(item(`sz-${z.zoneId}`, z.polygon.flatMap((q) => sp(q))));
  if (selParts.length === 1 && !ui.selection.zones.length) {
    const p = selParts[0];
    const kind = partKind(p.record.kind);
    const text = `${formatLength(p.box.maxX - p.box.minX, ui.system)}|${formatLength(p.box.maxY - p.box.minY, ui.system)}|${p.record.name}|${kind ? kind.label(p.record as never, (m) => formatLength(m, ui.system)) : ''}`;
    out.push(item(`dim-${text}`, [...sp([p.box.minX, p.box.maxY]), ...sp([p.box.maxX, p.box.minY])]));
  }
  c.handles().forEach((h, i) => out.push(item(`h${i}-${h.type}-${h.type === 'vertex' && ui.vertex === h.index ? 'on' : ''}-${h.type === 'param' ? h.handle.axis : h.type === 'zone' ? h.edge : ''}`, [...sp(h.at)])));
  return out;
}

/** The selection's outlines, box, labels, dimensions and handles, in screen pixels. */
function selectionNodes(c: BoardController, v: ReturnType<BoardController['view']['get']>, ui: ReturnType<BoardController['ui']['get']>, st: SectionState): ReactNode[] {
  const sp = (p: readonly [number, number]) => toScreen(v, p);
  const selParts = ui.selection.parts.map((id) => st.resolved.parts.get(id)).filter((p) => !!p);
  const selZones = st.resolved.zones.filter((z) => ui.selection.zones.includes(z.zoneId));
  const handles = c.handles();
  const out: ReactNode[] = [];
  // Selection outlines: the part's pieces, and its box dashed.
  for (const p of selParts) {
    for (const s of st.resolved.solids) if (s.partId === p.id) out.push(<Line key={`so-${s.partId}-${s.piece}`} points={s.polygon.flatMap((q) => sp(q))} closed stroke={ACCENT} strokeWidth={2} listening={false} />);
    const [bx0, by0] = sp([p.box.minX, p.box.maxY]);
    const [bx1, by1] = sp([p.box.maxX, p.box.minY]);
    out.push(<Rect key={`sb-${p.id}`} x={bx0 - 3} y={by0 - 3} width={bx1 - bx0 + 6} height={by1 - by0 + 6} stroke={ACCENT} strokeWidth={1} dash={[4, 3]} listening={false} />);
    if (p.record.locked) out.push(<Label key={`lk-${p.id}`} x={bx0} y={by0 - 16} text="locked" />);
  }
  for (const z of selZones) out.push(<Line key={`sz-${z.zoneId}`} points={z.polygon.flatMap((q) => sp(q))} closed stroke={ACCENT} strokeWidth={2} dash={[8, 4]} listening={false} />);

  // Dimensions of the single selected part: width under its box, height to its right.
  if (selParts.length === 1 && !selZones.length) {
    const p = selParts[0];
    const [bx0, by0] = sp([p.box.minX, p.box.maxY]);
    const [bx1, by1] = sp([p.box.maxX, p.box.minY]);
    const w = p.box.maxX - p.box.minX, h = p.box.maxY - p.box.minY;
    out.push(<DimensionLine key="dim-w" a={[bx0, by1]} b={[bx1, by1]} offset={[0, 22]} text={formatLength(w, ui.system)} />);
    out.push(<DimensionLine key="dim-h" a={[bx1, by0]} b={[bx1, by1]} offset={[22, 0]} text={formatLength(h, ui.system)} />);
    const kind = partKind(p.record.kind);
    if (kind) out.push(<Label key="name" x={bx0} y={by0 - 18} text={`${p.record.name ? p.record.name + ' · ' : ''}${kind.label(p.record as never, (m) => formatLength(m, ui.system))}`} />);
  }

  // Handles.
  handles.forEach((h, i) => {
    const [x, y] = sp(h.at);
    if (h.type === 'midpoint') out.push(<Circle key={`h${i}`} x={x} y={y} radius={4} fill="#fbfaf7" stroke={ACCENT} strokeWidth={1} dash={[2, 2]} listening={false} />);
    else if (h.type === 'vertex') out.push(<Circle key={`h${i}`} x={x} y={y} radius={5} fill={ui.vertex === h.index ? ACCENT : '#fbfaf7'} stroke={ACCENT} strokeWidth={1.5} listening={false} />);
    else {
      const along = h.type === 'param' ? h.handle.axis : h.edge === 'left' || h.edge === 'right' ? 'x' : 'y';
      const [w, hh] = along === 'x' ? [7, 15] : [15, 7];
      out.push(<Rect key={`h${i}`} x={x - w / 2} y={y - hh / 2} width={w} height={hh} fill="#fbfaf7" stroke={ACCENT} strokeWidth={1.5} cornerRadius={2} listening={false} />);
    }
  });

  return out;
}

/**
 * The selection layer. While a drag only translates the selection (a move), it keeps the drawing it made
 * at the start and the compositor shifts its canvas, as the moving parts' layer does: no redraw of the
 * outlines, labels and handles on every pointer move. It draws again when anything it shows changes
 * other than by that translation, when the view changes, or when the shift passes a quarter of the screen.
 */
function SelectionLayer() {
  const c = useBoard();
  const v = useStore(c.view);
  const ui = useStore(c.ui);
  const st = useStore(c.section);
  const size = useStore(c.size);
  const layer = useRef<import('konva/lib/Layer').Layer | null>(null);
  const base = useRef<{ outline: OutlineItem[]; nodes: ReactNode[] } | null>(null);
  const outline = selectionOutline(c, v, ui, st);
  let shift = base.current && c.isDragging() ? rigidShift(base.current.outline, outline, 1e-6) : null;
  if (shift && (Math.abs(shift[0]) > size.width / 4 || Math.abs(shift[1]) > size.height / 4)) shift = null;
  if (!shift || !base.current) {
    base.current = { outline, nodes: selectionNodes(c, v, ui, st) };
    shift = [0, 0];
  }
  const [sx, sy] = shift;
  useLayoutEffect(() => {
    const el = layer.current?.getCanvas()._canvas;
    if (el) el.style.transform = sx || sy ? `translate(${sx}px, ${sy}px)` : '';
  });
  return <Layer ref={layer} name="selection" listening={false}>{base.current.nodes}</Layer>;
}

/** The top layer: everything else drawn in screen pixels (zone labels, guides, drafts, cut lines, messages). */
function ScreenLayer() {
  const c = useBoard();
  const v = useStore(c.view);
  const ui = useStore(c.ui);
  const st = useStore(c.section);
  const tr = useStore(c.transient);
  const size = useStore(c.size);
  const kept = useRef<ReactNode[] | null>(null);
  const sp = (p: readonly [number, number]) => toScreen(v, p);
  const out: ReactNode[] = [];

  // Zone labels (name and design temperature), where the zone is large enough on screen.
  for (const z of st.resolved.zones) {
    if (!z.polygon.length) continue;
    const b = boxOf(z.polygon);
    const [x0, y0] = sp([b.minX, b.maxY]);
    const [x1, y1] = sp([b.maxX, b.minY]);
    if (x1 - x0 < 90 || y1 - y0 < 22) continue;
    const cx = Math.min(Math.max(x0, 0), size.width - 100), cy = Math.min(Math.max(y0, 0), size.height - 30);
    if (cx > x1 - 90 || cy > y1 - 22) continue;
    out.push(<Text key={`zl-${z.zoneId}`} x={cx + 6} y={cy + 6} text={`${z.record.name || z.kind} · ${formatQuantity('temperature', z.record.design.t, ui.system)}`} fontSize={11} fontFamily="system-ui, sans-serif" fill={(ZONE_STYLES[z.kind] ?? ZONE_STYLES.fixed).edge} listening={false} />);
  }

  // Snap guides.
  tr.guides.forEach((g, i) => {
    const pts = g.axis === 'x' ? [...sp([g.at, g.lo]), ...sp([g.at, g.hi])] : [...sp([g.lo, g.at]), ...sp([g.hi, g.at])];
    const ext = g.axis === 'x' ? [pts[0], pts[1] + 16, pts[2], pts[3] - 16] : [pts[0] - 16, pts[1], pts[2] + 16, pts[3]];
    out.push(<Line key={`g${i}`} points={ext} stroke={GUIDE} strokeWidth={1} dash={[5, 3]} listening={false} />);
  });

  if (tr.marquee) {
    const [x0, y0] = sp([tr.marquee.minX, tr.marquee.maxY]);
    const [x1, y1] = sp([tr.marquee.maxX, tr.marquee.minY]);
    out.push(<Rect key="marquee" x={x0} y={y0} width={x1 - x0} height={y1 - y0} fill="rgba(15,107,92,0.07)" stroke={ACCENT} strokeWidth={1} dash={[4, 3]} listening={false} />);
  }
  if (tr.zoneRect) {
    const [x0, y0] = sp([tr.zoneRect.minX, tr.zoneRect.maxY]);
    const [x1, y1] = sp([tr.zoneRect.maxX, tr.zoneRect.minY]);
    out.push(<Rect key="zrect" x={x0} y={y0} width={x1 - x0} height={y1 - y0} fill="rgba(96,142,196,0.12)" stroke="#4d77a8" strokeWidth={1} dash={[6, 4]} listening={false} />);
    out.push(<Label key="zrect-l" x={x1 + 8} y={y1} text={`${formatLength(tr.zoneRect.maxX - tr.zoneRect.minX, ui.system)} × ${formatLength(tr.zoneRect.maxY - tr.zoneRect.minY, ui.system)}`} />);
  }
  // The polygon being drawn.
  if (ui.tool.type === 'polygon' && tr.draft.vertices.length) {
    const pts = tr.draft.vertices.flatMap((q) => sp(q));
    const cur = tr.cursor ? sp(tr.cursor) : null;
    out.push(<Line key="draft" points={cur ? [...pts, ...cur] : pts} stroke={ACCENT} strokeWidth={1.5} listening={false} />);
    tr.draft.vertices.forEach((q, i) => {
      const [x, y] = sp(q);
      out.push(<Circle key={`dv${i}`} x={x} y={y} radius={i === 0 ? 7 : 4} fill={i === 0 ? 'rgba(15,107,92,0.15)' : '#fbfaf7'} stroke={ACCENT} strokeWidth={1.5} listening={false} />);
    });
  }
  // Saved cut lines (the chosen one stronger) and the one being drawn.
  for (const cut of st.snapshot.cuts) {
    const on = ui.activeCut === cut.id;
    const [x0, y0] = sp(cut.from), [x1, y1] = sp(cut.to);
    out.push(<Line key={`cut-${cut.id}`} points={[x0, y0, x1, y1]} stroke={CUT} strokeWidth={on ? 2 : 1.2} dash={[7, 3, 2, 3]} opacity={on ? 1 : 0.7} listening={false} />);
    out.push(<Circle key={`cut-a-${cut.id}`} x={x0} y={y0} radius={3} fill={CUT} listening={false} />);
    out.push(<Label key={`cut-l-${cut.id}`} x={x1 + 6} y={y1} text={cut.name || 'cut'} />);
  }
  if (tr.cut) {
    const [x0, y0] = sp(tr.cut[0]), [x1, y1] = sp(tr.cut[1]);
    out.push(<Line key="cut-draft" points={[x0, y0, x1, y1]} stroke={CUT} strokeWidth={2} dash={[7, 3, 2, 3]} listening={false} />);
    out.push(<Label key="cut-draft-l" x={x1 + 8} y={y1 + 14} text={formatLength(Math.hypot(tr.cut[1][0] - tr.cut[0][0], tr.cut[1][1] - tr.cut[0][1]), ui.system)} />);
  }
  if (tr.refusal) out.push(<Label key="refusal" x={tr.refusal.sx + 14} y={tr.refusal.sy + 18} text={tr.refusal.text.split('\n')[0]} tone="error" />);

  // This layer re-renders on every move of a drag (it reads the section and the transient state); hand
  // React the previous elements where nothing changed (cut lines, zone labels), so the canvas is not redrawn.
  const nodes = keepUnchanged(kept.current, out);
  kept.current = nodes;
  return <Layer listening={false}>{nodes}</Layer>;
}

function pointerInput(e: React.PointerEvent | PointerEvent, el: HTMLElement): PointerInput {
  const r = el.getBoundingClientRect();
  return { sx: e.clientX - r.left, sy: e.clientY - r.top, button: e.button, shift: e.shiftKey, alt: e.altKey, ctrl: e.ctrlKey || e.metaKey, pointerId: e.pointerId, pointerType: e.pointerType, detail: e.detail };
}

export function BoardCanvas({ overlay, className }: { overlay?: ReactNode; className?: string }) {
  const c = useBoard();
  const ref = useRef<HTMLDivElement>(null);
  const size = useStore(c.size);
  const tool = useStore(c.ui).tool;

  useEffect(() => {
    const el = ref.current!;
    const ro = new ResizeObserver(() => c.setSize(el.clientWidth, el.clientHeight));
    ro.observe(el);
    c.setSize(el.clientWidth, el.clientHeight);
    const wheel = (e: WheelEvent) => {
      e.preventDefault();
      const r = el.getBoundingClientRect();
      c.wheel(e.clientX - r.left, e.clientY - r.top, e.deltaY, e.deltaMode);
    };
    el.addEventListener('wheel', wheel, { passive: false });
    return () => {
      ro.disconnect();
      el.removeEventListener('wheel', wheel);
    };
  }, [c]);

  const cursor = tool.type === 'select' ? 'default' : 'crosshair';
  return (
    <div
      ref={ref}
      className={className}
      data-testid="board-canvas"
      style={{ overflow: 'hidden', touchAction: 'none', cursor, userSelect: 'none' }}
      onContextMenu={(e) => e.preventDefault()}
      onPointerDown={(e) => {
        (e.currentTarget as HTMLElement).setPointerCapture(e.pointerId);
        (document.activeElement as HTMLElement | null)?.blur?.();
        c.pointerDown(pointerInput(e, ref.current!));
      }}
      onPointerMove={(e) => c.pointerMove(pointerInput(e, ref.current!))}
      onPointerUp={(e) => c.pointerUp(pointerInput(e, ref.current!))}
      onPointerCancel={(e) => c.pointerCancel(pointerInput(e, ref.current!))}
      onPointerLeave={() => c.pointerLeave()}
      onDoubleClick={(e) => {
        const r = ref.current!.getBoundingClientRect();
        c.doubleClick(e.clientX - r.left, e.clientY - r.top);
      }}
      onDragOver={(e) => {
        if (e.dataTransfer.types.includes('application/x-dewline-kind')) e.preventDefault();
      }}
      onDrop={(e) => {
        const kind = e.dataTransfer.getData('application/x-dewline-kind');
        if (!kind) return;
        e.preventDefault();
        const r = ref.current!.getBoundingClientRect();
        const w = c.toWorld(e.clientX - r.left, e.clientY - r.top);
        if (kind.startsWith('zone:')) {
          c.placeZone(kind.slice(5) as never, { minX: w[0], minY: w[1], maxX: w[0] + 1, maxY: w[1] + 1 });
        } else if (kind === 'polygon') c.setTool({ type: 'polygon' });
        else c.placePart(kind, w);
      }}
    >
      <Stage width={size.width} height={size.height} listening={false}>
        <ZonesLayer />
        <PartsLayers />
        {overlay}
        <GridLayer />
        <ScreenLayer />
        <SelectionLayer />
      </Stage>
    </div>
  );
}
