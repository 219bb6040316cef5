// The only module that talks to jstat: every special function (normal and Student t CDFs and
// quantiles, log-gamma for hypergeometric probabilities) comes from the library, none is hand-written.
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

// ln(n!) for the hypergeometric: up to 170! (the largest factorial a double holds) the logarithm of
// the factorial itself, exact to the last bits, so small tables keep every digit; above it jstat's
// log-gamma, ln(n!) = lnΓ(n + 1). Kept for the sizes a trial reaches, so a probability costs three
// look-ups instead of a product over the table.
const LN_FACTORIAL: number[] = (() => {
  const out = [0];
  let f = 1;
  for (let i = 1; i <= 170; i += 1) {
    f *= i;
    out.push(Math.log(f));
  }
  return out;
})();
const LN_FACTORIAL_CACHED = 1 << 17;

function lnFactorial(n: number): number {
  if (n >= LN_FACTORIAL_CACHED) return jStat.gammaln(n + 1);
  for (let i = LN_FACTORIAL.length; i <= n; i += 1) LN_FACTORIAL.push(jStat.gammaln(i + 1));
  return LN_FACTORIAL[n];
}

/** ln C(n, k). */
export function lnChoose(n: number, k: number): number {
  return lnFactorial(n) - lnFactorial(k) - lnFactorial(n - k);
}

/**
 * P(X = k) for X hypergeometric: `draws` items taken from `population` items of which
 * `successes` are successes: C(successes, k) · C(population − successes, draws − k) / C(population, draws),
 * in logarithms.
 */
export function hypergeometricPdf(k: number, population: number, successes: number, draws: number): number {
  const lo = Math.max(0, draws - (population - successes));
  const hi = Math.min(draws, successes);
  if (!Number.isInteger(k) || k < lo || k > hi) return 0;
  // The single possible table.
  if (lo === hi) return 1;
  return Math.exp(lnChoose(successes, k) + lnChoose(population - successes, draws - k) - lnChoose(population, draws));
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
