// Draft comparison: did the next draft fix what the earlier one showed?
import { draftTesters } from './alterations';
import { analyzeDraft } from './draft-analysis';
import { decimalFraction, fisherGreaterExact, fractionText, lessThan, toNumber } from './exact';
import { newcombeDifference } from './proportions';
import { resolveThresholds, type Thresholds } from './thresholds';
import type { AnalysisInput, ComparisonRow, ComparisonStatus, Finding } from './types';
import { pValue, pct, sizesList, testersWord } from './wording';

/**
 * For every finding of draft `from` that is not "none" or "too-few-reports", compare its rate with
 * the rate of the same kind + direction in draft `to` by Fisher's exact test, one-sided (the rate
 * is lower in `to`), decided on the exact fraction: "fixed" when p < alpha; "improved" when the
 * rate fell but not by enough to confirm with these testers; "still-present" when it did not
 * fall; "not-enough-data" when `to` has fewer testers than compareMinTesters. A personal-fit
 * finding is not a pattern problem, so it gets "personal-fit" whatever the rates do.
 * Each row carries the difference of the two rates with Newcombe's hybrid score interval.
 *
 * For a size-specific finding both rates are taken over its flagged sizes only: the problem lives
 * there, and diluting it with the other sizes would hide a real fix.
 */
export function compareDrafts(
  input: AnalysisInput,
  from: string,
  to: string,
  thresholds?: Partial<Thresholds>,
  fromFindings?: readonly Finding[],
): ComparisonRow[] {
  const t = resolveThresholds(thresholds);
  const findings = fromFindings ?? analyzeDraft(input, from, t).findings;
  const fromTesters = draftTesters(input, from);
  const toTesters = draftTesters(input, to);
  const alpha = decimalFraction(t.alpha);

  return findings
    .filter((f) => f.class !== 'none' && f.class !== 'too-few-reports')
    .map((f): ComparisonRow => {
      const key = `${f.kind}|${f.direction}`;
      const scope = f.class === 'size-specific' ? new Set(f.sizes) : null;
      const inScope = (x: { size: string }) => scope === null || scope.has(x.size);
      const a = fromTesters.filter(inScope);
      const b = toTesters.filter(inScope);
      const kA = a.filter((x) => x.amounts.has(key)).length;
      const kB = b.filter((x) => x.amounts.has(key)).length;
      const where = scope ? ` in ${sizesList(f.sizes)}` : '';
      const difference =
        a.length > 0 && b.length > 0
          ? { estimate: kB / b.length - kA / a.length, interval: newcombeDifference(kB, b.length, kA, a.length, t.confidence) }
          : null;
      const base = {
        kind: f.kind,
        direction: f.direction,
        class: f.class,
        from,
        to,
        sizes: f.class === 'size-specific' ? [...f.sizes] : [],
        countFrom: kA,
        testersFrom: a.length,
        countTo: kB,
        testersTo: b.length,
        difference,
      };
      const rateA = a.length > 0 ? kA / a.length : 0;
      const summaryLine =
        `Draft ${from}: ${kA} of ${testersWord(a.length)}${where} (${pct(rateA)}); ` +
        `draft ${to}: ${kB} of ${testersWord(b.length)}` +
        (b.length > 0 ? ` (${pct(kB / b.length)}).` : '.');
      const diffLine = difference
        ? `Change in the rate ${signedPct(difference.estimate)}, ${pct(t.confidence)} interval ${signedPct(difference.interval[0])} to ${signedPct(difference.interval[1])} (Newcombe's hybrid score interval).`
        : null;
      if (b.length < t.compareMinTesters) {
        return {
          ...base,
          status: f.class === 'personal-fit' ? 'personal-fit' : 'not-enough-data',
          p: null,
          pExact: null,
          reasons: [summaryLine, `Fewer than ${t.compareMinTesters} testers reported on draft ${to}${where}, too few to tell.`],
        };
      }
      const exact = fisherGreaterExact(kA, a.length - kA, kB, b.length - kB);
      const p = toNumber(exact);
      const shownP = fractionText(exact);
      const pWords = `Fisher one-sided ${pValue(p)}${shownP ? ` (exactly ${shownP})` : ''}`;
      const lower = kB / b.length < rateA;
      const confirmed = lower && lessThan(exact, alpha);
      let status: ComparisonStatus;
      let verdict: string;
      if (f.class === 'personal-fit') {
        status = 'personal-fit';
        verdict = 'This was personal fit in the earlier draft: each tester adjusts to their own body, so no pattern change is expected, whatever the rates do.';
      } else if (confirmed) {
        status = 'fixed';
        verdict = `The rate dropped and the drop is confirmed: ${pWords}, below ${t.alpha}.`;
      } else if (lower) {
        status = 'improved';
        verdict = `The rate dropped, but with this few testers the drop could be chance: ${pWords}; a confirmed fix needs p below ${t.alpha}. More reports on draft ${to} would tell.`;
      } else {
        status = 'still-present';
        verdict = `The rate did not drop (${pWords}).`;
      }
      return { ...base, status, p, pExact: shownP, reasons: [summaryLine, verdict, ...(diffLine ? [diffLine] : [])] };
    });
}

function signedPct(x: number): string {
  const v = Math.round(x * 100);
  return v > 0 ? `+${v}%` : v < 0 ? `−${-v}%` : '0%';
}

