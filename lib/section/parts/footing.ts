/** Footing: a spread footing under a wall, optionally with a keyway along its top. Origin bottom-left. */
import { rectPolygon } from '../geometry';
import { boxHandles, defineKind, len } from '../kind';

export const footing = defineKind({
  kind: 'footing',
  title: 'Footing',
  description: 'Spread footing under a foundation wall',
  params: {
    width: len('Width', 0.6, 5, [0.3, 1.2]),
    depth: len('Depth', 0.25, 2, [0.15, 0.5]),
    keyway: { type: 'flag', label: 'Keyway', default: false, help: 'A groove along the top that locks the wall in place' },
    keywayWidth: len('Keyway width', 0.09, 1, [0.04, 0.15]),
    keywayDepth: len('Keyway depth', 0.04, 0.5, [0.02, 0.06]),
  },
  defaultMaterial: 'concrete-2300-rc',
  pieces(p, material) {
    if (!p.keyway) return [{ polygon: rectPolygon(0, 0, p.width, p.depth), material, role: 'footing' }];
    const l = (p.width - p.keywayWidth) / 2, r = l + p.keywayWidth, b = p.depth - p.keywayDepth;
    return [
      {
        polygon: [[0, 0], [p.width, 0], [p.width, p.depth], [r, p.depth], [r, b], [l, b], [l, p.depth], [0, p.depth]],
        material,
        role: 'footing',
      },
      // The wall's concrete fills the keyway; drawn as its own piece so the sheet shows the groove.
      { polygon: rectPolygon(l, b, p.keywayWidth, p.keywayDepth), material, role: 'keyway fill' },
    ];
  },
  handles: (p) => boxHandles('width', 'depth', p.width, p.depth),
  label: (p, l) => `Footing ${l(p.width)} × ${l(p.depth)}${p.keyway ? ', keyed' : ''}`,
  check(p) {
    const out = [];
    if (p.keyway && p.keywayWidth >= p.width) out.push({ param: 'keywayWidth', message: `must be less than the footing width (${p.width} m), got ${p.keywayWidth} m` });
    if (p.keyway && p.keywayDepth >= p.depth) out.push({ param: 'keywayDepth', message: `must be less than the footing depth (${p.depth} m), got ${p.keywayDepth} m` });
    return out;
  },
});
