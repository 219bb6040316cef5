// Domain types of the analysis. They do not depend on the file format (input.ts) so that the
// database wiring can build them from stored reports directly.
import type { Interval } from './proportions';

export type Direction = 'add' | 'remove';

export type FindingClass =
  | 'too-few-reports'
  | 'personal-fit'
  | 'grading'
  | 'draft-wide'
  | 'size-specific'
  | 'none';

export interface AlterationEntry {
  /** Alteration kind from the controlled vocabulary, e.g. "leg-length". */
  kind: string;
  /** Signed amount in mm: positive adds ("add"), negative takes away ("remove"). Never 0. */
  amountMm: number;
}

export interface FabricUse {
  /** Width of the fabric the tester used, mm. */
  widthMm: number;
  /** Length of fabric the tester used, mm. */
  usedMm: number;
  /** Napped or one-way fabric (all pieces laid the same way). */
  napped: boolean;
}

export interface TesterReport {
  tester: string;
  size: string;
  draft: string;
  alterations: AlterationEntry[];
  /** Body minus size chart, mm, for the measurement each alteration kind maps to, keyed by kind. */
  bodyDeltaMm?: Record<string, number>;
  /** Fit rating per body area, −2 (too tight/short) … +2 (too loose/long). */
  fit?: Record<string, number>;
  fabric?: FabricUse;
  /** Instruction steps the tester found unclear. */
  unclearSteps?: string[];
}

export interface FabricNeed {
  size: string;
  widthMm: number;
  /** Stated length needed, mm. */
  needMm: number;
  /** True for the with-nap (one-way) layout. */
  napped: boolean;
}

export interface AnalysisInput {
  /** Sizes in grading order, smallest first. */
  sizes: string[];
  reports: TesterReport[];
  fabricNeeds?: FabricNeed[];
}

export interface SizeStats {
  size: string;
  /** Testers of this size who reported on the draft. */
  n: number;
  /** Of them, testers who made this kind in this direction. */
  k: number;
  rate: number | null;
  wilson: Interval | null;
  meanMm: number | null;
  medianMm: number | null;
  sdMm: number | null;
  /** One-sided Fisher p of this size against all other sizes (null when not testable). */
  fisherP: number | null;
  /**
   * The same, adjusted over every test of the kind (Holm over both directions, all tests); null
   * when this size was not among the tests (too few testers of the size, or too few makers).
   */
  holmP: number | null;
}

/** The tests of a finding's family and how each came out after the corrections. */
export type TestName = 'personal-fit' | 'trend' | 'draft-wide' | 'size';

export interface TestOutcome {
  test: TestName;
  /** For the size test: which size against the rest. */
  size?: string;
  /** The test's own p-value. */
  p: number;
  /** Holm-adjusted over the kind's family (both directions). */
  adjustedP: number;
  /** Below the level the kind was judged at. */
  passed: boolean;
}

export interface Finding {
  kind: string;
  direction: Direction;
  class: FindingClass;
  /** Testers who reported on the draft. */
  testers: number;
  /** Testers who made this kind in this direction. */
  count: number;
  rate: number;
  wilson: Interval;
  meanMm: number | null;
  medianMm: number | null;
  sdMm: number | null;
  /** Share of the testers who made this kind (either direction) who made it in this direction. */
  directionShare: number;
  /** Sizes with at least one tester who made it. */
  makerSizes: number;
  /** Exact binomial test that the share making it is above the draft-wide rate. */
  rateAbove: { rate: number; p: number };
  bySize: SizeStats[];
  trend: { z: number; p: number };
  amountSlope: { slopeMmPerSize: number; interceptMm: number; p: number; n: number; sizes: number } | null;
  /** Least-squares slope of every tester's amount (0 for no change) on the size order. */
  sizeTrend: { slopeMmPerSize: number; p: number } | null;
  bodyCorrelation: { r: number; p: number; n: number } | null;
  /**
   * The sizes that stand out: for size-specific findings, and for a grading finding whose rate
   * also peaks at a confirmed size; otherwise empty.
   */
  sizes: string[];
  /** The tests behind the class, this direction's only (the family spans both directions). */
  tests: TestOutcome[];
  /**
   * How the kind's family was judged: its tests (both directions), the kind's own p-value
   * (Bonferroni of its smallest), whether the draft's false-discovery control chose it, and the
   * level its tests were held to (alpha × chosen kinds / tested kinds).
   */
  family: { size: number; kindP: number; chosen: boolean; level: number; kindsTested: number; kindsChosen: number };
  /** Reasons in words; lengths are tokens (wording.ts) that renderReasons writes in a unit. */
  reasons: string[];
}

