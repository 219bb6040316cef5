import { sampleCorrelation, sampleStandardDeviation } from 'simple-statistics';
import { studentTTwoSidedP } from './distributions';

export interface CorrelationResult {
  r: number;
  /** Two-sided p-value for r = 0 via t = r√((n − 2)/(1 − r²)) on n − 2 degrees of freedom. */
  p: number;
  n: number;
}

/**
 * Pearson correlation with its p-value. Returns null when it is undefined: fewer than 3 pairs
 * or no spread in either variable.
 */
export function pearson(xs: readonly number[], ys: readonly number[]): CorrelationResult | null {
  if (xs.length !== ys.length) throw new RangeError('pearson: xs and ys differ in length');
  const n = xs.length;
  if (n < 3) return null;
  if (!(sampleStandardDeviation([...xs]) > 0) || !(sampleStandardDeviation([...ys]) > 0)) return null;
  const r = Math.max(-1, Math.min(1, sampleCorrelation([...xs], [...ys])));
  const p = Math.abs(r) >= 1 ? 0 : studentTTwoSidedP(r * Math.sqrt((n - 2) / (1 - r * r)), n - 2);
  return { r, p, n };
}
