// Per kind + direction statistics over the testers of one draft: counts and Wilson intervals
// per size and overall, amount summaries, and the three tests across sizes (rate trend, amount
// slope, one size against the rest) plus the correlation with the tester's own body delta.
import { mean, median, sampleStandardDeviation } from 'simple-statistics';
import { naturalCompare, textCompare } from './collate';
import { pearson } from './correlation';
import { fisherExact } from './fisher';
import { rateAboveP } from './binomial';
import { wilsonInterval } from './proportions';
import { olsFit } from './regression';
import type { Thresholds } from './thresholds';
import { cochranArmitage } from './trend';
import type { AnalysisInput, Direction, Finding, SizeStats, TesterReport } from './types';

/** One tester's view of one draft, with alterations summed per kind + direction. */
export interface DraftTester {
  tester: string;
  size: string;
  sizeIndex: number;
  /** Summed signed amount per "kind|direction" key. */
  amounts: Map<string, number>;
  /** Kinds the tester made in either direction. */
  kinds: Set<string>;
  bodyDeltaMm: Record<string, number>;
  report: TesterReport;
}

export type AlterationStats = Omit<Finding, 'class' | 'sizes' | 'reasons' | 'tests' | 'family'>;

export function directionOf(amountMm: number): Direction {
  return amountMm > 0 ? 'add' : 'remove';
}

function key(kind: string, direction: Direction): string {
  return `${kind}|${direction}`;
}

/** Draft identifiers present in the reports, in natural order ("2" before "10"). */
export function listDrafts(input: AnalysisInput): string[] {
  const drafts = [...new Set(input.reports.map((r) => r.draft))];
  return drafts.sort(naturalCompare);
}

/**
 * The testers of one draft. A tester counts once per draft; if several reports of one tester
 * exist for the same draft the last one is used (the file format rejects such duplicates).
 */
export function draftTesters(input: AnalysisInput, draft: string): DraftTester[] {
  const sizeIndex = new Map(input.sizes.map((s, i) => [s, i] as const));
  const byTester = new Map<string, TesterReport>();
  for (const report of input.reports) {
    if (report.draft === draft) byTester.set(report.tester, report);
  }
  return [...byTester.values()].map((report) => {
    const index = sizeIndex.get(report.size);
    if (index === undefined) {
      throw new RangeError(`tester ${report.tester}: size "${report.size}" is not in the size range`);
    }
    const amounts = new Map<string, number>();
    const kinds = new Set<string>();
    for (const alt of report.alterations) {
      if (!(alt.amountMm !== 0 && Number.isFinite(alt.amountMm))) continue;
      const k = key(alt.kind, directionOf(alt.amountMm));
      // Two entries of one kind and direction (e.g. front and back) add up to the tester's change.
      amounts.set(k, (amounts.get(k) ?? 0) + alt.amountMm);
      kinds.add(alt.kind);
    }
    return {
      tester: report.tester,
      size: report.size,
      sizeIndex: index,
      amounts,
      kinds,
      bodyDeltaMm: report.bodyDeltaMm ?? {},
      report,
    };
  });
}

/** Every kind + direction at least one tester of the draft made, sorted by kind then direction. */
export function kindDirections(testers: readonly DraftTester[]): { kind: string; direction: Direction }[] {
  const seen = new Map<string, { kind: string; direction: Direction }>();
  for (const t of testers) {
    for (const k of t.amounts.keys()) {
      const [kind, direction] = splitKey(k);
      seen.set(k, { kind, direction });
    }
  }
  return [...seen.values()].sort(
    (a, b) => textCompare(a.kind, b.kind) || textCompare(a.direction, b.direction),
  );
}

function splitKey(k: string): [string, Direction] {
  const at = k.lastIndexOf('|');
  return [k.slice(0, at), k.slice(at + 1) as Direction];
}

function summary(values: number[]): { meanMm: number | null; medianMm: number | null; sdMm: number | null } {
  if (values.length === 0) return { meanMm: null, medianMm: null, sdMm: null };
  return {
    meanMm: mean(values),
    medianMm: median(values),
    sdMm: values.length >= 2 ? sampleStandardDeviation(values) : null,
  };
}

