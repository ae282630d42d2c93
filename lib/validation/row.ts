/** One line of the validation table: a published or exact reference against Dewline's figure. */
export interface ValidationRow {
  /** Group of cases, e.g. 'ISO 10211 Annex A case 1'. */
  group: string;
  /** What is compared, e.g. 'T(0.25, 1.75)'. */
  name: string;
  /** Where the reference comes from (standard and clause, or the exact formula). */
  source: string;
  reference: number;
  ours: number;
  /** |ours - reference|, or that divided by `scale` when the tolerance is relative. */
  difference: number;
  tolerance: number;
  /** Unit of reference and ours (for the table). */
  unit: string;
  /** How the difference is measured: 'abs' in the unit, or 'rel' (a fraction of `scale`). */
  measure: 'abs' | 'rel';
  /** Divisor of a relative difference (the reference itself, or a temperature difference). */
  scale: number;
  pass: boolean;
}

export function absRow(group: string, name: string, source: string, reference: number, ours: number, tolerance: number, unit: string): ValidationRow {
  const difference = Math.abs(ours - reference);
  return { group, name, source, reference, ours, difference, tolerance, unit, measure: 'abs', scale: 1, pass: difference <= tolerance };
}

/** Relative difference |ours - reference| / scale (scale defaults to |reference|). */
export function relRow(group: string, name: string, source: string, reference: number, ours: number, tolerance: number, unit: string, scale = Math.abs(reference)): ValidationRow {
  const difference = Math.abs(ours - reference) / scale;
  return { group, name, source, reference, ours, difference, tolerance, unit, measure: 'rel', scale, pass: difference <= tolerance };
}
