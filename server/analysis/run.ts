// One call that turns a validated input into the documented output: findings of a draft, the
// optional draft comparison and change table, and the fit, fabric and instruction sections when
// the input has them. Reasons keep their length tokens; renderOutput writes them in a unit.
import { listDrafts } from './alterations';
import { changeTable, patternFindings, type FindingRef } from './changes';
import { compareDrafts } from './compare';
import { analyzeDraft } from './draft-analysis';
import { fabricCheck } from './fabric';
import { fitRatingAreas, fitRatingCells } from './fit-ratings';
import { unclearSteps } from './instructions';
import { resolveThresholds, type Thresholds } from './thresholds';
import type { AnalysisInput, AnalysisOutput } from './types';
import { MM_READER, renderReasons, type Reader } from './wording';

export interface RunOptions {
  /** Draft to analyse. Default: the first draft of `compare`, else the latest draft in the input. */
  draft?: string;
  /** Compare draft A (earlier) with draft B (later). */
  compare?: [string, string];
  /** Add the change table for these findings ('pattern': every finding that points at the pattern). */
  changes?: readonly FindingRef[] | 'pattern';
}

/** A request the input cannot answer (e.g. a draft with no reports); the command exits 2 on it. */
export class AnalysisRequestError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'AnalysisRequestError';
  }
}

export function runAnalysis(input: AnalysisInput, options: RunOptions = {}, thresholds?: Partial<Thresholds>): AnalysisOutput {
  const t = resolveThresholds(thresholds);
  const drafts = listDrafts(input);
  const known = (d: string) => {
    if (!drafts.includes(d)) {
      throw new AnalysisRequestError(`draft "${d}" has no reports; drafts in the file: ${drafts.join(', ') || 'none'}`);
    }
  };
  if (options.draft !== undefined) known(options.draft);
  if (options.compare) options.compare.forEach(known);
  const draft = options.draft ?? options.compare?.[0] ?? drafts[drafts.length - 1];
  if (draft === undefined) throw new AnalysisRequestError('the file has no reports');

  const analysis = analyzeDraft(input, draft, t);
  const output: AnalysisOutput = { draft: analysis.draft, drafts, testers: analysis.testers, findings: analysis.findings };
  if (options.compare) {
    const [from, to] = options.compare;
    const fromFindings = from === draft ? analysis.findings : undefined;
    output.comparison = compareDrafts(input, from, to, t, fromFindings);
  }
  if (options.changes) {
    const wanted = options.changes === 'pattern' ? patternFindings(analysis.findings) : options.changes;
    output.changes = changeTable(input, draft, analysis.findings, wanted, t);
  }
  // Optional sections appear only when the file carries that kind of data at all.
  if (input.reports.some((r) => r.fit !== undefined)) {
    output.fitRatings = fitRatingCells(input, draft, t);
    output.fitAreas = fitRatingAreas(input, draft, t);
  }
  if (input.reports.some((r) => r.fabric !== undefined) || input.fabricNeeds !== undefined) {
    output.fabric = fabricCheck(input, draft, t);
  }
  if (input.reports.some((r) => r.unclearSteps !== undefined)) output.unclearSteps = unclearSteps(input, draft, t);
  return output;
}

/** Every reason of an output written for one reader (lengths in their units). */
export function renderOutput<T extends Partial<AnalysisOutput>>(output: T, reader: Reader = MM_READER): T {
  const withReasons = <R extends { reasons: string[] }>(rows: R[] | undefined) => rows?.map((r) => ({ ...r, reasons: renderReasons(r.reasons, reader) }));
  return {
    ...output,
    ...(output.findings ? { findings: withReasons(output.findings) } : {}),
    ...(output.comparison ? { comparison: withReasons(output.comparison) } : {}),
    ...(output.fitRatings ? { fitRatings: withReasons(output.fitRatings) } : {}),
    ...(output.fitAreas ? { fitAreas: withReasons(output.fitAreas) } : {}),
    ...(output.fabric ? { fabric: withReasons(output.fabric) } : {}),
  };
}
