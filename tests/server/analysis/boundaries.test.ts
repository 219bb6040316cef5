// Cases at the edges of the rules: a lone maker, a standout size near the end of the range, a
// standout size on top of a trend, draft-wide with two testers per size, comparisons that land
// exactly on alpha, and the small-sample tools behind them. Sources of the check values are in
// tests/reference/SOURCES.md §6.
import {
  analyzeDraft,
  benjaminiHochberg,
  compareDrafts,
  decimalFraction,
  fisherExact,
  fisherGreaterExact,
  holmAdjust,
  lessThan,
  medianInterval,
  newcombeDifference,
  rateAboveP,
  readerFor,
  renderReasons,
  signTest,
  type AnalysisInput,
  type TesterReport,
} from '../../../server/analysis';

const ELEVEN = ['0', '2', '4', '6', '8', '10', '12', '14', '16', '18', '20'];

function trial(sizes: string[], perSize: number[], make: (size: string, j: number, i: number) => TesterReport['alterations']): AnalysisInput {
  const reports: TesterReport[] = [];
  sizes.forEach((size, i) => {
    for (let j = 0; j < (perSize[i] ?? 0); j++) reports.push({ tester: `${size}-${j}`, size, draft: '1', alterations: make(size, j, i) });
  });
  return { sizes, reports };
}

describe('minimums', () => {
  it('one tester alone never makes a pattern finding (XS–XL with 1, 0, 2, 4, 4 testers; only the XS tester shortens the bodice)', () => {
    const input = trial(['XS', 'S', 'M', 'L', 'XL'], [1, 0, 2, 4, 4], (size) => (size === 'XS' ? [{ kind: 'bodice-length', amountMm: -12.7 }] : []));
    const [f] = analyzeDraft(input, '1').findings;
    expect(f?.class).toBe('too-few-reports');
    expect(f?.tests).toEqual([]);
    expect(renderReasons(f!.reasons, readerFor('in', 'yd'))).toEqual([
      '1 of 11 testers on draft 1 (9%, 95% interval 2%–38%) made “bodice length, taken out”, median −1/2 in.',
      'Only one tester made this change; at least 3 must make a change before it can point at the pattern, so one body or one sewing choice cannot decide it.',
    ]);
  });

  it('two makers in one size: no trend is tested (grading needs makers in two sizes), too few makers for anything', () => {
    const input = trial(ELEVEN, ELEVEN.map(() => 3), (size, j) => (size === '20' && j < 2 ? [{ kind: 'waist', amountMm: -20 }] : []));
    const [f] = analyzeDraft(input, '1').findings;
    expect(f?.class).toBe('too-few-reports');
  });
});

describe('standout sizes', () => {
  it('all three testers of size 18 (of 11 sizes × 3) take in the waist: size-specific, naming size 18', () => {
    const input = trial(ELEVEN, ELEVEN.map(() => 3), (size, j) => (size === '18' ? [{ kind: 'waist', amountMm: -25 - j }] : []));
    const [f] = analyzeDraft(input, '1').findings;
    expect(f?.class).toBe('size-specific');
    expect(f?.sizes).toEqual(['18']);
    // Fisher one-sided 3 of 3 against 0 of 30: 1 / C(33, 3) = 1/5456 (calculated).
    const size18 = f?.tests.find((o) => o.test === 'size' && o.size === '18');
    expect(size18?.p).toBeCloseTo(1 / 5456, 12);
    expect(size18?.passed).toBe(true);
    const text = renderReasons(f!.reasons).join(' ');
    expect(text).toContain('Size 18: 3 of 3 (100%) against 0 of 30 in the other sizes');
    expect(text).toContain('Confined to size 18');
    expect(text).not.toContain('size 0');
  });

  it('a size that stands out on top of a trend keeps its name: grading, with the size named, and the peak in words', () => {
    // 11 sizes × 6: the share rises from none to 3 of 6 across the range, and size 10 has all 6.
    const k = [0, 0, 0, 1, 1, 6, 1, 2, 2, 3, 3];
    const input = trial(ELEVEN, ELEVEN.map(() => 6), (_size, j, i) => (j < (k[i] as number) ? [{ kind: 'full-seat', amountMm: 10 + 2 * i }] : []));
    const [f] = analyzeDraft(input, '1').findings;
    expect(f?.class).toBe('grading');
    expect(f?.sizes).toEqual(['10']);
    const text = renderReasons(f!.reasons).join(' ');
    expect(text).toContain('from 0% in size 0, peaking at 100% in size 10, to 50% in size 20');
    expect(text).toContain('On top of the trend, size 10 stands out on its own; without it the trend still holds');
  });
});

describe('draft-wide with two testers per size', () => {
  it('18 of 22 testers (11 sizes × 2) add to the back crotch length: draft-wide', () => {
    const input = trial(ELEVEN, ELEVEN.map(() => 2), (_s, j, i) => ((i * 2 + j) % 11 < 9 ? [{ kind: 'back-rise', amountMm: 19 + ((i + j) % 3) }] : []));
    const [f] = analyzeDraft(input, '1').findings;
    expect(f?.count).toBe(18);
    expect(f?.class).toBe('draft-wide');
    // Exact binomial P(X ≥ 18 | n = 22, p = 0.25) = 3.6166e-8 (calculated with exact binomial sums).
    expect(f?.rateAbove.p).toBeCloseTo(3.616611365941935e-8, 18);
    expect(renderReasons(f!.reasons, readerFor('cm', 'm')).join(' ')).toContain('“back crotch length, added”, median 2.0 cm');
  });
});

