// Fit ratings (−2 too tight/short … +2 too loose/long) per size × body area with a Student t
// interval of the mean (DESIGN.md §6). Cells are flagged only with enough ratings, because with
// two ratings a single strong opinion would dominate the mean.
import { mean, sampleStandardDeviation } from 'simple-statistics';
import { studentTQuantile } from './distributions';
import { resolveThresholds, type Thresholds } from './thresholds';
import type { AnalysisInput, FitRatingCell } from './types';
import { num, testersWord } from './wording';

export function fitRatingCells(
  input: AnalysisInput,
  draft: string,
  thresholds?: Partial<Thresholds>,
): FitRatingCell[] {
  const t = resolveThresholds(thresholds);
  const byTester = new Map(input.reports.filter((r) => r.draft === draft).map((r) => [r.tester, r] as const));
  const cells = new Map<string, { size: string; area: string; values: number[] }>();
  for (const r of byTester.values()) {
    for (const [area, value] of Object.entries(r.fit ?? {})) {
      if (!Number.isFinite(value)) continue;
      const k = `${r.size}\u0000${area}`;
      const cell = cells.get(k) ?? { size: r.size, area, values: [] };
      cell.values.push(value);
      cells.set(k, cell);
    }
  }
  const order = new Map(input.sizes.map((s, i) => [s, i] as const));
  return [...cells.values()]
    .sort((a, b) => (order.get(a.size) ?? 0) - (order.get(b.size) ?? 0) || a.area.localeCompare(b.area))
    .map(({ size, area, values }) => {
      const n = values.length;
      const m = mean(values);
      const sd = n >= 2 ? sampleStandardDeviation(values) : null;
      let interval: [number, number] | null = null;
      if (sd !== null) {
        const half = studentTQuantile(1 - (1 - t.confidence) / 2, n - 1) * (sd / Math.sqrt(n));
        interval = [m - half, m + half];
      }
      const flagged = Math.abs(m) >= t.fitFlagMinAbsMean && n >= t.fitFlagMinRatings;
      const reasons = flagged
        ? [
            `Size ${size}, ${area}: mean rating ${num(m, 1)} from ${testersWord(n)}` +
              (interval ? ` (95% interval ${num(interval[0], 1)} to ${num(interval[1], 1)})` : '') +
              ` — ${m < 0 ? 'too tight or short' : 'too loose or long'} (rule |mean| ≥ ${t.fitFlagMinAbsMean} ` +
              `with at least ${t.fitFlagMinRatings} ratings).`,
          ]
        : [];
      return { size, area, n, mean: m, sd, interval, flagged, reasons };
    });
}
