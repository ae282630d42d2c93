/**
 * Material fills after the trade's section-drafting conventions: stipple and aggregate for concrete,
 * diagonal hatching for masonry, soil marks for earth, pebbles for gravel, grain for wood, cross-hatching
 * for rigid board insulation, loops for batts, a solid dark band for membranes. Each fill is one small
 * tile drawn once per pattern (cached) and repeated by Konva, so 200 parts cost 200 pattern fills.
 */
import type { FillPattern } from '@/lib/materials/material';

import { FILL_STYLES, type FillStyle } from '@/lib/materials/fill-colours';

export { FILL_STYLES, type FillStyle };

/** Tile size in CSS pixels; drawn at TILE_RES times for crisp high-density screens. */
export const TILE = 24;
export const TILE_RES = 2;

/** Deterministic pseudo-random numbers, so a fill looks the same on every screen and every load. */
function rng(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 4294967296;
  };
}

type Ctx = CanvasRenderingContext2D;

/** Draw a mark and its copies one tile away, so marks crossing the tile edge repeat seamlessly. */
function wrapped(ctx: Ctx, draw: (ox: number, oy: number) => void) {
  for (const ox of [-TILE, 0, TILE]) for (const oy of [-TILE, 0, TILE]) draw(ox, oy);
}

function hatch(ctx: Ctx, spacing: number, dir: 1 | -1, width = 0.8) {
  ctx.lineWidth = width;
  ctx.beginPath();
  for (let c = -TILE; c <= 2 * TILE; c += spacing) {
    if (dir === 1) {
      ctx.moveTo(c - TILE, TILE);
      ctx.lineTo(c, 0);
    } else {
      ctx.moveTo(c, TILE);
      ctx.lineTo(c - TILE, 0);
    }
  }
  ctx.stroke();
}

