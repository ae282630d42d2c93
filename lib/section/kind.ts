/**
 * What a part kind declares. One module per kind in ./parts, listed once in ./registry.
 * Geometry is in the part's local frame: metres, x to the right, y up; the part's position
 * (x, y, or a join) places the local origin in the section.
 */
import type { Material } from '../materials/material';
import type { Point } from './geometry';
import type { ParamSpecs, ParamValues } from './params';

/** A solid piece of a part: a polygon and what it is made of. */
export interface Piece {
  polygon: Point[];
  /** Material id, or a material the kind derives (an equivalent conductivity) with its own id. */
  material: string | Material;
  /** What the piece is, for drawing and the sheet ("stud cavity", "capillary break"). */
  role: string;
}

/** A handle that edits one length parameter by dragging along an axis. */
export interface Handle {
  id: string;
  param: string;
  axis: 'x' | 'y';
  /** 'max': the far side moves, the origin stays. 'min': the near side moves with the pointer, the far side stays put. */
  side: 'min' | 'max';
  /** Where the handle sits, in the local frame. */
  at: Point;
}

export interface KindContext {
  material(id: string): Material | undefined;
}

/** A cross-parameter problem (an edge deeper than allowed, say), reported against one parameter. */
export interface ParamIssue {
  param: string;
  message: string;
}

export interface PartKind<S extends ParamSpecs = ParamSpecs> {
  kind: string;
  title: string;
  description: string;
  params: S;
  defaultMaterial: string;
  /** Pieces in the local frame, top-most last (later pieces win where they overlap). */
  pieces(p: ParamValues<S>, material: string, ctx: KindContext): Piece[];
  handles(p: ParamValues<S>): Handle[];
  /** Short label with the main sizes, lengths shown by `len`. */
  label(p: ParamValues<S>, len: (metres: number) => string): string;
  check?(p: ParamValues<S>): ParamIssue[];
}

/** Declare a kind with its parameter types inferred. */
export function defineKind<S extends ParamSpecs>(k: PartKind<S>): PartKind<S> {
  return k;
}

// Shared parameter shapes, so every kind spells its limits the same way.
export const len = (label: string, def: number, max: number, typical?: readonly [number, number], help?: string) =>
  ({ type: 'number', label, quantity: 'length', default: def, min: 0, minExclusive: true, max, typical, help }) as const;
export const orientationParam = {
  type: 'choice',
  label: 'Orientation',
  options: [
    { value: 'vertical', label: 'Vertical' },
    { value: 'horizontal', label: 'Horizontal' },
  ],
  default: 'vertical',
} as const;

/** A rectangle of `thickness` across and `length` along, standing up or lying down. */
export function orientedRect(orientation: string, thickness: number, length: number): Point[] {
  return orientation === 'horizontal'
    ? [[0, 0], [length, 0], [length, thickness], [0, thickness]]
    : [[0, 0], [thickness, 0], [thickness, length], [0, length]];
}

/** Handles for an oriented rectangle: thickness on both faces, length at the far end. */
export function orientedRectHandles(orientation: string, thickness: number, length: number): Handle[] {
  if (orientation === 'horizontal')
    return [
      { id: 'thickness-top', param: 'thickness', axis: 'y', side: 'max', at: [length / 2, thickness] },
      { id: 'thickness-bottom', param: 'thickness', axis: 'y', side: 'min', at: [length / 2, 0] },
      { id: 'length-right', param: 'length', axis: 'x', side: 'max', at: [length, thickness / 2] },
      { id: 'length-left', param: 'length', axis: 'x', side: 'min', at: [0, thickness / 2] },
    ];
  return [
    { id: 'thickness-right', param: 'thickness', axis: 'x', side: 'max', at: [thickness, length / 2] },
    { id: 'thickness-left', param: 'thickness', axis: 'x', side: 'min', at: [0, length / 2] },
    { id: 'length-top', param: 'length', axis: 'y', side: 'max', at: [thickness / 2, length] },
    { id: 'length-bottom', param: 'length', axis: 'y', side: 'min', at: [thickness / 2, 0] },
  ];
}

/** Handles for a width x height rectangle with its origin at the bottom-left. */
export function boxHandles(wParam: string, hParam: string, w: number, h: number): Handle[] {
  return [
    { id: `${wParam}-right`, param: wParam, axis: 'x', side: 'max', at: [w, h / 2] },
    { id: `${wParam}-left`, param: wParam, axis: 'x', side: 'min', at: [0, h / 2] },
    { id: `${hParam}-top`, param: hParam, axis: 'y', side: 'max', at: [w / 2, h] },
    { id: `${hParam}-bottom`, param: hParam, axis: 'y', side: 'min', at: [w / 2, 0] },
  ];
}
