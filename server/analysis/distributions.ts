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

/**
 * P(X ≤ k) for X ~ Binomial(n, p), through the regularized incomplete beta function:
 * P(X ≤ k) = I_{1−p}(n − k, k + 1). (jstat's own binomial.cdf rounds to 10 decimals, which
 * loses the small tails the tests need.)
 */
export function binomialCdf(k: number, n: number, p: number): number {
  if (k < 0) return 0;
  if (k >= n) return 1;
  if (p <= 0) return 1;
  if (p >= 1) return 0;
  return Math.min(1, Math.max(0, jStat.ibeta(1 - p, n - k, k + 1)));
}

/** P(X ≥ k) for X ~ Binomial(n, p) = I_p(k, n − k + 1), kept precise in the far tail. */
export function binomialUpper(k: number, n: number, p: number): number {
  if (k <= 0) return 1;
  if (k > n) return 0;
  if (p <= 0) return 0;
  if (p >= 1) return 1;
  return Math.min(1, Math.max(0, jStat.ibeta(p, k, n - k + 1)));
}
