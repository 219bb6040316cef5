// Classification of one kind + direction into a finding class, in the fixed order of the design:
// too-few-reports → personal-fit → grading → draft-wide → size-specific → none.
// The order encodes precedence of explanations: an amount that follows the tester's own body is
// not a pattern problem however it is spread; a trend with size points at the grade rules even
// if the rate is high everywhere; only a flat, common, one-directional change blames the draft.
import type { AlterationStats } from './alterations';
import type { Thresholds } from './thresholds';
import type { FindingClass } from './types';
import { describeKind, directionVerb, mm, num, pValue, pct, sizesList, testersWord } from './wording';

export interface Classification {
  class: FindingClass;
  sizes: string[];
  reasons: string[];
}

interface Criteria {
  personalFit: boolean;
  trend: boolean;
  slope: boolean;
  draftWide: boolean;
  standoutSizes: string[];
}

export function evaluateCriteria(s: AlterationStats, t: Thresholds): Criteria {
  const c = s.bodyCorrelation;
  return {
    personalFit:
      c !== null && c.n >= t.personalFitMinPairs && Math.abs(c.r) >= t.personalFitMinAbsR && c.p < t.alpha,
    trend: s.trend.p < t.alpha,
    slope: s.amountSlope !== null && s.amountSlope.p < t.alpha,
    draftWide: s.wilson[0] >= t.draftWideMinLowerBound && s.directionShare >= t.draftWideMinDirectionShare,
    standoutSizes: s.bySize
      .filter((b) => b.k >= t.sizeSpecificMinCount && b.holmP !== null && b.holmP < t.alpha)
      .map((b) => b.size),
  };
}

