// The only module that talks to jstat: every special function (normal and Student t CDFs and
// quantiles, hypergeometric probabilities) comes from the library, none is hand-written.
import { jStat } from 'jstat';

export function normalCdf(x: number): number {
  return jStat.normal.cdf(x, 0, 1);
}

export function normalQuantile(p: number): number {
  return jStat.normal.inv(p, 0, 1);
}

/** Two-sided p-value of a standard-normal statistic. */
export function normalTwoSidedP(z: number): number {
  if (!Number.isFinite(z)) return Number.isNaN(z) ? 1 : 0;
  // 2·Φ(−|z|) rather than 2·(1 − Φ(|z|)) keeps precision for large |z|.
  return Math.min(1, 2 * normalCdf(-Math.abs(z)));
}

export function studentTCdf(t: number, df: number): number {
  return jStat.studentt.cdf(t, df);
}

export function studentTQuantile(p: number, df: number): number {
  return jStat.studentt.inv(p, df);
}

/** Two-sided p-value of a t statistic with df degrees of freedom. */
export function studentTTwoSidedP(t: number, df: number): number {
  if (Number.isNaN(t)) return 1;
  if (!Number.isFinite(t)) return 0;
  return Math.min(1, Math.max(0, 2 * studentTCdf(-Math.abs(t), df)));
}

/**
 * P(X = k) for X hypergeometric: `draws` items taken from `population` items of which
 * `successes` are successes.
 */
export function hypergeometricPdf(k: number, population: number, successes: number, draws: number): number {
  const lo = Math.max(0, draws - (population - successes));
  const hi = Math.min(draws, successes);
  if (!Number.isInteger(k) || k < lo || k > hi) return 0;
  // jstat returns 1 trivially only for non-degenerate cases; handle the single-table case here.
  if (lo === hi) return 1;
  return jStat.hypgeom.pdf(k, population, successes, draws);
}
