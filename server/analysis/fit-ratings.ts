// Fit ratings (−2 too tight/short … +2 too loose/long): per size × body area, and per area over
// the whole range.
//
// Ratings are few per size (often 2–4) and on a five-point scale, so a cell's mean of three is off
// by a point in about one cell in ten by chance alone. Each area is therefore tested across the
// range: the exact sign test of every tester's rating against 0 (off everywhere), and the slope of
// the rating on the size order (changes with size), Holm-adjusted over all areas' tests. A cell is
// only confirmed when its own sign test holds after Holm over the sizes of its area; otherwise a
// cell that is off on average is a hint to look at, not a finding.
import { mean, sampleStandardDeviation } from 'simple-statistics';
import { signTest } from './binomial';
import { textCompare } from './collate';
import { studentTQuantile } from './distributions';
import { below, holmAdjust } from './multiple-testing';
import { olsFit } from './regression';
import { resolveThresholds, type Thresholds } from './thresholds';
import type { AnalysisInput, FitRatingArea, FitRatingCell } from './types';
import { num, pValue, testersWord } from './wording';

const SCALE: [number, number] = [-2, 2];

/** Student t interval of a mean, clipped to the rating scale (a mean cannot leave −2 … +2). */
function tInterval(values: readonly number[], confidence: number): [number, number] | null {
  const n = values.length;
  if (n < 2) return null;
  const m = mean([...values]);
  const sd = sampleStandardDeviation([...values]);
  const half = studentTQuantile(1 - (1 - confidence) / 2, n - 1) * (sd / Math.sqrt(n));
  return [Math.max(SCALE[0], m - half), Math.min(SCALE[1], m + half)];
}

function signP(values: readonly number[]): number {
  return signTest(values.filter((v) => v < 0).length, values.filter((v) => v > 0).length);
}

function ratingsOf(input: AnalysisInput, draft: string) {
  const byTester = new Map(input.reports.filter((r) => r.draft === draft).map((r) => [r.tester, r] as const));
  const order = new Map(input.sizes.map((s, i) => [s, i] as const));
  const rows: { size: string; index: number; area: string; value: number }[] = [];
  for (const r of byTester.values()) {
    for (const [area, value] of Object.entries(r.fit ?? {})) {
      if (Number.isFinite(value)) rows.push({ size: r.size, index: order.get(r.size) ?? 0, area, value });
    }
  }
  return { rows, order };
}

function word(m: number): string {
  return m < 0 ? 'too tight or short' : 'too loose or long';
}

export function fitRatingCells(input: AnalysisInput, draft: string, thresholds?: Partial<Thresholds>): FitRatingCell[] {
  const t = resolveThresholds(thresholds);
  const { rows, order } = ratingsOf(input, draft);
  const cells = new Map<string, { size: string; area: string; values: number[] }>();
  for (const r of rows) {
    const k = `${r.size}\u0000${r.area}`;
    const cell = cells.get(k) ?? { size: r.size, area: r.area, values: [] };
    cell.values.push(r.value);
    cells.set(k, cell);
  }
  const list = [...cells.values()].sort((a, b) => (order.get(a.size) ?? 0) - (order.get(b.size) ?? 0) || textCompare(a.area, b.area));
  // Holm over the sizes of each area.
  const adjusted = new Map<string, number>();
  for (const area of new Set(list.map((c) => c.area))) {
    const ofArea = list.filter((c) => c.area === area);
    const adj = holmAdjust(ofArea.map((c) => signP(c.values)));
    ofArea.forEach((c, i) => adjusted.set(`${c.size}\u0000${area}`, adj[i] as number));
  }
  return list.map(({ size, area, values }) => {
    const n = values.length;
    const m = mean(values);
    const sd = n >= 2 ? sampleStandardDeviation(values) : null;
    const interval = tInterval(values, t.confidence);
    const p = signP(values);
    const adjustedP = adjusted.get(`${size}\u0000${area}`) ?? 1;
    const off = Math.abs(m) >= t.fitFlagMinAbsMean && n >= t.fitFlagMinRatings;
    const flagged = off && below(adjustedP, t.alpha);
    const hint = off && !flagged;
    const head =
      `Size ${size}, ${area}: mean rating ${num(m, 1)} from ${testersWord(n)}` +
      (interval ? ` (${Math.round(t.confidence * 100)}% interval ${num(interval[0], 1)} to ${num(interval[1], 1)})` : '');
    const reasons = flagged
      ? [`${head} — ${word(m)}; the sign test holds over the sizes of this area (${pValue(p)}, Holm-adjusted ${pValue(adjustedP)}).`]
      : hint
        ? [
            `${head} — ${word(m)} on average, but not confirmed: with ${n} ratings a mean this far off happens by chance ` +
              `(sign test ${pValue(p)}, after Holm over the sizes of this area ${pValue(adjustedP)}). Worth a look at the photos, not a change on its own.`,
          ]
        : [];
    return { size, area, n, mean: m, sd, interval, p, adjustedP, flagged, hint, reasons };
  });
}

/** Each area over the whole range: off everywhere, or changing with size, confirmed over all areas' tests. */
export function fitRatingAreas(input: AnalysisInput, draft: string, thresholds?: Partial<Thresholds>): FitRatingArea[] {
  const t = resolveThresholds(thresholds);
  const { rows } = ratingsOf(input, draft);
  const areas = [...new Set(rows.map((r) => r.area))].sort(textCompare);
  const raw = areas.map((area) => {
    const own = rows.filter((r) => r.area === area);
    const values = own.map((r) => r.value);
    const fit = olsFit(own.map((r) => r.index), values);
    return { area, values, wholeP: signP(values), fit };
  });
  // One family over every area: whole-range and with-size tests.
  const ps: number[] = [];
  for (const r of raw) {
    ps.push(r.wholeP);
    if (r.fit) ps.push(r.fit.slopeP);
  }
  const adj = holmAdjust(ps);
  let i = 0;
  return raw.map(({ area, values, wholeP, fit }) => {
    const wholeAdj = adj[i++] as number;
    const slopeAdj = fit ? (adj[i++] as number) : 1;
    const n = values.length;
    const m = mean(values);
    const interval = tInterval(values, t.confidence);
    const whole = below(wholeAdj, t.alpha) && Math.abs(m) >= t.fitAreaMinAbsMean;
    const withSize = fit !== null && below(slopeAdj, t.alpha);
    const reasons: string[] = [];
    if (whole) {
      reasons.push(
        `${area}: ${word(m)} across the range — mean ${num(m, 1)} from ${testersWord(n)}` +
          (interval ? ` (${Math.round(t.confidence * 100)}% interval ${num(interval[0], 1)} to ${num(interval[1], 1)})` : '') +
          `; sign test ${pValue(wholeP)}, Holm-adjusted over the areas ${pValue(wholeAdj)}.`,
      );
    }
    if (withSize && fit) {
      reasons.push(
        `${area}: the rating ${fit.slope > 0 ? 'rises' : 'falls'} by ${num(Math.abs(fit.slope), 2)} per size step ` +
          `(${fit.slope > 0 ? 'looser or longer' : 'tighter or shorter'} in the larger sizes; ${pValue(fit.slopeP)}, Holm-adjusted ${pValue(slopeAdj)}): look at the grade.`,
      );
    }
    return {
      area,
      n,
      mean: m,
      interval,
      whole: { p: wholeP, adjustedP: wholeAdj },
      withSize: fit ? { slope: fit.slope, p: fit.slopeP, adjustedP: slopeAdj } : null,
      flag: whole ? 'whole-range' : withSize ? 'with-size' : null,
      reasons,
    };
  });
}
