/** Drainage board: dimpled sheet against a foundation wall. */
import { defineKind, len, orientationParam, orientedRect, orientedRectHandles } from '../kind';

export const drainageBoard = defineKind({
  kind: 'drainage-board',
  title: 'Drainage board',
  description: 'Dimpled drainage sheet',
  params: {
    thickness: len('Thickness', 0.008, 0.05, [0.006, 0.02]),
    length: len('Length', 2, 30, [0.3, 6]),
    orientation: orientationParam,
  },
  defaultMaterial: 'drainage-board',
  pieces: (p, material) => [{ polygon: orientedRect(p.orientation, p.thickness, p.length), material, role: 'drainage board' }],
  handles: (p) => orientedRectHandles(p.orientation, p.thickness, p.length),
  label: (p, l) => `Drainage board ${l(p.thickness)}`,
});
