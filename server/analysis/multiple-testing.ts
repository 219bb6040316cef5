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

/**
 * Benjamini–Hochberg step-up (Benjamini & Hochberg 1995): which of the p-values are discoveries
 * at false-discovery rate q. When every hypothesis is null this also holds the chance of any
 * discovery at q, which is what a grader meets as "a trial with a finding that is not there".
 * Returns a flag per input, in input order.
 */
export function benjaminiHochberg(pValues: readonly number[], q: number): boolean[] {
  const m = pValues.length;
  const order = pValues.map((p, i) => ({ p, i })).sort((x, y) => x.p - y.p || x.i - y.i);
  let cut = -1;
  order.forEach(({ p }, rank) => {
    if (below(p, (q * (rank + 1)) / m)) cut = rank;
  });
  const out = new Array<boolean>(m).fill(false);
  for (let rank = 0; rank <= cut; rank++) out[(order[rank] as { i: number }).i] = true;
  return out;
}

/**
 * p < level, with a relative tolerance: a p-value that is exactly the level in exact arithmetic
 * (e.g. a Fisher p of 1/20 computed as 0.049999999999999996) is not below it.
 */
export function below(p: number, level: number): boolean {
  return p < level * (1 - 1e-9);
}

