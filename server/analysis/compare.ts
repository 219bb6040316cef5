// Draft comparison: did the next draft fix what the earlier one showed?
import { draftTesters } from './alterations';
import { analyzeDraft } from './draft-analysis';
import { fisherExact } from './fisher';
import { resolveThresholds, type Thresholds } from './thresholds';
import type { AnalysisInput, ComparisonRow, Finding } from './types';
import { pValue, pct, sizesList, testersWord } from './wording';

/**
 * For every finding of draft `from` that is not "none" or "too-few-reports", compare its rate with
 * the rate of the same kind + direction in draft `to` by Fisher's exact test, one-sided (the rate
 * is lower in `to`): "fixed" when p < alpha and the rate is lower, "not-enough-data" when `to`
 * has fewer testers than compareMinTesters, otherwise "still-present".
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
      };
      const rateA = a.length > 0 ? kA / a.length : 0;
      const summaryLine =
        `Draft ${from}: ${kA} of ${testersWord(a.length)}${where} (${pct(rateA)}); ` +
        `draft ${to}: ${kB} of ${testersWord(b.length)}` +
        (b.length > 0 ? ` (${pct(kB / b.length)}).` : '.');
      if (b.length < t.compareMinTesters) {
        return {
          ...base,
          status: 'not-enough-data',
          p: null,
          reasons: [summaryLine, `Fewer than ${t.compareMinTesters} testers reported on draft ${to}${where}, too few to tell.`],
        };
      }
      const p = fisherExact(kA, a.length - kA, kB, b.length - kB).greater;
      const lower = kB / b.length < rateA;
      const fixed = p < t.alpha && lower;
      return {
        ...base,
        status: fixed ? 'fixed' : 'still-present',
        p,
        reasons: [
          summaryLine,
          fixed
            ? `The rate dropped: Fisher one-sided ${pValue(p)} (rule p < ${t.alpha}).`
            : `The drop is not clear enough: Fisher one-sided ${pValue(p)} (rule p < ${t.alpha} and a lower rate).`,
        ],
      };
    });
}
