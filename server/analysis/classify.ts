// Classification of each kind + direction into a finding class, with the error held over every
// test that could have flagged it.
//
// Tests: personal fit — Pearson r of each tester's net change of the kind (0 for none) with their
// own body difference; grading — least-squares slope of every tester's amount in the direction (0
// for none) on the size order, which uses both how many change and by how much; draft-wide — exact
// binomial test that the share making it is above the draft-wide rate; each size against the rest
// — Fisher's exact test, one-sided. The Cochran–Armitage trend of the share and the slope of the
// amounts among makers are reported beside them.
//
// Errors: within one alteration kind, every test in both directions is one family, Holm-adjusted
// (Holm 1979). Across the kinds of a draft, the families are chosen by
// Benjamini–Hochberg on each family's own p-value (Bonferroni of its smallest), and inside a chosen
// family the tests are held to alpha × chosen / tested (Benjamini & Bogomolov 2014, selective
// inference on families of hypotheses). With nothing planted this keeps the chance of any finding
// in a trial near alpha, whatever the base rate of alterations; `npm run -s analyze:calibrate`
// measures it.
//
// Minimums: fewer than `minMakers` testers who made a change can never point at the pattern, and
// a trend needs makers in at least `gradingMinMakerSizes` sizes.
//
// Order of explanations: personal fit → grading → draft-wide → size-specific. An amount that
// follows the tester's own body is not a pattern problem however it is spread; a trend with size
// points at the grade rules even if the rate is high everywhere; only a flat, common,
// one-directional change blames the draft. A size that stands out keeps its name: when a trend
// and a standout size both hold, the trend is checked again without that size.
import type { AlterationStats } from './alterations';
import { benjaminiHochberg, below, holmAdjust } from './multiple-testing';
import type { Thresholds } from './thresholds';
import type { Direction, Finding, FindingClass, TestName, TestOutcome } from './types';
import { describeKind, directionVerb, kindLabel, len, num, pValue, pct, sizesList, testersWord } from './wording';

export interface Classification {
  class: FindingClass;
  sizes: string[];
  reasons: string[];
}

interface FamilyTest {
  direction: Direction | 'both';
  test: TestName;
  size?: string;
  p: number;
}

export type Family = Finding['family'];

export interface Judgement {
  tests: TestOutcome[];
  family: Family;
}

/**
 * The tests of one direction that could lead to a class; none below the minimums. The personal-fit
 * test is the kind's (both directions share the correlation): judgeDraft adds it once.
 */
export function testsOf(s: AlterationStats, t: Thresholds): FamilyTest[] {
  if (s.testers < t.minTestersPerDraft || s.count < t.minMakers) return [];
  const out: Omit<FamilyTest, 'direction'>[] = [];
  if (s.makerSizes >= t.gradingMinMakerSizes && s.sizeTrend) out.push({ test: 'trend', p: s.sizeTrend.p });
  if (s.directionShare >= t.draftWideMinDirectionShare) out.push({ test: 'draft-wide', p: s.rateAbove.p });
  for (const b of s.bySize) {
    if (b.fisherP !== null && b.n >= t.sizeSpecificMinCount) out.push({ test: 'size', size: b.size, p: b.fisherP });
  }
  return out.map((x) => ({ direction: s.direction, ...x }));
}

/**
 * Judges every kind + direction of one draft together: Holm inside each kind, false-discovery
 * control across kinds. Returns each kind + direction's test outcomes and its family's numbers.
 */
