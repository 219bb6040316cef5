// Public API of the analysis engine. Pure: no file system, no process, no database.
export { wilsonInterval, type Interval } from './proportions';
export { fisherExact, type FisherResult } from './fisher';
export { cochranArmitage, type TrendGroup, type TrendResult } from './trend';
export { olsFit, type OlsResult } from './regression';
export { pearson, type CorrelationResult } from './correlation';
export { holmAdjust } from './multiple-testing';
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
export { classifyAlteration, evaluateCriteria, type Classification } from './classify';
export { analyzeDraft, CLASS_ORDER } from './draft-analysis';
export { compareDrafts } from './compare';
export { fitRatingCells } from './fit-ratings';
export { fabricCheck, matchNeed } from './fabric';
export { unclearSteps } from './instructions';
export { analysisFileSchema, formatPath, parseAnalysisInput, type ParseResult } from './input';
export { runAnalysis, AnalysisRequestError, type RunOptions } from './run';
export { formatTable } from './table';
export type {
  AlterationEntry,
  AnalysisInput,
  AnalysisOutput,
  ComparisonRow,
  ComparisonStatus,
  Direction,
  DraftAnalysis,
  FabricCell,
  FabricNeed,
  FabricUse,
  Finding,
  FindingClass,
  FitRatingCell,
  SizeStats,
  TesterReport,
  UnclearStep,
} from './types';
