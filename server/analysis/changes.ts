// The next-draft change table: for each finding the studio will fix, the change to make per size.
//   draft-wide     the draft's median amount at every size, with its distribution-free interval
//                  (order statistics) — make it on the sample size and let the grade carry it;
//   grading        the amount the regression of amount on size order gives at each size, with its
//                  95 % prediction interval (the textbook OLS prediction interval); where the line
//                  crosses zero the size needs no change;
//   size-specific  the size's own median amount at the sizes that stand out, nothing elsewhere;
//   personal-fit   no pattern change: each tester alters for their own body.
import { median } from 'simple-statistics';
import { draftTesters, type DraftTester } from './alterations';
import { medianInterval } from './binomial';
import { studentTQuantile } from './distributions';
import { olsFit } from './regression';
import { resolveThresholds, type Thresholds } from './thresholds';
import type { AnalysisInput, ChangeRow, Direction, Finding } from './types';

export type FindingRef = { kind: string; direction: Direction };

function amountsOf(testers: readonly DraftTester[], key: string) {
  return testers.filter((x) => x.amounts.has(key)).map((x) => ({ size: x.size, index: x.sizeIndex, amount: x.amounts.get(key) as number }));
}

/** Keeps a suggestion on the finding's side of zero: a fitted line that crosses zero means "no change". */
function clip(amount: number, direction: Direction): number {
  return direction === 'add' ? Math.max(0, amount) : Math.min(0, amount);
}

export function changeTable(
  input: AnalysisInput,
  draft: string,
  findings: readonly Finding[],
  wanted: readonly FindingRef[],
  thresholds?: Partial<Thresholds>,
): ChangeRow[] {
  const t = resolveThresholds(thresholds);
  const testers = draftTesters(input, draft);
  const rows: ChangeRow[] = [];
  for (const ref of wanted) {
    const f = findings.find((x) => x.kind === ref.kind && x.direction === ref.direction);
    if (!f) continue;
    const key = `${f.kind}|${f.direction}`;
    const made = amountsOf(testers, key);
    const base = { kind: f.kind, direction: f.direction, class: f.class };
    const row = (size: string, r: Omit<ChangeRow, 'kind' | 'direction' | 'class' | 'size'>) => rows.push({ ...base, size, ...r });

    if (f.class === 'personal-fit') {
      for (const size of input.sizes) {
        row(size, { amountMm: null, interval: null, basis: 'none', extrapolated: false, note: 'Personal fit: each tester alters for their own body; the pattern stays as it is.' });
      }
      continue;
    }

    if (f.class === 'draft-wide' && made.length > 0) {
      const amounts = made.map((m) => m.amount);
      const mid = median(amounts);
      const ci = medianInterval(amounts, t.confidence);
      for (const size of input.sizes) {
        row(size, {
          amountMm: mid,
          interval: ci ? [ci.low, ci.high] : null,
          basis: 'median',
          extrapolated: false,
          note: ci
            ? `The same change at every size (median of ${amounts.length} testers; the interval covers at least ${Math.round(t.confidence * 100)}%, here ${Math.round(ci.coverage * 100)}%): make it on the sample size and let the grade carry it.`
            : `The same change at every size (median of ${amounts.length} testers; too few for an interval).`,
        });
      }
      continue;
    }

    if (f.class === 'grading' && made.length >= 3) {
      const fit = olsFit(made.map((m) => m.index), made.map((m) => m.amount));
      if (fit) {
        const n = made.length;
        const xs = made.map((m) => m.index);
        const xBar = xs.reduce((s, x) => s + x, 0) / n;
        const sxx = xs.reduce((s, x) => s + (x - xBar) ** 2, 0);
        const q = studentTQuantile(1 - (1 - t.confidence) / 2, n - 2);
        const lo = Math.min(...xs);
        const hi = Math.max(...xs);
        input.sizes.forEach((size, i) => {
          const fitted = fit.intercept + fit.slope * i;
          const half = q * fit.residualSd * Math.sqrt(1 + 1 / n + (i - xBar) ** 2 / sxx);
          const amount = clip(fitted, f.direction);
          const extrapolated = i < lo || i > hi;
          row(size, {
            amountMm: amount,
            interval: [fitted - half, fitted + half],
            basis: 'fitted',
            extrapolated,
            note:
              amount === 0
                ? 'The fitted line crosses zero here: no change at this size.'
                : extrapolated
                  ? 'From the fitted line beyond the sizes whose testers made the change: check it on a toile.'
                  : `From the line fitted to ${n} testers' amounts across ${new Set(xs).size} sizes (prediction interval).`,
          });
        });
        continue;
      }
    }

    // Size-specific (and grading without a line, and anything unconfirmed): each size's own median.
    const only = f.class === 'size-specific' ? new Set(f.sizes) : null;
    for (const size of input.sizes) {
      const own = made.filter((m) => m.size === size).map((m) => m.amount);
      if ((only && !only.has(size)) || own.length === 0) {
        row(size, { amountMm: null, interval: null, basis: 'none', extrapolated: false, note: only ? 'No change at this size.' : 'No tester of this size made the change.' });
        continue;
      }
      const ci = medianInterval(own, t.confidence);
      row(size, {
        amountMm: median(own),
        interval: ci ? [ci.low, ci.high] : own.length > 1 ? [Math.min(...own), Math.max(...own)] : null,
        basis: 'size-median',
        extrapolated: false,
        note:
          (f.class === 'size-specific' ? '' : f.class === 'grading' ? 'Too few amounts for a line: ' : 'Not a confirmed finding: ') +
          `median of the ${own.length} ${own.length === 1 ? 'tester' : 'testers'} of this size${ci ? '' : own.length > 1 ? ' (range shown; too few for an interval)' : ''}.`,
      });
    }
  }
  return rows;
}

/** Without a studio's triage (the command line): every finding that points at the pattern. */
export function patternFindings(findings: readonly Finding[]): FindingRef[] {
  return findings.filter((f) => f.class === 'draft-wide' || f.class === 'grading' || f.class === 'size-specific').map((f) => ({ kind: f.kind, direction: f.direction }));
}