export function judgeDraft(all: readonly AlterationStats[], t: Thresholds): Map<string, Judgement> {
  const kinds = [...new Set(all.map((s) => s.kind))];
  const families = kinds.map((kind) => {
    const own = all.filter((s) => s.kind === kind);
    const tests = own.flatMap((s) => testsOf(s, t));
    // One personal-fit test per kind, shared by its directions (the correlation spans both).
    const pfFrom = own.find((s) => s.testers >= t.minTestersPerDraft && s.count >= t.minMakers && s.bodyCorrelation !== null && s.bodyCorrelation.n >= t.personalFitMinPairs);
    if (pfFrom?.bodyCorrelation) tests.unshift({ direction: 'both', test: 'personal-fit', p: pfFrom.bodyCorrelation.p });
    const adjusted = holmAdjust(tests.map((x) => x.p));
    const kindP = tests.length > 0 ? Math.min(...adjusted) : 1;
    return { kind, tests, adjusted, kindP };
  });
  const tested = families.filter((f) => f.tests.length > 0);
  const chosenFlags = benjaminiHochberg(tested.map((f) => f.kindP), t.alpha);
  const chosen = new Set(tested.filter((_, i) => chosenFlags[i]).map((f) => f.kind));
  const M = tested.length;
  const R = chosen.size;
  const level = M > 0 && R > 0 ? (t.alpha * R) / M : t.alpha / Math.max(1, M);

  const out = new Map<string, Judgement>();
  for (const f of families) {
    const isChosen = chosen.has(f.kind);
    const family: Family = { size: f.tests.length, kindP: f.kindP, chosen: isChosen, level, kindsTested: M, kindsChosen: R };
    for (const direction of ['add', 'remove'] as const) {
      const tests: TestOutcome[] = f.tests
        .map((x, i) => ({ x, adj: f.adjusted[i] as number }))
        .filter(({ x }) => x.direction === direction || x.direction === 'both')
        .map(({ x, adj }) => ({
          test: x.test,
          ...(x.size !== undefined ? { size: x.size } : {}),
          p: x.p,
          adjustedP: adj,
          passed: isChosen && below(adj, level),
        }));
      out.set(`${f.kind}|${direction}`, { tests, family });
    }
  }
  return out;
}

function levelText(f: Family, alpha: number): string {
  return f.kindsChosen > 0 && f.kindsChosen < f.kindsTested
    ? `${num(f.level, 4).replace(/0+$/, '')} (${alpha} × ${f.kindsChosen} of ${f.kindsTested} kinds with a signal)`
    : String(Math.round(f.level * 10000) / 10000);
}

/** "(p = 0.0003; adjusted for the 14 tests of this kind p = 0.004, below 0.05)" */
function confirmed(o: TestOutcome, f: Family, alpha: number): string {
  return `${pValue(o.p)}; adjusted for the ${f.size} tests of this alteration ${pValue(o.adjustedP)}, below ${levelText(f, alpha)}`;
}

/** ", from 0% in size 0, peaking at 100% in size 12, to 33% in size 20": where the share starts, peaks and ends. */
function peakText(s: AlterationStats): string {
  const rated = s.bySize.filter((b) => b.rate !== null);
  const first = rated[0];
  const last = rated[rated.length - 1];
  if (!first || !last || first === last) return '';
  const top = Math.max(...rated.map((b) => b.rate ?? 0));
  const inner = rated.slice(1, -1).filter((b) => b.rate === top);
  const peak = inner.length > 0 && top > (first.rate ?? 0) && top > (last.rate ?? 0) ? `, peaking at ${pct(top)} in ${sizesList(inner.map((b) => b.size))},` : '';
  return `, from ${pct(first.rate ?? 0)} in size ${first.size}${peak} to ${pct(last.rate ?? 0)} in size ${last.size}`;
}

function outcome(j: Judgement, test: TestName, size?: string): TestOutcome | undefined {
  return j.tests.find((o) => o.test === test && (size === undefined || o.size === size));
}

export interface ClassifyContext {
  draft: string;
  judgement: Judgement;
  /** The same kind + direction with some sizes left out (for the standout-size check). */
  without(sizes: readonly string[]): AlterationStats;
}

