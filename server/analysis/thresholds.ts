/**
 * Decision thresholds of the analysis. A studio may change them (server/domain/studio-settings.ts),
 * so every function that decides takes them as a parameter. Each default carries its reason.
 */
export interface Thresholds {
  /**
   * Error level of the findings. Within one alteration kind every test in both directions is one
   * family (Holm), and across the kinds of a draft the families are chosen by false-discovery-rate
   * control (Benjamini–Hochberg, then Holm inside each chosen kind at alpha × chosen / tested, after
   * Benjamini & Bogomolov 2014). Also the level of the draft comparison.
   */
  alpha: number;
  /** Confidence level of the Wilson, t and median intervals shown beside the numbers. */
  confidence: number;
  /** Fewer testers than this in a draft → every kind is "too-few-reports". */
  minTestersPerDraft: number;
  /** Fewer testers than this who made a change → it cannot point at the pattern ("too-few-reports"). */
  minMakers: number;
  /** Grading needs makers in at least this many sizes: one size alone is not a trend. */
  gradingMinMakerSizes: number;
  /** Personal fit: |r| at least this … */
  personalFitMinAbsR: number;
  /** … over at least this many testers with a body delta. */
  personalFitMinPairs: number;
  /** Amount-on-size regression needs at least this many amounts … */
  slopeMinAmounts: number;
  /** … spread over at least this many sizes. */
  slopeMinSizes: number;
  /** Draft-wide: the share of testers making the change must be shown to be above this rate. */
  draftWideMinLowerBound: number;
  /** … and at least this share of the testers who made the kind did it in this direction. */
  draftWideMinDirectionShare: number;
  /** Size-specific: a size needs at least this many testers who made the alteration. */
  sizeSpecificMinCount: number;
  /** Draft comparison: fewer testers than this in the later draft → "not-enough-data". */
  compareMinTesters: number;
  /** Fit ratings: a size × area cell is a hint (or, confirmed, a flag) when |mean| ≥ this … */
  fitFlagMinAbsMean: number;
  /** … and it has at least this many ratings. */
  fitFlagMinRatings: number;
  /** Fit ratings: a whole area is flagged only when its mean over the range is at least this far from 0. */
  fitAreaMinAbsMean: number;
  /** Fabric: flag a size × width when more than this share of its testers used more than the stated need … */
  fabricShortShare: number;
  /** … and at least this many of them did. */
  fabricMinOver: number;
  /** Fabric: a reported width matches a stated width within this many mm (nominal widths vary). */
  fabricWidthToleranceMm: number;
  /** Instructions: a step is flagged when at least this many testers found it unclear. */
  unclearStepMinTesters: number;
}

export const DEFAULT_THRESHOLDS: Readonly<Thresholds> = Object.freeze({
  alpha: 0.05,
  confidence: 0.95,
  minTestersPerDraft: 3,
  // Calibrated on generated trials (npm run -s analyze:calibrate): with fewer than three makers a
  // single tester's body or sewing decides the class, and one maker is never a pattern problem.
  minMakers: 3,
  gradingMinMakerSizes: 2,
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
  fitAreaMinAbsMean: 0.5,
  // "Most testers, and at least two": one tester of three who cut generously is not a short yardage.
  fabricShortShare: 0.5,
  fabricMinOver: 2,
  fabricWidthToleranceMm: 50,
  unclearStepMinTesters: 2,
});

/** Defaults overlaid with whatever a studio has changed. */
export function resolveThresholds(overrides?: Partial<Thresholds>): Thresholds {
  return { ...DEFAULT_THRESHOLDS, ...(overrides ?? {}) };
}