describe('draft comparison on exact arithmetic', () => {
  const series = (draft: string, k: number, n: number, size = '10') =>
    Array.from({ length: n }, (_, i) => ({ tester: `${draft}-${size}-${i}`, size, draft, alterations: i < k ? [{ kind: 'back-rise', amountMm: 20 }] : [] }));
  const compare = (from: TesterReport[], to: TesterReport[]) => {
    const input: AnalysisInput = { sizes: ['10'], reports: [...from, ...to] };
    const findings = analyzeDraft(input, '1').findings.map((f) => ({ ...f, class: 'draft-wide' as const }));
    return compareDrafts(input, '1', '2', {}, findings)[0]!;
  };

  it('3 of 3 → 0 of 3 is exactly p = 1/20: improved, not confirmed (floating point gives 0.049999999999999996)', () => {
    const row = compare(series('1', 3, 3), series('2', 0, 3));
    expect(fisherExact(3, 0, 0, 3).greater).toBeLessThan(0.05); // the float that used to decide
    expect(row).toMatchObject({ status: 'improved', pExact: '1/20' });
    expect(row.reasons.join(' ')).toContain('p = 0.05 (exactly 1/20); a confirmed fix needs p below 0.05');
  });

  it('2 of 4 → 0 of 12 is also exactly 1/20 and gets the same status', () => {
    const row = compare(series('1', 2, 4), series('2', 0, 12));
    expect(row).toMatchObject({ status: 'improved', pExact: '1/20' });
  });

  it('4 of 4 → 0 of 4 is p = 1/70 (the lady tasting tea, Fisher 1935): fixed', () => {
    const row = compare(series('1', 4, 4), series('2', 0, 4));
    expect(row).toMatchObject({ status: 'fixed', pExact: '1/70' });
    expect(row.p).toBeCloseTo(0.014286, 6);
  });

  it('no drop is still present; the difference carries Newcombe’s interval', () => {
    const row = compare(series('1', 2, 6), series('2', 3, 6));
    expect(row.status).toBe('still-present');
    expect(row.difference?.estimate).toBeCloseTo(1 / 6, 12);
    const [lo, hi] = newcombeDifference(3, 6, 2, 6);
    expect(row.difference?.interval).toEqual([lo, hi]);
  });
});

describe('the small-sample tools', () => {
  it('exact fractions: decimals read as written, comparisons exact', () => {
    expect(decimalFraction(0.05)).toEqual({ num: 1n, den: 20n });
    expect(decimalFraction(1e-7)).toEqual({ num: 1n, den: 10000000n });
    expect(fisherGreaterExact(3, 1, 1, 3)).toEqual({ num: 17n, den: 70n }); // Fisher 1935: 3 of 4 right → 17/70
    expect(lessThan({ num: 1n, den: 20n }, decimalFraction(0.05))).toBe(false);
    expect(lessThan({ num: 1n, den: 70n }, decimalFraction(0.05))).toBe(true);
  });

  it("Newcombe's hybrid score interval matches the published worked examples (Newcombe 1998, method 10)", () => {
    const cases: [number, number, number, number, number, number][] = [
      [56, 70, 48, 80, 0.0524, 0.3339],
      [9, 10, 3, 10, 0.1705, 0.809],
      [0, 10, 0, 20, -0.1611, 0.2775],
      [0, 10, 0, 10, -0.2775, 0.2775],
      [10, 10, 0, 20, 0.6791, 1],
      [10, 10, 0, 10, 0.6075, 1],
    ];
    for (const [k1, n1, k2, n2, lo, hi] of cases) {
      const [l, u] = newcombeDifference(k1, n1, k2, n2);
      expect(l).toBeCloseTo(lo, 4);
      expect(u).toBeCloseTo(hi, 4);
    }
  });

  it('sign test, binomial tail and median interval against hand-calculated values', () => {
    expect(signTest(3, 0)).toBeCloseTo(0.25, 12); // 2 · (1/2)³
    expect(signTest(8, 2)).toBeCloseTo(2 * (1 + 10 + 45) / 1024, 12); // 2 · P(X ≤ 2 | 10, ½)
    expect(signTest(0, 0)).toBe(1);
    expect(rateAboveP(7, 10, 0.25)).toBeCloseTo(0.003505706787109375, 14); // Σ_{x≥7} C(10,x) ¼^x ¾^(10−x)
    // n = 6 at 95 %: the extremes, covering 1 − 2/64 = 96.875 % (order-statistic interval tables).
    expect(medianInterval([5, 1, 4, 2, 6, 3], 0.95)).toMatchObject({ low: 1, high: 6 });
    expect(medianInterval([5, 1, 4, 2, 6, 3], 0.95)?.coverage).toBeCloseTo(1 - 2 / 64, 12);
    // n = 5 cannot reach 95 % (1 − 2/32 = 93.75 %).
    expect(medianInterval([1, 2, 3, 4, 5], 0.95)).toBeNull();
  });

  it('Holm and Benjamini–Hochberg on a textbook set of p-values', () => {
    // Holm: 0.01, 0.04, 0.03, 0.005 → sorted 0.005·4, 0.01·3, 0.03·2, 0.04·1 = 0.02, 0.03, 0.06, 0.06.
    expect(holmAdjust([0.01, 0.04, 0.03, 0.005])).toEqual([0.03, 0.06, 0.06, 0.02]);
    // BH at q = 0.05, m = 4: thresholds 0.0125, 0.025, 0.0375, 0.05; the largest p at or under its
    // threshold is 0.04 (rank 4), so all four are discoveries.
    expect(benjaminiHochberg([0.01, 0.04, 0.03, 0.005], 0.05)).toEqual([true, true, true, true]);
    expect(benjaminiHochberg([0.01, 0.2, 0.03, 0.005], 0.05)).toEqual([true, false, true, true]);
    expect(benjaminiHochberg([0.05, 0.5], 0.05)).toEqual([false, false]);
  });
});
