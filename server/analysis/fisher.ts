import { hypergeometricPdf } from './distributions';

export interface FisherResult {
  /** P(X ≥ a): the first row's rate is greater than the second's. */
  greater: number;
  /** P(X ≤ a): the first row's rate is less than the second's. */
  less: number;
  /** Sum of the probabilities of all tables no more likely than the observed one. */
  twoSided: number;
}

/**
 * Fisher's exact test for the 2×2 table
 *     [ a  b ]   (row 1: a successes, b failures)
 *     [ c  d ]   (row 2: c successes, d failures)
 * conditioning on the margins, so X = a is hypergeometric. p-values are sums of the
 * hypergeometric probabilities (through log-gamma, distributions.ts) over the tables as or more
 * extreme than the observed one.
 */
export function fisherExact(a: number, b: number, c: number, d: number): FisherResult {
  for (const v of [a, b, c, d]) {
    if (!Number.isInteger(v) || v < 0) throw new RangeError('fisherExact: cells must be non-negative integers');
  }
  const row1 = a + b;
  const col1 = a + c;
  const total = a + b + c + d;
  if (total === 0) return { greater: 1, less: 1, twoSided: 1 };
  const lo = Math.max(0, row1 + col1 - total);
  const hi = Math.min(row1, col1);
  const observed = hypergeometricPdf(a, total, col1, row1);
  // Relative tolerance so tables equal in probability to the observed one but differing in the
  // last bits of floating point are counted as "as extreme" (the usual convention, as in R).
  const cutoff = observed * (1 + 1e-7);
  let greater = 0;
  let less = 0;
  let twoSided = 0;
  for (let x = lo; x <= hi; x++) {
    const p = hypergeometricPdf(x, total, col1, row1);
    if (x >= a) greater += p;
    if (x <= a) less += p;
    if (p <= cutoff) twoSided += p;
  }
  const clamp = (p: number) => Math.min(1, Math.max(0, p));
  return { greater: clamp(greater), less: clamp(less), twoSided: clamp(twoSided) };
}
