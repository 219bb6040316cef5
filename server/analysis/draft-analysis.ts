import { alterationStats, draftTesters, kindDirections } from './alterations';
import { classifyAlteration } from './classify';
import { resolveThresholds, type Thresholds } from './thresholds';
import type { AnalysisInput, DraftAnalysis, Finding, FindingClass } from './types';

/** Display order of classes: flagged problems first, most actionable first. */
export const CLASS_ORDER: readonly FindingClass[] = [
  'draft-wide',
  'grading',
  'size-specific',
  'personal-fit',
  'none',
  'too-few-reports',
];

/**
 * Findings for one draft: every kind + direction that at least one tester of the draft made,
 * with its statistics, class and reasons. Pure: the same input always gives the same output.
 */
export function analyzeDraft(input: AnalysisInput, draft: string, thresholds?: Partial<Thresholds>): DraftAnalysis {
  const t = resolveThresholds(thresholds);
  const testers = draftTesters(input, draft);
  const findings: Finding[] = kindDirections(testers).map(({ kind, direction }) => {
    const stats = alterationStats(testers, input.sizes, kind, direction, t);
    const c = classifyAlteration(stats, t, draft);
    // Key order follows the documented output format.
    return {
      kind: stats.kind,
      direction: stats.direction,
      class: c.class,
      testers: stats.testers,
      count: stats.count,
      rate: stats.rate,
      wilson: stats.wilson,
      meanMm: stats.meanMm,
      medianMm: stats.medianMm,
      sdMm: stats.sdMm,
      directionShare: stats.directionShare,
      bySize: stats.bySize,
      trend: stats.trend,
      amountSlope: stats.amountSlope,
      bodyCorrelation: stats.bodyCorrelation,
      sizes: c.sizes,
      reasons: c.reasons,
    };
  });
  findings.sort(
    (a, b) =>
      CLASS_ORDER.indexOf(a.class) - CLASS_ORDER.indexOf(b.class) ||
      b.rate - a.rate ||
      a.kind.localeCompare(b.kind) ||
      a.direction.localeCompare(b.direction),
  );
  return { draft, testers: testers.length, findings };
}
