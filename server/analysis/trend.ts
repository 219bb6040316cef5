import { normalTwoSidedP } from './distributions';

export interface TrendGroup {
  /** Score of the group: here the size's position in the ordered size range. */
  score: number;
  /** Number of testers in the group. */
  n: number;
  /** Number of them who made the alteration. */
  k: number;
}

export interface TrendResult {
  z: number;
  /** Two-sided p-value from the standard normal. */
  p: number;
}

/**
 * Cochran–Armitage test for a linear trend in proportions across ordered groups
 * (Cochran 1954; Armitage 1955), without continuity correction:
 *   T = Σ k_i (s_i − s̄),  Var₀(T) = p̄(1 − p̄) Σ n_i (s_i − s̄)²,  z = T / √Var₀(T)
 * where s̄ is the n-weighted mean score and p̄ the pooled rate. When the variance is zero
 * (everyone or no one made the alteration, or a single group) there is no trend to detect and
 * we return z = 0, p = 1.
 */
export function cochranArmitage(groups: readonly TrendGroup[]): TrendResult {
  const used = groups.filter((g) => g.n > 0);
  const N = used.reduce((s, g) => s + g.n, 0);
  const K = used.reduce((s, g) => s + g.k, 0);
  if (N === 0) return { z: 0, p: 1 };
  const meanScore = used.reduce((s, g) => s + g.n * g.score, 0) / N;
  const pooled = K / N;
  const t = used.reduce((s, g) => s + g.k * (g.score - meanScore), 0);
  const spread = used.reduce((s, g) => s + g.n * (g.score - meanScore) ** 2, 0);
  const variance = pooled * (1 - pooled) * spread;
  if (!(variance > 0)) return { z: 0, p: 1 };
  const z = t / Math.sqrt(variance);
  return { z, p: normalTwoSidedP(z) };
}
