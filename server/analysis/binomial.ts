// Binomial tails and the tests and intervals built on them. Probabilities come from jstat
// (distributions.ts); nothing here is a hand-written special function.
import { binomialCdf, binomialUpper } from './distributions';

/**
 * Exact one-sided binomial test that the true rate is above p0, given k of n: P(X ≥ k | p0).
 * Used for "the share making this change is above 25 %" (draft-wide), so small trials are judged
 * by the exact distribution, not a normal approximation.
 */
export function rateAboveP(k: number, n: number, p0: number): number {
  return n > 0 ? binomialUpper(k, n, p0) : 1;
}

/**
 * Exact two-sided sign test (e.g. Conover, Practical Nonparametric Statistics, §3.4): among values
 * not equal to 0, `below` under and `above` over; p = min(1, 2·P(X ≤ min)) for X ~ Binomial(n, ½).
 * Zeros carry no sign and are left out, the usual convention.
 */
export function signTest(belowCount: number, aboveCount: number): number {
  const n = belowCount + aboveCount;
  if (n === 0) return 1;
  const k = Math.min(belowCount, aboveCount);
  return Math.min(1, 2 * binomialCdf(k, n, 0.5));
}

/**
 * Distribution-free confidence interval of a median from order statistics (e.g. Conover §3.2;
 * Hollander & Wolfe): the j-th smallest and j-th largest values, with j the largest rank whose
 * binomial(n, ½) tail P(X < j) stays within (1 − confidence)/2. Returns null when n is too small
 * for any such interval (n ≤ 5 at 95 %), and the coverage actually reached otherwise.
 */
export function medianInterval(values: readonly number[], confidence: number): { low: number; high: number; coverage: number } | null {
  const sorted = [...values].sort((a, b) => a - b);
  const n = sorted.length;
  const tail = (1 - confidence) / 2;
  let j = 0;
  for (let r = 1; r <= Math.floor(n / 2); r++) {
    // P(X ≤ r − 1) = P(X < r)
    if (binomialCdf(r - 1, n, 0.5) <= tail + 1e-12) j = r;
    else break;
  }
  if (j === 0) return null;
  const coverage = 1 - 2 * binomialCdf(j - 1, n, 0.5);
  return { low: sorted[j - 1] as number, high: sorted[n - j] as number, coverage };
}
