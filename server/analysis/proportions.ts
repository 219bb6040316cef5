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

/**
 * Newcombe's hybrid score interval for the difference of two independent proportions
 * p1 − p2 = k1/n1 − k2/n2 (Newcombe 1998, "Interval estimation for the difference between
 * independent proportions", method 10), built from the two Wilson intervals:
 *   lower = d − √((p1 − l1)² + (u2 − p2)²),  upper = d + √((u1 − p1)² + (p2 − l2)²).
 */
export function newcombeDifference(k1: number, n1: number, k2: number, n2: number, confidence = 0.95): Interval {
  const p1 = k1 / n1;
  const p2 = k2 / n2;
  const [l1, u1] = wilsonInterval(k1, n1, confidence);
  const [l2, u2] = wilsonInterval(k2, n2, confidence);
  const d = p1 - p2;
  const lower = d - Math.sqrt((p1 - l1) ** 2 + (u2 - p2) ** 2);
  const upper = d + Math.sqrt((u1 - p1) ** 2 + (p2 - l2) ** 2);
  return [Math.max(-1, lower), Math.min(1, upper)];
}
