import { alterationStats, draftTesters, kindDirections, type AlterationStats } from './alterations';
import { classifyAlteration, judgeDraft } from './classify';
import { textCompare } from './collate';
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
 * with its statistics, class and reasons. The kinds are judged together (classify.ts), so the
 * error is held over the whole draft. Pure: the same input always gives the same output.
 */
export function analyzeDraft(input: AnalysisInput, draft: string, thresholds?: Partial<Thresholds>): DraftAnalysis {
  const t = resolveThresholds(thresholds);
  const testers = draftTesters(input, draft);
  const stats: AlterationStats[] = kindDirections(testers).map(({ kind, direction }) => alterationStats(testers, input.sizes, kind, direction, t));
  const judged = judgeDraft(stats, t);
  const findings: Finding[] = stats.map((s) => {
    const judgement = judged.get(`${s.kind}|${s.direction}`) ?? { tests: [], family: { size: 0, kindP: 1, chosen: false, level: t.alpha, kindsTested: 0, kindsChosen: 0 } };
    const c = classifyAlteration(s, t, {
      draft,
      judgement,
      without: (sizes) => alterationStats(testers.filter((x) => !sizes.includes(x.size)), input.sizes, s.kind, s.direction, t),
    });
    const adjusted = new Map(judgement.tests.filter((o) => o.test === 'size').map((o) => [o.size, o.adjustedP] as const));
    // Key order follows the documented output format.
    return {
      kind: s.kind,
      direction: s.direction,
      class: c.class,
      testers: s.testers,
      count: s.count,
      rate: s.rate,
      wilson: s.wilson,
      meanMm: s.meanMm,
      medianMm: s.medianMm,
      sdMm: s.sdMm,
      directionShare: s.directionShare,
      makerSizes: s.makerSizes,
      rateAbove: s.rateAbove,
      bySize: s.bySize.map((b) => ({ ...b, holmP: adjusted.get(b.size) ?? null })),
      trend: s.trend,
      amountSlope: s.amountSlope,
      sizeTrend: s.sizeTrend,
      bodyCorrelation: s.bodyCorrelation,
      sizes: c.sizes,
      tests: judgement.tests,
      family: judgement.family,
      reasons: c.reasons,
    };
  });
  findings.sort(
    (a, b) =>
      CLASS_ORDER.indexOf(a.class) - CLASS_ORDER.indexOf(b.class) ||
      b.rate - a.rate ||
      textCompare(a.kind, b.kind) ||
      textCompare(a.direction, b.direction),
  );
  return { draft, testers: testers.length, findings };
}