export function alterationStats(
  testers: readonly DraftTester[],
  sizes: readonly string[],
  kind: string,
  direction: Direction,
  t: Thresholds,
): AlterationStats {
  const k = key(kind, direction);
  const addKey = key(kind, 'add');
  const removeKey = key(kind, 'remove');
  const N = testers.length;

  // One pass over the testers, in their order (so every sum adds up in the same order as before):
  // per size n, k and amounts; the makers' size order and amounts; every tester's amount (0 for no
  // change); the net change of the kind against the tester's own body difference.
  const perSize = sizes.map((size, index) => ({ size, index, n: 0, k: 0, amounts: [] as number[] }));
  const xs: number[] = [];
  const ys: number[] = [];
  const everyX: number[] = new Array(N);
  const everyY: number[] = new Array(N);
  const pairX: number[] = [];
  const pairY: number[] = [];
  let kindMakers = 0;
  for (let i = 0; i < N; i += 1) {
    const x = testers[i];
    const amount = x.amounts.get(k);
    const cell = perSize[x.sizeIndex];
    if (cell) cell.n += 1;
    if (amount !== undefined) {
      if (cell) {
        cell.k += 1;
        cell.amounts.push(amount);
      }
      xs.push(x.sizeIndex);
      ys.push(amount);
    }
    if (x.kinds.has(kind)) kindMakers += 1;
    everyX[i] = x.sizeIndex;
    everyY[i] = amount ?? 0;
    const delta = x.bodyDeltaMm[kind];
    if (typeof delta === 'number' && Number.isFinite(delta)) {
      pairX.push(delta);
      pairY.push((x.amounts.get(addKey) ?? 0) + (x.amounts.get(removeKey) ?? 0));
    }
  }
  const K = xs.length;

  // One size against the rest, one-sided (this size's rate is higher). The correction for the
  // number of sizes and tests happens over the whole kind (classify.ts), not here.
  const occupied = perSize.filter((s) => s.n > 0);
  const testable = occupied.length >= 2;
  const rawP = new Map(
    testable ? occupied.map((s) => [s.index, fisherExact(s.k, s.n - s.k, K - s.k, N - s.n - (K - s.k)).greater] as const) : [],
  );

  const bySize: SizeStats[] = perSize.map((s) => ({
    size: s.size,
    n: s.n,
    k: s.k,
    rate: s.n > 0 ? s.k / s.n : null,
    wilson: s.n > 0 ? wilsonInterval(s.k, s.n, t.confidence) : null,
    ...summary(s.amounts),
    fisherP: rawP.get(s.index) ?? null,
    holmP: null,
  }));

  const trend = cochranArmitage(perSize.map((s) => ({ score: s.index, n: s.n, k: s.k })));

  // Amount on size order, only with enough amounts over enough sizes to speak of a line.
  const distinctSizes = new Set(xs).size;
  let amountSlope: AlterationStats['amountSlope'] = null;
  if (K >= t.slopeMinAmounts && distinctSizes >= t.slopeMinSizes) {
    const fit = olsFit(xs, ys);
    if (fit) {
      amountSlope = { slopeMmPerSize: fit.slope, interceptMm: fit.intercept, p: fit.slopeP, n: fit.n, sizes: distinctSizes };
    }
  }

  // Every tester's amount in this direction (0 for no change) on the size order: one test that uses
  // both how many change and by how much.
  const everyone = olsFit(everyX, everyY);
  const sizeTrend = everyone ? { slopeMmPerSize: everyone.slope, p: everyone.slopeP } : null;

  // The tester's net change of this kind (added minus taken out; 0 for no change) against their own
  // body difference for the measurement the kind answers to, over every tester whose difference is
  // known. Personal fit is a property of the kind: testers above the chart add, those below take
  // out, those near it change nothing, so both directions and the testers who changed nothing count.
  let bodyCorrelation: AlterationStats['bodyCorrelation'] = null;
  if (pairX.length >= t.personalFitMinPairs) {
    bodyCorrelation = pearson(pairX, pairY);
  }

  return {
    kind,
    direction,
    testers: N,
    count: K,
    rate: N > 0 ? K / N : 0,
    wilson: N > 0 ? wilsonInterval(K, N, t.confidence) : [0, 1],
    ...summary(ys),
    directionShare: kindMakers > 0 ? K / kindMakers : 0,
    makerSizes: perSize.filter((s) => s.k > 0).length,
    rateAbove: { rate: t.draftWideMinLowerBound, p: rateAboveP(K, N, t.draftWideMinLowerBound) },
    bySize,
    trend,
    amountSlope,
    sizeTrend,
    bodyCorrelation,
  };
}
