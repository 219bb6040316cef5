/**
 * Holm's step-down adjustment (Holm 1979). Controls the family-wise error rate like Bonferroni
 * but is uniformly more powerful, which matters when a size range has 10–20 sizes to test.
 * Returns adjusted p-values in the input order.
 */
export function holmAdjust(pValues: readonly number[]): number[] {
  const m = pValues.length;
  const order = pValues.map((p, i) => ({ p, i })).sort((x, y) => x.p - y.p || x.i - y.i);
  const adjusted = new Array<number>(m).fill(1);
  let running = 0;
  order.forEach(({ p, i }, rank) => {
    // Step-down: multiply the rank-th smallest by (m − rank) and keep the sequence monotone.
    running = Math.max(running, Math.min(1, (m - rank) * p));
    adjusted[i] = running;
  });
  return adjusted;
}
