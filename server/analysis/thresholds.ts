/**
 * Decision thresholds of the analysis. They become studio settings, so every function that
 * decides takes them as a parameter; these are the defaults from the design (DESIGN.md,
 * "The computation", §4–8).
 */
export interface Thresholds {
  /** Significance level for every test that flags (trend, slope, correlation, Fisher, comparison). */
  alpha: number;
  /** Confidence level of the Wilson and t intervals. */
  confidence: number;
  /** Fewer testers than this in a draft → every kind is "too-few-reports". */
  minTestersPerDraft: number;
  /** Personal fit: |r| at least this … */
  personalFitMinAbsR: number;
  /** … over at least this many testers with a body delta. */
  personalFitMinPairs: number;
  /** Amount-on-size regression needs at least this many amounts … */
  slopeMinAmounts: number;
  /** … spread over at least this many sizes. */
  slopeMinSizes: number;
  /** Draft-wide: the overall rate's Wilson lower bound at least this … */
  draftWideMinLowerBound: number;
  /** … and at least this share of the testers who made the kind did it in this direction. */
  draftWideMinDirectionShare: number;
  /** Size-specific: a size needs at least this many testers who made the alteration. */
  sizeSpecificMinCount: number;
  /** Draft comparison: fewer testers than this in the later draft → "not-enough-data". */
  compareMinTesters: number;
  /** Fit ratings: a size × area cell is flagged when |mean| ≥ this … */
  fitFlagMinAbsMean: number;
  /** … and it has at least this many ratings. */
  fitFlagMinRatings: number;
  /** Fabric: flag when at least this share of testers used more than the stated need. */
  fabricShortShare: number;
  /** Fabric: a reported width matches a stated width within this many mm (nominal widths vary). */
  fabricWidthToleranceMm: number;
  /** Instructions: a step is flagged when at least this many testers found it unclear. */
  unclearStepMinTesters: number;
}

export const DEFAULT_THRESHOLDS: Readonly<Thresholds> = Object.freeze({
  alpha: 0.05,
  confidence: 0.95,
  minTestersPerDraft: 3,
  personalFitMinAbsR: 0.6,
  personalFitMinPairs: 5,
  slopeMinAmounts: 4,
  slopeMinSizes: 3,
  draftWideMinLowerBound: 0.25,
  draftWideMinDirectionShare: 0.75,
  sizeSpecificMinCount: 2,
  compareMinTesters: 3,
  fitFlagMinAbsMean: 1,
  fitFlagMinRatings: 3,
  fabricShortShare: 0.25,
  fabricWidthToleranceMm: 50,
  unclearStepMinTesters: 2,
});

/** Defaults overlaid with whatever a studio has changed. */
export function resolveThresholds(overrides?: Partial<Thresholds>): Thresholds {
  return { ...DEFAULT_THRESHOLDS, ...(overrides ?? {}) };
}