export function classifyAlteration(s: AlterationStats, t: Thresholds, ctx: ClassifyContext): Classification {
  const { draft, judgement: j } = ctx;
  const f = j.family;
  const countLine =
    `${s.count} of ${testersWord(s.testers)} on draft ${draft} (${pct(s.rate)}, ${pct(t.confidence)} interval ` +
    `${pct(s.wilson[0])}–${pct(s.wilson[1])}) made ${describeKind(s.kind, s.direction)}` +
    (s.medianMm !== null ? `, median ${len(s.medianMm)}.` : '.');

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
  if (s.count < t.minMakers) {
    return {
      class: 'too-few-reports',
      sizes: [],
      reasons: [
        countLine,
        `${s.count === 1 ? 'Only one tester' : `Only ${s.count} testers`} made this change; at least ${t.minMakers} must make ` +
          'a change before it can point at the pattern, so one body or one sewing choice cannot decide it.',
      ],
    };
  }

  const pass = (o: TestOutcome | undefined): o is TestOutcome => o?.passed === true;
  const pf = outcome(j, 'personal-fit');
  const trend = outcome(j, 'trend');
  const wide = outcome(j, 'draft-wide');
  const standout = j.tests.filter((o) => o.test === 'size' && o.passed).map((o) => o.size as string);
  const standoutRows = s.bySize.filter((b) => standout.includes(b.size) && b.k >= t.sizeSpecificMinCount);
  const standoutSizes = standoutRows.map((b) => b.size);
  const bc = s.bodyCorrelation;

  const met: { cls: FindingClass; reasons: string[]; sizes: string[] }[] = [];

  if (pass(pf) && bc && Math.abs(bc.r) >= t.personalFitMinAbsR) {
    met.push({
      cls: 'personal-fit',
      sizes: [],
      reasons: [
        `Each tester's change of ${kindLabel(s.kind).toLowerCase()} (or none) follows their own body difference from the chart: ` +
          `r = ${num(bc.r)} over ${testersWord(bc.n)} (${confirmed(pf, f, t.alpha)}; rule |r| ≥ ${t.personalFitMinAbsR} with at least ` +
          `${t.personalFitMinPairs} testers). This is personal fit, not a pattern change.`,
      ],
    });
  }

  const standoutLines = standoutRows.map((b) => {
    const o = outcome(j, 'size', b.size) as TestOutcome;
    return (
      `Size ${b.size}: ${b.k} of ${b.n} (${pct(b.rate ?? 0)}) against ${s.count - b.k} of ${s.testers - b.n} in the other sizes ` +
      `(Fisher one-sided ${confirmed(o, f, t.alpha)}; at least ${t.sizeSpecificMinCount} testers of the size).`
    );
  });

  if (pass(trend) && s.sizeTrend) {
    const st = s.sizeTrend;
    const grows = (st.slopeMmPerSize > 0) === (s.direction === 'add');
    const reasons: string[] = [
      `The change ${grows ? 'grows' : 'shrinks'} with size: counting a tester who changed nothing as 0, the amount moves by ` +
        `${len(Math.abs(st.slopeMmPerSize))} per size step (least-squares slope over ${testersWord(s.testers)}, ${confirmed(trend, f, t.alpha)}).`,
      `The share making it ${s.trend.z > 0 ? 'rises' : 'falls'} with size${peakText(s)} (Cochran–Armitage z = ${num(s.trend.z)}, ${pValue(s.trend.p)})` +
        (s.amountSlope
          ? `, and among those who made it the amount ${(s.amountSlope.slopeMmPerSize > 0) === (s.direction === 'add') ? 'grows' : 'shrinks'} by ${len(Math.abs(s.amountSlope.slopeMmPerSize))} per size step (${pValue(s.amountSlope.p)}).`
          : '.'),
    ];
    let sizes: string[] = [];
    let carriedByStandout = false;
    if (standoutSizes.length > 0) {
      // Does the trend hold without the standout sizes? If not, those sizes alone made it.
      const rest = ctx.without(standoutSizes);
      const restP = rest.count > 0 && rest.sizeTrend ? rest.sizeTrend.p : 1;
      if (below(restP, t.alpha)) {
        sizes = standoutSizes;
        reasons.push(
          `On top of the trend, ${sizesList(standoutSizes)} ${standoutSizes.length > 1 ? 'stand' : 'stands'} out on ${standoutSizes.length > 1 ? 'their' : 'its'} own; ` +
            `without ${standoutSizes.length > 1 ? 'them' : 'it'} the trend still holds (${pValue(restP)}).`,
          ...standoutLines,
        );
      } else {
        carriedByStandout = true;
        met.push({
          cls: 'size-specific',
          sizes: standoutSizes,
          reasons: [
            ...standoutLines,
            `The change also looks like a trend with size, but it comes from ${sizesList(standoutSizes)} alone: without ` +
              `${standoutSizes.length > 1 ? 'them' : 'it'} there is no trend left (${pValue(restP)}).`,
            `Confined to ${sizesList(standoutSizes)}: check the grade at ${standoutSizes.length > 1 ? 'those sizes' : 'that size'}.`,
          ],
        });
      }
    }
    if (!carriedByStandout) {
      reasons.push('A change that varies with size points at the grade rules rather than the sample-size draft.');
      met.push({ cls: 'grading', sizes, reasons });
    }
  }

  if (pass(wide)) {
    met.push({
      cls: 'draft-wide',
      sizes: [],
      reasons: [
        `Common across the range: ${pct(s.rate)} of the testers made it, above ${pct(s.rateAbove.rate)} ` +
          `(exact binomial test, ${confirmed(wide, f, t.alpha)}), and ${pct(s.directionShare)} of the testers who changed ` +
          `${kindLabel(s.kind).toLowerCase()} ${directionVerb(s.direction)} (rule ≥ ${pct(t.draftWideMinDirectionShare)}). ` +
          'Without a trend with size this points at the sample-size draft itself.',
      ],
    });
  }

  if (standoutSizes.length > 0 && !met.some((m) => m.sizes.length > 0)) {
    met.push({
      cls: 'size-specific',
      sizes: standoutSizes,
      reasons: [...standoutLines, `Confined to ${sizesList(standoutSizes)}: check the grade at ${standoutSizes.length > 1 ? 'those sizes' : 'that size'}.`],
    });
  }

  const order: FindingClass[] = ['personal-fit', 'grading', 'draft-wide', 'size-specific'];
  met.sort((a, b) => order.indexOf(a.cls) - order.indexOf(b.cls));
  const chosen = met[0];
  if (!chosen) {
    return { class: 'none', sizes: [], reasons: [countLine, ...whyNotFlagged(s, t, j)] };
  }
  const alsoMet = [...new Set(met.slice(1).map((m) => m.cls))].filter((c) => c !== chosen.cls);
  const reasons = [countLine, ...chosen.reasons];
  if (alsoMet.length > 0) {
    reasons.push(`Also meets the rule for ${alsoMet.join(' and ')}; ${chosen.cls} is checked first.`);
  }
  return { class: chosen.cls, sizes: chosen.sizes, reasons };
}

