/**
 * Keeping React elements whose props did not change. react-konva redraws a node's layer whenever React
 * commits new props to the node, equal or not, so a layer that re-renders on every pointer move (it reads
 * a store that changes then) redraws its whole canvas each time. Handing React the previous element
 * objects where nothing changed lets it skip them, and the layer is not drawn.
 */
import type { ReactElement, ReactNode } from 'react';
import { isValidElement } from 'react';

/** Plain data equal: primitives by Object.is, arrays and plain objects by their entries; functions only if identical. */
export function sameData(a: unknown, b: unknown): boolean {
  if (Object.is(a, b)) return true;
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false;
  if (Array.isArray(a) !== Array.isArray(b)) return false;
  if (Array.isArray(a)) {
    const bb = b as unknown[];
    return a.length === bb.length && a.every((x, i) => sameData(x, bb[i]));
  }
  if (Object.getPrototypeOf(a) !== Object.prototype || Object.getPrototypeOf(b) !== Object.prototype) return false;
  const ka = Object.keys(a), kb = Object.keys(b);
  return ka.length === kb.length && ka.every((k) => Object.prototype.hasOwnProperty.call(b, k) && sameData((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]));
}

/** Two elements of the same type and key with equal props (children compared the same way). */
export function sameElement(a: ReactElement, b: ReactElement): boolean {
  return a.type === b.type && a.key === b.key && sameProps(a.props as Record<string, unknown>, b.props as Record<string, unknown>);
}

function sameProps(a: Record<string, unknown>, b: Record<string, unknown>): boolean {
  const ka = Object.keys(a), kb = Object.keys(b);
  if (ka.length !== kb.length) return false;
  for (const k of ka) {
    const x = a[k], y = b[k];
    if (k === 'children') {
      if (!sameNode(x as ReactNode, y as ReactNode)) return false;
    } else if (!sameData(x, y)) return false;
  }
  return true;
}

function sameNode(a: ReactNode, b: ReactNode): boolean {
  if (Object.is(a, b)) return true;
  if (Array.isArray(a) && Array.isArray(b)) return a.length === b.length && a.every((x, i) => sameNode(x as ReactNode, b[i] as ReactNode));
  if (isValidElement(a) && isValidElement(b)) return sameElement(a, b);
  return false;
}

/**
 * `next`, with each element replaced by the element of `prev` that has its key when the two are equal;
 * `prev` itself when every element was kept and none added, removed or reordered.
 */
export function keepUnchanged(prev: readonly ReactNode[] | null, next: ReactNode[]): ReactNode[] {
  if (!prev) return next;
  const byKey = new Map<string, ReactElement>();
  for (const p of prev) if (isValidElement(p) && p.key !== null) byKey.set(p.key, p);
  let all = prev.length === next.length;
  const out = next.map((n, i) => {
    if (!isValidElement(n) || n.key === null) { all = false; return n; }
    const old = byKey.get(n.key);
    if (old && sameElement(old, n)) {
      if (prev[i] !== old) all = false;
      return old;
    }
    all = false;
    return n;
  });
  return all ? (prev as ReactNode[]) : out;
}