export function classifyAlteration(s: AlterationStats, t: Thresholds, draft: string): Classification {
  const countLine =
    `${s.count} of ${testersWord(s.testers)} on draft ${draft} (${pct(s.rate)}, ${pct(t.confidence)} interval ` +
    `${pct(s.wilson[0])}–${pct(s.wilson[1])}) made ${describeKind(s.kind, s.direction)}` +
    (s.medianMm !== null ? `, median ${mm(s.medianMm)}.` : '.');

  if (s.testers < t.minTestersPerDraft) {
    return {
      class: 'too-few-reports',
      sizes: [],
      reasons: [
        countLine,
        `Only ${testersWord(s.testers)} reported on draft ${draft}; at least ${t.minTestersPerDraft} are needed ` +
          'before anything is flagged, so this is shown but not judged.',
      ],
    };
  }

  const c = evaluateCriteria(s, t);
  const met: { cls: FindingClass; reasons: string[]; sizes: string[] }[] = [];

  if (c.personalFit && s.bodyCorrelation) {
    const bc = s.bodyCorrelation;
    met.push({
      cls: 'personal-fit',
      sizes: [],
      reasons: [
        `The amount follows each tester's own body difference for ${s.kind}: r = ${num(bc.r)} over ` +
          `${testersWord(bc.n)} (${pValue(bc.p)}; rule |r| ≥ ${t.personalFitMinAbsR}, p < ${t.alpha}, ` +
          `at least ${t.personalFitMinPairs} testers). This is personal fit, not a pattern change.`,
      ],
    });
  }

  if (c.trend || c.slope) {
    const reasons: string[] = [];
    if (c.trend) {
      const rated = s.bySize.filter((b) => b.rate !== null);
      const first = rated[0];
      const last = rated[rated.length - 1];
      const span = first && last ? ` (${pct(first.rate ?? 0)} in size ${first.size}, ${pct(last.rate ?? 0)} in size ${last.size})` : '';
      reasons.push(
        `The share of testers making this change ${s.trend.z > 0 ? 'rises' : 'falls'} with size${span}: ` +
          `Cochran–Armitage trend z = ${num(s.trend.z)}, ${pValue(s.trend.p)} (rule p < ${t.alpha}).`,
      );
    }
    if (c.slope && s.amountSlope) {
      const a = s.amountSlope;
      const grows = (a.slopeMmPerSize > 0) === (s.direction === 'add');
      reasons.push(
        `The amount ${grows ? 'grows' : 'shrinks'} by ${mm(Math.abs(a.slopeMmPerSize))} per size step ` +
          `(least-squares slope over ${a.n} amounts in ${a.sizes} sizes, ${pValue(a.p)}; rule p < ${t.alpha}).`,
      );
    }
    reasons.push('A change that varies with size points at the grade rules rather than the sample-size draft.');
    met.push({ cls: 'grading', sizes: [], reasons });
  }

  if (c.draftWide) {
    met.push({
      cls: 'draft-wide',
      sizes: [],
      reasons: [
        `Common across the range: the overall rate's lower ${pct(t.confidence)} bound is ${pct(s.wilson[0])} ` +
          `(rule ≥ ${pct(t.draftWideMinLowerBound)}), and ${pct(s.directionShare)} of the testers who changed ` +
          `${s.kind} ${directionVerb(s.direction)} (rule ≥ ${pct(t.draftWideMinDirectionShare)}). ` +
          'Without a trend with size this points at the sample-size draft itself.',
      ],
    });
  }

  if (c.standoutSizes.length > 0) {
    const tested = s.bySize.filter((b) => b.holmP !== null).length;
    const lines = s.bySize
      .filter((b) => c.standoutSizes.includes(b.size))
      .map((b) => {
        const restN = s.testers - b.n;
        const restK = s.count - b.k;
        return (
          `Size ${b.size}: ${b.k} of ${b.n} (${pct(b.rate ?? 0)}) against ${restK} of ${restN} in the other sizes ` +
          `(Fisher one-sided ${pValue(b.fisherP ?? 1)}, Holm-adjusted over ${tested} sizes ${pValue(b.holmP ?? 1)}; ` +
          `rule p < ${t.alpha} with at least ${t.sizeSpecificMinCount} testers).`
        );
      });
    met.push({
      cls: 'size-specific',
      sizes: c.standoutSizes,
      reasons: [...lines, `Confined to ${sizesList(c.standoutSizes)}: check the grade at ${c.standoutSizes.length > 1 ? 'those sizes' : 'that size'}.`],
    });
  }

  const chosen = met[0];
  if (!chosen) {
    return { class: 'none', sizes: [], reasons: [countLine, ...whyNotFlagged(s, t)] };
  }
  const alsoMet = met.slice(1).map((m) => m.cls);
  const reasons = [countLine, ...chosen.reasons];
  if (alsoMet.length > 0) {
    reasons.push(`Also meets the rule for ${alsoMet.join(' and ')}; ${chosen.cls} is checked first.`);
  }
  return { class: chosen.cls, sizes: chosen.sizes, reasons };
}

function whyNotFlagged(s: AlterationStats, t: Thresholds): string[] {
  const out: string[] = [];
  const bc = s.bodyCorrelation;
  if (bc) {
    out.push(`Correlation with the body difference r = ${num(bc.r)} over ${testersWord(bc.n)} (${pValue(bc.p)}) is not strong enough for personal fit.`);
  }
  out.push(`No trend with size: Cochran–Armitage ${pValue(s.trend.p)}${s.amountSlope ? `, amount slope ${pValue(s.amountSlope.p)}` : ''}.`);
  out.push(
    `Not draft-wide: lower bound ${pct(s.wilson[0])} (needs ≥ ${pct(t.draftWideMinLowerBound)})` +
      `${s.directionShare < t.draftWideMinDirectionShare ? `, and only ${pct(s.directionShare)} of those who changed ${s.kind} went this way` : ''}.`,
  );
  const adj = s.bySize.map((b) => b.holmP).filter((p): p is number => p !== null);
  if (adj.length > 0) {
    out.push(`No size stands out after Holm correction (smallest adjusted ${pValue(Math.min(...adj))}, with at least ${t.sizeSpecificMinCount} testers needed).`);
  }
  return out;
}