function whyNotFlagged(s: AlterationStats, t: Thresholds, j: Judgement): string[] {
  const out: string[] = [];
  const f = j.family;
  const bc = s.bodyCorrelation;
  if (bc) {
    out.push(`Correlation with the body difference r = ${num(bc.r)} over ${testersWord(bc.n)} (${pValue(bc.p)}) is not strong enough for personal fit.`);
  }
  out.push(`No confirmed trend with size: ${s.sizeTrend ? `slope of the amount (0 for no change) ${pValue(s.sizeTrend.p)}, ` : ''}share making it Cochran–Armitage ${pValue(s.trend.p)}.`);
  out.push(
    `Not draft-wide: ${pct(s.rate)} made it (${pct(s.rateAbove.rate)} or more needed, ${pValue(s.rateAbove.p)})` +
      `${s.directionShare < t.draftWideMinDirectionShare ? `, and only ${pct(s.directionShare)} of those who changed ${kindLabel(s.kind).toLowerCase()} went this way` : ''}.`,
  );
  const sized = s.bySize.filter((b) => b.fisherP !== null && b.k > 0);
  if (sized.length > 0) {
    const best = sized.reduce((a, b) => ((b.fisherP as number) < (a.fisherP as number) ? b : a));
    out.push(`No size stands out once every test is counted (closest: size ${best.size}, ${best.k} of ${best.n}, ${pValue(best.fisherP as number)} before adjustment).`);
  }
  // Signals that would pass on their own but not after the corrections: worth a look, not a finding.
  const hints = j.tests.filter((o) => !o.passed && below(o.p, t.alpha));
  if (hints.length > 0 && f.size > 0) {
    const names: Record<TestName, string> = {
      'personal-fit': 'a link with the body',
      trend: 'a change that grows with size',
      'draft-wide': 'a high rate everywhere',
      size: 'a standout size',
    };
    const what = [...new Set(hints.map((o) => (o.test === 'size' ? `size ${o.size} standing out` : names[o.test])))];
    out.push(
      `Hint, not confirmed: ${what.join(', ')} (p < ${t.alpha} on its own), but not once the ${f.size} tests of this alteration` +
        `${f.kindsTested > 1 ? ` and the ${f.kindsTested} alterations of the draft` : ''} are taken into account.`,
    );
  }
  return out;
}
