// Public API of the analysis engine. Pure: no file system, no process, no database.
export { wilsonInterval, type Interval } from './proportions';
export { fisherExact, type FisherResult } from './fisher';
export { cochranArmitage, type TrendGroup, type TrendResult } from './trend';
export { olsFit, type OlsResult } from './regression';
export { pearson, type CorrelationResult } from './correlation';
export { benjaminiHochberg, below, holmAdjust } from './multiple-testing';
export { binomialCdf, binomialUpper } from './distributions';
export { medianInterval, rateAboveP, signTest } from './binomial';
export { decimalFraction, fisherGreaterExact, lessThan, toNumber, type Fraction } from './exact';
export { newcombeDifference } from './proportions';
export { DEFAULT_THRESHOLDS, resolveThresholds, type Thresholds } from './thresholds';
export {
  alterationStats,
  directionOf,
  draftTesters,
  kindDirections,
  listDrafts,
  type AlterationStats,
  type DraftTester,
} from './alterations';
export { classifyAlteration, judgeDraft, testsOf, type Classification } from './classify';
export { analyzeDraft, CLASS_ORDER } from './draft-analysis';
export { compareDrafts } from './compare';
export { fitRatingAreas, fitRatingCells } from './fit-ratings';
export { changeTable, patternFindings, type FindingRef } from './changes';
export { MM_READER, readerFor, renderReason, renderReasons, findingName, kindLabel, type Reader } from './wording';
export { fabricCheck, matchNeed } from './fabric';
export { unclearSteps } from './instructions';
export { analysisFileSchema, formatPath, parseAnalysisInput, type ParseResult } from './input';
export { runAnalysis, renderOutput, AnalysisRequestError, type RunOptions } from './run';
export { formatTable } from './table';
export type {
  AlterationEntry,
  AnalysisInput,
  AnalysisOutput,
  ChangeRow,
  ComparisonRow,
  ComparisonStatus,
  Direction,
  DraftAnalysis,
  FabricCell,
  FabricNeed,
  FabricUse,
  Finding,
  FindingClass,
  FitRatingArea,
  FitRatingCell,
  SizeStats,
  TesterReport,
  TestOutcome,
  UnclearStep,
} from './types';
