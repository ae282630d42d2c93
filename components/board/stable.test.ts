import { createElement } from 'react';
import { describe, expect, it } from 'vitest';
import { keepUnchanged, sameData, sameElement } from './stable';

function Label(props: { text: string; x: number }) {
  return createElement('label', null, props.text, props.x);
}

describe('keeping unchanged elements', () => {
  it('compares plain data by value and functions by identity', () => {
    expect(sameData([1, 2, [3, { a: 'b' }]], [1, 2, [3, { a: 'b' }]])).toBe(true);
    expect(sameData([1, 2, 3], [1, 2, 3.0000001])).toBe(false);
    expect(sameData({ a: 1 }, { a: 1, b: undefined })).toBe(false);
    expect(sameData(NaN, NaN)).toBe(true);
    const f = () => 1;
    expect(sameData(f, f)).toBe(true);
    expect(sameData(f, () => 1)).toBe(false);
    expect(sameData(new Date(0), new Date(0))).toBe(false); // not plain data: only identical counts
  });
  it('elements equal by type, key and props, children included', () => {
    const a = createElement('g', { key: 'k', points: [0, 1, 2] }, createElement(Label, { text: 'a', x: 1 }));
    expect(sameElement(a, createElement('g', { key: 'k', points: [0, 1, 2] }, createElement(Label, { text: 'a', x: 1 })))).toBe(true);
    expect(sameElement(a, createElement('g', { key: 'k', points: [0, 1, 2] }, createElement(Label, { text: 'b', x: 1 })))).toBe(false);
    expect(sameElement(a, createElement('g', { key: 'j', points: [0, 1, 2] }, createElement(Label, { text: 'a', x: 1 })))).toBe(false);
    expect(sameElement(a, createElement('h', { key: 'k', points: [0, 1, 2] }, createElement(Label, { text: 'a', x: 1 })))).toBe(false);
  });
  it('hands back the previous objects where nothing changed, and the previous list when nothing at all did', () => {
    const build = (x: number, label = 'zone') => [createElement(Label, { key: 'z', text: label, x: 10 }), createElement('line', { key: 's', points: [x, 0, x + 5, 5] })];
    const first = build(1);
    const same = keepUnchanged(first, build(1));
    expect(same).toBe(first);
    const moved = keepUnchanged(first, build(2));
    expect(moved).not.toBe(first);
    expect(moved[0]).toBe(first[0]); // the label did not change: React skips it
    expect(moved[1]).not.toBe(first[1]);
    const relabelled = keepUnchanged(first, build(1, 'garage'));
    expect(relabelled[0]).not.toBe(first[0]);
    expect(relabelled[1]).toBe(first[1]);
    // Reordered or shortened lists keep equal elements but are new lists.
    const swapped = keepUnchanged(first, [...build(1)].reverse());
    expect(swapped).not.toBe(first);
    expect(swapped[0]).toBe(first[1]);
    expect(keepUnchanged(first, build(1).slice(0, 1))).toEqual([first[0]]);
    expect(keepUnchanged(null, first)).toBe(first);
  });
});
