/**
 * Typed values: SI and inch-pound entries with units; a bad entry is refused at the field with a clear
 * message, and (through the board's controller on a real Y.Doc) the document stays exactly as it was.
 */
import { describe, expect, it } from 'vitest';
import * as Y from 'yjs';
import { docFromSnapshot } from '@/lib/section/doc';
import { partKind } from '@/lib/section/registry';
import type { ParamSpec } from '@/lib/section/params';
import { templateByName } from '@/lib/section/templates/index';
import { BoardController } from './controller';
import { parseCoordinate, parseParamField, parseQuantityField, showParam, typicalWarning } from './fields';

const thickness = partKind('board')!.params.thickness as ParamSpec;
const IN = 0.0254; // exact by definition (international inch, 1959)

describe('fields', () => {
  it.each([
    ['50mm', 'si', 0.05],
    ['50 mm', 'ip', 0.05],
    ['2 in', 'si', 2 * IN],
    ['5-1/2"', 'si', 5.5 * IN],
    ['1\' 6"', 'si', 18 * IN],
    ['0.1 m', 'ip', 0.1],
    ['25', 'si', 0.025],
    ['1.5', 'ip', 1.5 * IN],
  ] as const)('reads %s (%s) as %f m', (text, sys, m) => {
    const r = parseParamField(thickness, text, sys);
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.value).toBeCloseTo(m, 12);
  });

  it('refuses zero, negative, too large and unreadable values with the reason', () => {
    expect(parseParamField(thickness, '0', 'si')).toEqual({ ok: false, message: 'must be greater than 0, got 0 mm' });
    expect(parseParamField(thickness, '-5 mm', 'si')).toEqual({ ok: false, message: 'must be greater than 0, got -5 mm' });
    const big = parseParamField(thickness, '2 m', 'si');
    expect(big.ok).toBe(false);
    if (!big.ok) expect(big.message).toMatch(/must be at most 1 m, got 2 m/);
    const junk = parseParamField(thickness, 'thick', 'si');
    expect(junk.ok).toBe(false);
    if (!junk.ok) expect(junk.message).toMatch(/cannot read 'thick' as a length/);
    const empty = parseParamField(thickness, '   ', 'ip');
    expect(empty.ok).toBe(false);
    if (!empty.ok) expect(empty.message).toMatch(/enter a length/);
  });

  it('says the limit in the unit system on screen', () => {
    const r = parseParamField(thickness, '-1 in', 'ip');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/^must be greater than 0, got -1"?/);
  });

  it('shows values and warns outside the typical range', () => {
    expect(showParam(thickness, 0.05, 'si')).toBe('50 mm');
    expect(typicalWarning(thickness, 0.05, 'si')).toBeNull();
    expect(typicalWarning(thickness, 0.3, 'si')).toMatch(/unusual: typical 25 mm to 150 mm/);
  });

  it('coordinates and quantities', () => {
    const c = parseCoordinate('-3 in', 'si');
    expect(c.ok && c.value).toBeCloseTo(-3 * IN, 12);
    expect(parseCoordinate('left', 'si').ok).toBe(false);
    const t = parseQuantityField('temperature', '68 F', 'si', { min: -80, max: 100 });
    expect(t.ok && t.value).toBeCloseTo(20, 9); // (68 - 32) / 1.8, exact
    const low = parseQuantityField('temperature', '-100', 'si', { min: -80, max: 100 });
    expect(low).toEqual({ ok: false, message: expect.stringMatching(/must be at least -80/) });
  });

  it('a refused entry changes nothing in the document', () => {
    const doc = docFromSnapshot(templateByName('slab-edge-break')!.build());
    const c = new BoardController(doc, { who: 'test' });
    const before = Y.encodeStateAsUpdate(doc);
    const snapBefore = JSON.stringify(c.snapshot());
    const r = parseParamField(thickness, '0 mm', 'si');
    expect(r.ok).toBe(false);
    // Even past the field, the model refuses it and the document is untouched.
    const err = c.updatePart('edge', { thickness: 0 });
    expect(err).toMatch(/Slab-edge break thickness: must be greater than 0/);
    expect(Buffer.from(Y.encodeStateAsUpdate(doc))).toEqual(Buffer.from(before));
    expect(JSON.stringify(c.snapshot())).toBe(snapBefore);
    expect(c.undoManager.undoStack.length).toBe(0);
    // A good entry goes through and is one undo step.
    const ok = parseParamField(thickness, '2 in', 'si');
    expect(ok.ok).toBe(true);
    if (ok.ok) expect(c.updatePart('edge', { thickness: ok.value })).toBeNull();
    expect(c.snapshot().parts.find((p) => p.id === 'edge')!.thickness).toBeCloseTo(2 * IN, 12);
    c.undo();
    expect(JSON.stringify(c.snapshot())).toBe(snapBefore);
    c.dispose();
  });
});
