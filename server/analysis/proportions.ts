import { normalQuantile } from './distributions';

export type Interval = [number, number];

/**
 * Wilson score interval for k successes in n trials (Wilson 1927; recommended by Newcombe 1998a).
 * Chosen over the Wald interval because per-size counts are tiny (often n = 2–4) and
 * the Wald interval collapses to zero width at k = 0 or k = n.
 */
export function wilsonInterval(k: number, n: number, confidence = 0.95): Interval {
  if (!Number.isInteger(k) || !Number.isInteger(n) || n <= 0 || k < 0 || k > n) {
    throw new RangeError(`wilsonInterval: need integers 0 ≤ k ≤ n, n > 0 (got k=${k}, n=${n})`);
  }
  const z = normalQuantile(1 - (1 - confidence) / 2);
  const z2 = z * z;
  const p = k / n;
  const denom = 1 + z2 / n;
  const centre = (p + z2 / (2 * n)) / denom;
  const half = (z * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n))) / denom;
  // At k = 0 or k = n the formula gives exactly 0 or 1 up to rounding; clamp the rounding away.
  const lo = k === 0 ? 0 : Math.max(0, centre - half);
  const hi = k === n ? 1 : Math.min(1, centre + half);
  return [lo, hi];
}