const DRAW: Record<FillPattern, (ctx: Ctx) => void> = {
  concrete(ctx) {
    const r = rng(11);
    for (let i = 0; i < 26; i++) {
      const x = r() * TILE, y = r() * TILE;
      wrapped(ctx, (ox, oy) => ctx.fillRect(x + ox, y + oy, 0.9, 0.9));
    }
    ctx.lineWidth = 0.7;
    for (let i = 0; i < 3; i++) {
      const x = r() * TILE, y = r() * TILE, s = 2 + r() * 1.6, a = r() * Math.PI;
      wrapped(ctx, (ox, oy) => {
        ctx.beginPath();
        for (let k = 0; k < 3; k++) {
          const t = a + (k * 2 * Math.PI) / 3;
          const px = x + ox + Math.cos(t) * s, py = y + oy + Math.sin(t) * s;
          if (k) ctx.lineTo(px, py);
          else ctx.moveTo(px, py);
        }
        ctx.closePath();
        ctx.stroke();
      });
    }
  },
  masonry(ctx) {
    hatch(ctx, 6, 1);
  },
  earth(ctx) {
    const r = rng(5);
    ctx.lineWidth = 0.8;
    for (let i = 0; i < 5; i++) {
      const x = r() * TILE, y = r() * TILE;
      wrapped(ctx, (ox, oy) => {
        ctx.beginPath();
        for (let k = 0; k < 3; k++) {
          ctx.moveTo(x + ox + k * 2.2, y + oy);
          ctx.lineTo(x + ox + k * 2.2 - 2.5, y + oy + 2.5);
        }
        ctx.stroke();
      });
    }
    for (let i = 0; i < 10; i++) {
      const x = r() * TILE, y = r() * TILE;
      wrapped(ctx, (ox, oy) => ctx.fillRect(x + ox, y + oy, 1, 1));
    }
  },
  gravel(ctx) {
    const r = rng(7);
    ctx.lineWidth = 0.8;
    for (let i = 0; i < 7; i++) {
      const x = r() * TILE, y = r() * TILE, rx = 1.6 + r() * 1.8, ry = 1.2 + r() * 1.2, a = r() * Math.PI;
      wrapped(ctx, (ox, oy) => {
        ctx.beginPath();
        ctx.ellipse(x + ox, y + oy, rx, ry, a, 0, 2 * Math.PI);
        ctx.stroke();
      });
    }
  },
  rock(ctx) {
    const r = rng(3);
    ctx.lineWidth = 0.8;
    for (let i = 0; i < 3; i++) {
      const x = r() * TILE, y = r() * TILE;
      wrapped(ctx, (ox, oy) => {
        ctx.beginPath();
        ctx.moveTo(x + ox, y + oy);
        ctx.lineTo(x + ox + 5, y + oy + 1.5);
        ctx.lineTo(x + ox + 3.5, y + oy + 5);
        ctx.lineTo(x + ox - 1, y + oy + 3.5);
        ctx.closePath();
        ctx.stroke();
      });
    }
    hatch(ctx, 12, -1, 0.4);
  },
  wood(ctx) {
    ctx.lineWidth = 0.8;
    ctx.beginPath();
    for (let y = 3; y < TILE; y += 6) {
      ctx.moveTo(0, y);
      ctx.bezierCurveTo(TILE * 0.33, y - 2, TILE * 0.66, y + 2, TILE, y);
    }
    ctx.stroke();
  },
  sheet(ctx) {
    ctx.lineWidth = 0.6;
    ctx.beginPath();
    for (let y = 2; y < TILE; y += 4) {
      ctx.moveTo(0, y);
      ctx.lineTo(TILE, y);
    }
    ctx.stroke();
  },
  gypsum(ctx) {
    const r = rng(13);
    for (let i = 0; i < 9; i++) {
      const x = r() * TILE, y = r() * TILE;
      wrapped(ctx, (ox, oy) => ctx.fillRect(x + ox, y + oy, 1, 1));
    }
  },
  board(ctx) {
    hatch(ctx, 8, 1, 0.7);
    hatch(ctx, 8, -1, 0.7);
  },
  foam(ctx) {
    const r = rng(17);
    ctx.lineWidth = 0.6;
    for (let i = 0; i < 9; i++) {
      const x = r() * TILE, y = r() * TILE, s = 1.2 + r() * 1.5;
      wrapped(ctx, (ox, oy) => {
        ctx.beginPath();
        ctx.arc(x + ox, y + oy, s, 0, 2 * Math.PI);
        ctx.stroke();
      });
    }
  },
  batt(ctx) {
    // Loops: a run of semicircles back and forth, the drafting sign of a fibrous batt.
    ctx.lineWidth = 0.9;
    ctx.beginPath();
    const rr = TILE / 4;
    for (let y = 0; y <= TILE; y += TILE / 2) {
      for (let i = 0; i < 2; i++) {
        const cx = i * (TILE / 2) + rr;
        ctx.moveTo(cx - rr, y + TILE / 4);
        ctx.arc(cx, y + TILE / 4, rr, Math.PI, 0, i % 2 === 1);
      }
    }
    ctx.stroke();
  },
  membrane() {},
  metal(ctx) {
    hatch(ctx, 4, 1, 0.6);
  },
  plain() {},
};

const cache = new Map<string, HTMLCanvasElement>();

/** The repeating tile of a fill (cached). */
export function fillTile(pattern: FillPattern): HTMLCanvasElement {
  const hit = cache.get(pattern);
  if (hit) return hit;
  const c = document.createElement('canvas');
  c.width = c.height = TILE * TILE_RES;
  const ctx = c.getContext('2d')!;
  ctx.scale(TILE_RES, TILE_RES);
  const st = FILL_STYLES[pattern] ?? FILL_STYLES.plain;
  ctx.fillStyle = st.base;
  ctx.fillRect(0, 0, TILE, TILE);
  ctx.strokeStyle = st.ink;
  ctx.fillStyle = st.ink;
  (DRAW[pattern] ?? DRAW.plain)(ctx);
  cache.set(pattern, c);
  return c;
}

export function fillStyle(pattern: FillPattern | undefined): FillStyle {
  return FILL_STYLES[pattern ?? 'plain'] ?? FILL_STYLES.plain;
}

/** Zone tints: light washes, each kind its own, with a dashed outline drawn by the board. */
export const ZONE_STYLES: Record<string, { fill: string; edge: string }> = {
  indoor: { fill: 'rgba(222, 160, 92, 0.14)', edge: '#b0743a' },
  outdoor: { fill: 'rgba(96, 142, 196, 0.12)', edge: '#4d77a8' },
  'ground-surface': { fill: 'rgba(118, 150, 88, 0.22)', edge: '#5e7d42' },
  unconditioned: { fill: 'rgba(140, 140, 150, 0.15)', edge: '#6e6e7a' },
  fixed: { fill: 'rgba(150, 110, 170, 0.15)', edge: '#7b5a8c' },
};