/**
 * fixed: the drop is confirmed; improved: the rate fell but too little to confirm with these
 * testers; still-present: no drop; not-enough-data: too few testers on the later draft;
 * personal-fit: the earlier finding was personal fit, nothing for the pattern to fix.
 */
export type ComparisonStatus = 'fixed' | 'improved' | 'still-present' | 'not-enough-data' | 'personal-fit';

export interface ComparisonRow {
  kind: string;
  direction: Direction;
  /** Class of the finding in the earlier draft. */
  class: FindingClass;
  from: string;
  to: string;
  status: ComparisonStatus;
  /** One-sided Fisher p that the rate is lower in `to`; null when there is not enough data. */
  p: number | null;
  /** The same p as an exact fraction ("1/20") when it is small enough to read. */
  pExact: string | null;
  /** Rate in `to` minus rate in `from`, with Newcombe's hybrid score interval; null without testers. */
  difference: { estimate: number; interval: [number, number] } | null;
  /** Sizes compared: the flagged sizes for a size-specific finding, otherwise empty (all sizes). */
  sizes: string[];
  countFrom: number;
  testersFrom: number;
  countTo: number;
  testersTo: number;
  reasons: string[];
}

export interface FitRatingCell {
  size: string;
  area: string;
  n: number;
  mean: number;
  sd: number | null;
  /** Student t interval of the mean, clipped to the −2 … +2 scale; null for a single rating. */
  interval: Interval | null;
  /** Exact sign test of the ratings against 0 (zeros left out). */
  p: number;
  /** Holm-adjusted over the sizes of this area. */
  adjustedP: number;
  /** Confirmed: off on average and the sign test holds after the correction over sizes. */
  flagged: boolean;
  /** Off by a point or more with enough ratings, but not confirmed: worth a look, not a finding. */
  hint: boolean;
  reasons: string[];
}

/** One body area over the whole size range. */
export interface FitRatingArea {
  area: string;
  n: number;
  mean: number;
  interval: Interval | null;
  /** Sign test of every tester's rating of the area against 0, and its Holm-adjusted value over the areas' tests. */
  whole: { p: number; adjustedP: number };
  /** Least-squares slope of the rating on the size order, per size step, and its adjusted p. */
  withSize: { slope: number; p: number; adjustedP: number } | null;
  /** 'whole-range': off across the range; 'with-size': changes with the size; null: neither confirmed. */
  flag: 'whole-range' | 'with-size' | null;
  reasons: string[];
}

export interface FabricCell {
  size: string;
  widthMm: number;
  napped: boolean;
  /** Stated need matched to this width and layout; null when none is stated. */
  needMm: number | null;
  n: number;
  medianUsedMm: number;
  maxUsedMm: number;
  /** Testers who used more than the stated need. */
  overNeed: number;
  overNeedShare: number | null;
  flagged: boolean;
  reasons: string[];
}

export interface UnclearStep {
  step: string;
  count: number;
  testers: string[];
  flagged: boolean;
}

export interface DraftAnalysis {
  draft: string;
  testers: number;
  findings: Finding[];
}

/** One size's suggested change for a finding the studio will fix. */
export interface ChangeRow {
  kind: string;
  direction: Direction;
  class: FindingClass;
  size: string;
  /** Suggested signed change in mm; null where the basis gives none for this size. */
  amountMm: number | null;
  /** Interval of the suggestion (median interval, or regression prediction interval), mm. */
  interval: [number, number] | null;
  /** median: the draft's median; fitted: the regression line; size-median: that size's own median. */
  basis: 'median' | 'fitted' | 'size-median' | 'none';
  /** The size lies outside the sizes whose testers made the change (a fitted value extrapolated). */
  extrapolated: boolean;
  note: string;
}

export interface AnalysisOutput extends DraftAnalysis {
  /** Every draft in the input, in natural order. */
  drafts: string[];
  comparison?: ComparisonRow[];
  fitRatings?: FitRatingCell[];
  fitAreas?: FitRatingArea[];
  /** Suggested changes per size for the findings the studio will fix (or the ones asked for). */
  changes?: ChangeRow[];
  fabric?: FabricCell[];
  unclearSteps?: UnclearStep[];
}
