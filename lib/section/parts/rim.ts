/**
 * Rim joist with the floor deck over it and optional insulation against its inner face.
 * Origin bottom-left of the rim; the floor runs inward (to the right unless set to the left).
 */
import type { Piece } from '../kind';
import { rectPolygon } from '../geometry';
import { defineKind, len } from '../kind';

export const rim = defineKind({
  kind: 'rim',
  title: 'Rim joist and floor deck',
  description: 'Rim (band) joist with the subfloor above it',
  params: {
    rimThickness: len('Rim thickness', 0.038, 0.2, [0.038, 0.05]),
    joistDepth: len('Joist depth', 0.235, 0.6, [0.184, 0.302]),
    deckThickness: len('Deck thickness', 0.018, 0.1, [0.015, 0.025]),
    deckLength: len('Deck extent inward', 1.2, 20, [0.5, 5]),
    deckMaterial: { type: 'material', label: 'Deck', default: 'plywood' },
    rimInsulation: { type: 'number', label: 'Insulation inside the rim', quantity: 'length', default: 0, min: 0, max: 0.3, help: '0 for none' },
    rimInsulationMaterial: { type: 'material', label: 'Rim insulation', default: 'spf-closed' },
    inward: { type: 'choice', label: 'Floor runs to the', options: [{ value: 'right', label: 'Right' }, { value: 'left', label: 'Left' }], default: 'right' },
  },
  defaultMaterial: 'softwood',
  pieces(p, material) {
    const r = p.rimThickness, h = p.joistDepth, L = p.deckLength, ins = p.rimInsulation;
    const right = p.inward === 'right';
    // Local frame: the rim's outer face is at x = 0 when the floor runs right, at x = L when it runs left.
    const rimX = right ? 0 : L - r;
    const pieces: Piece[] = [{ polygon: rectPolygon(rimX, 0, r, h), material, role: 'rim joist' }];
    if (ins > 0) pieces.push({ polygon: rectPolygon(right ? r : L - r - ins, 0, ins, h), material: p.rimInsulationMaterial, role: 'rim insulation' });
    pieces.push({ polygon: rectPolygon(0, h, L, p.deckThickness), material: p.deckMaterial, role: 'floor deck' });
    return pieces;
  },
  handles: (p) => [
    { id: 'joistDepth-bottom', param: 'joistDepth', axis: 'y', side: 'min', at: [p.rimThickness / 2, 0] },
    { id: p.inward === 'right' ? 'deckLength-right' : 'deckLength-left', param: 'deckLength', axis: 'x', side: p.inward === 'right' ? 'max' : 'min', at: [p.inward === 'right' ? p.deckLength : 0, p.joistDepth + p.deckThickness / 2] },
  ],
  label: (p, l) => `Rim joist ${l(p.joistDepth)} deep${p.rimInsulation > 0 ? `, ${l(p.rimInsulation)} inside` : ''}`,
  check: (p) => (p.rimThickness + p.rimInsulation > p.deckLength ? [{ param: 'deckLength', message: `must reach past the rim and its insulation (${p.rimThickness + p.rimInsulation} m), got ${p.deckLength} m` }] : []),
});
