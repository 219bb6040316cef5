import { linearRegression, mean, rSquared } from 'simple-statistics';
import { studentTTwoSidedP } from './distributions';

export interface OlsResult {
  n: number;
  slope: number;
  intercept: number;
  rSquared: number;
  /** √(SSE / (n − 2)). */
  residualSd: number;
  /** Standard error of the slope, residualSd / √Sxx. */
  slopeSe: number;
  /** Two-sided p-value for slope = 0 (Student t, n − 2 degrees of freedom). */
  slopeP: number;
}

/**
 * Ordinary least squares of y on x. The fit itself is simple-statistics' linearRegression;
 * the slope's standard error and t test are the textbook formulae built on its residuals.
 * Returns null when the slope is not estimable (fewer than 3 points or all x equal).
 */
export function olsFit(xs: readonly number[], ys: readonly number[]): OlsResult | null {
  if (xs.length !== ys.length) throw new RangeError('olsFit: xs and ys differ in length');
  const n = xs.length;
  if (n < 3) return null;
  const xBar = mean([...xs]);
  const sxx = xs.reduce((s, x) => s + (x - xBar) ** 2, 0);
  if (!(sxx > 0)) return null;
  const points = xs.map((x, i) => [x, ys[i] as number]);
  const { m: slope, b: intercept } = linearRegression(points);
  const sse = points.reduce((s, [x, y]) => s + ((y as number) - (intercept + slope * (x as number))) ** 2, 0);
  const residualSd = Math.sqrt(sse / (n - 2));
  const slopeSe = residualSd / Math.sqrt(sxx);
  const line = (x: number) => intercept + slope * x;
  // rSquared is NaN when all y are equal (no variance to explain); report 0 then.
  const r2raw = rSquared(points, line);
  const r2 = Number.isFinite(r2raw) ? r2raw : 0;
  let slopeP: number;
  if (slopeSe > 0) slopeP = studentTTwoSidedP(slope / slopeSe, n - 2);
  else slopeP = slope === 0 ? 1 : 0; // a perfect line: zero slope means no trend, any other is certain
  return { n, slope, intercept, rSquared: r2, residualSd, slopeSe, slopeP };
}
