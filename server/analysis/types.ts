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
  /** The same, Holm-adjusted over the sizes tested. */
  holmP: number | null;
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
  bySize: SizeStats[];
  trend: { z: number; p: number };
  amountSlope: { slopeMmPerSize: number; interceptMm: number; p: number; n: number; sizes: number } | null;
  bodyCorrelation: { r: number; p: number; n: number } | null;
  /** For size-specific findings the sizes that stand out; otherwise empty. */
  sizes: string[];
  reasons: string[];
}

export type ComparisonStatus = 'fixed' | 'still-present' | 'not-enough-data';

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
  /** 95 % Student t interval of the mean; null for a single rating. */
  interval: Interval | null;
  flagged: boolean;
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

export interface AnalysisOutput extends DraftAnalysis {
  /** Every draft in the input, in natural order. */
  drafts: string[];
  comparison?: ComparisonRow[];
  fitRatings?: FitRatingCell[];
  fabric?: FabricCell[];
  unclearSteps?: UnclearStep[];
}
