// Draft comparison, fit ratings, fabric check and unclear instruction steps.
import {
  compareDrafts,
  fabricCheck,
  fisherExact,
  fitRatingCells,
  readerFor,
  renderReasons,
  runAnalysis,
  unclearSteps,
  type AnalysisInput,
  type TesterReport,
} from '../../../server/analysis';
import { exampleTrial, generateReports } from './planted-data';

const SIZES = ['0', '2', '4', '6'];

function report(tester: string, size: string, draft: string, extra: Partial<TesterReport> = {}): TesterReport {
  return { tester, size, draft, alterations: [], ...extra };
}

describe('compareDrafts', () => {
  // Draft 1: 8 of 10 testers add to the rise; draft 2: 1 of 10. Draft-wide in draft 1.
  const rise = (n: number) => ({ alterations: [{ kind: 'rise-length', amountMm: 15 + n }] });
  const input: AnalysisInput = {
    sizes: SIZES,
    reports: [
      ...Array.from({ length: 10 }, (_, i) => report(`a${i}`, SIZES[i % 4] as string, '1', i < 8 ? rise(i) : {})),
      ...Array.from({ length: 10 }, (_, i) => report(`b${i}`, SIZES[i % 4] as string, '2', i < 1 ? rise(i) : {})),
      report('c1', '0', '3', rise(1)),
      report('c2', '2', '3', rise(2)),
    ],
  };

  it('calls a clear drop fixed, with the one-sided Fisher p of the two rates', () => {
    const [row] = compareDrafts(input, '1', '2');
    expect(row).toMatchObject({ kind: 'rise-length', direction: 'add', class: 'draft-wide', status: 'fixed' });
    // Same table by hand: 8/10 against 1/10; P(X ≥ 8) under the hypergeometric.
    expect(row?.p).toBeCloseTo(fisherExact(8, 2, 1, 9).greater, 12);
    expect(row?.p).toBeLessThan(0.05);
    expect([row?.countFrom, row?.testersFrom, row?.countTo, row?.testersTo]).toEqual([8, 10, 1, 10]);
  });

  it('calls no drop still-present and a later draft with fewer than 3 testers not-enough-data', () => {
    const [same] = compareDrafts(input, '1', '1');
    expect(same?.status).toBe('still-present');
    expect(same?.p).toBeCloseTo(fisherExact(8, 2, 8, 2).greater, 12);
    const [few] = compareDrafts(input, '1', '3');
    expect(few?.status).toBe('not-enough-data');
    expect(few?.p).toBeNull();
  });

  it('skips findings that are none or too-few-reports', () => {
    expect(compareDrafts(input, '3', '1')).toEqual([]);
  });

  it('on the example trial: the short rise is fixed in draft 2, the crotch grading is not', () => {
    const rows = compareDrafts(exampleTrial(), '1', '2');
    const status = (kind: string) => rows.find((r) => r.kind === kind)?.status;
    expect(status('rise-length')).toBe('fixed');
    // The plant is as strong in draft 2; its rate came out a little lower by chance, far from confirmed.
    const scoop = rows.find((r) => r.kind === 'back-crotch-scoop');
    expect(scoop?.status).toBe('improved');
    expect(scoop?.p).toBeGreaterThan(0.2);
    expect(scoop?.difference?.interval[0]).toBeLessThan(0);
    expect(scoop?.difference?.interval[1]).toBeGreaterThan(0);
    // Personal fit is followed up without calling it a pattern problem.
    expect(rows.filter((r) => r.kind === 'leg-length').map((r) => r.status)).toEqual(['personal-fit', 'personal-fit']);
    // Size-specific findings compare only their sizes: size 12 has 2 testers in draft 2.
    const waist = rows.find((r) => r.kind === 'waist');
    expect(waist?.sizes).toEqual(['12']);
    expect(waist?.status).toBe('not-enough-data');
  });
});

describe('fitRatingCells', () => {
  const input: AnalysisInput = {
    sizes: SIZES,
    reports: [
      report('t1', '0', '1', { fit: { waist: -2, seat: 0 } }),
      report('t2', '0', '1', { fit: { waist: -1, seat: 1 } }),
      report('t3', '0', '1', { fit: { waist: -1 } }),
      report('t4', '2', '1', { fit: { waist: 2 } }),
      report('t5', '2', '1', { fit: { waist: 2 } }),
      report('t6', '0', '2', { fit: { waist: 2 } }),
    ],
  };

  it('gives mean and Student t interval (clipped to the scale) per size × area; off cells with n ≥ 3 are hints, not flags', () => {
    const cells = fitRatingCells(input, '1');
    const waist0 = cells.find((c) => c.size === '0' && c.area === 'waist');
    // [-2, -1, -1]: mean −4/3, SD 1/√3, half-width t(0.975, 2)·SD/√3 = 4.302653·(1/3) [hand, t quantile
    // from tables, tests/reference/SOURCES.md §6]. The lower end, −2.77, lies off the −2 … +2 scale: clipped.
    expect(waist0?.mean).toBeCloseTo(-4 / 3, 12);
    expect(waist0?.interval?.[0]).toBe(-2);
    expect(waist0?.interval?.[1]).toBeCloseTo(-4 / 3 + 4.302653 / 3, 5);
    // Three ratings below 0: exact sign test p = 2 · (1/2)³ = 0.25 (calculated). A mean this far off
    // from three ratings is common by chance, so it is a hint to look at, not a flag.
    expect(waist0?.p).toBeCloseTo(0.25, 12);
    expect(waist0).toMatchObject({ flagged: false, hint: true });
    expect(waist0?.reasons[0]).toContain('too tight or short on average, but not confirmed');
    // Two ratings of +2: strong but too few to flag.
    const waist2 = cells.find((c) => c.size === '2' && c.area === 'waist');
    expect(waist2).toMatchObject({ n: 2, mean: 2, flagged: false, hint: false });
    expect(waist2?.interval).toEqual([2, 2]);
    expect(cells.find((c) => c.area === 'seat')?.flagged).toBe(false);
    // Draft 2's rating stays out of draft 1.
    expect(cells.every((c) => c.n <= 3)).toBe(true);
    expect(fitRatingCells(input, '2')).toHaveLength(1);
  });
});

describe('fabricCheck', () => {
  const needs = [
    { size: '0', widthMm: 1500, needMm: 2000, napped: false },
    { size: '0', widthMm: 1500, needMm: 2300, napped: true },
    { size: '2', widthMm: 1150, needMm: 2600, napped: false },
  ];
  const fab = (widthMm: number, usedMm: number, napped = false) => ({ fabric: { widthMm, usedMm, napped } });
  const input: AnalysisInput = {
    sizes: SIZES,
    fabricNeeds: needs,
    reports: [
      report('t1', '0', '1', fab(1500, 1900)),
      report('t2', '0', '1', fab(1470, 1950)),
      report('t3', '0', '1', fab(1500, 1980)),
      report('t4', '0', '1', fab(1500, 2100)), // 1 of 4 over: one generous cutter, not flagged
      report('t5', '0', '1', fab(1500, 2200, true)), // napped: against the with-nap need, not flagged
      report('t6', '2', '1', fab(1150, 2700)),
      report('t7', '2', '1', fab(1150, 2650)),
      report('t8', '2', '1', fab(1150, 2500)), // 2 of 3 over the 2600 stated: most, and at least two → flagged
      report('t9', '4', '1', fab(1500, 2000)), // no stated need for size 4
    ],
  };

  it('matches widths within tolerance, keeps napped apart, and flags only when most testers (at least two) used more', () => {
    const cells = fabricCheck(input, '1');
    const plain0 = cells.find((c) => c.size === '0' && !c.napped);
    expect(plain0).toMatchObject({ widthMm: 1500, needMm: 2000, n: 4, overNeed: 1, overNeedShare: 0.25, flagged: false });
    expect(renderReasons(plain0!.reasons).join(' ')).toContain('1 of 4 testers used more than the stated 2000 mm, not most of them');
    expect(plain0?.medianUsedMm).toBe(1965);
    const napped0 = cells.find((c) => c.size === '0' && c.napped);
    expect(napped0).toMatchObject({ needMm: 2300, n: 1, overNeed: 0, flagged: false });
    const size2 = cells.find((c) => c.size === '2');
    expect(size2).toMatchObject({ medianUsedMm: 2650, overNeed: 2, flagged: true });
    expect(renderReasons(size2!.reasons).join(' ')).toContain('2 of 3 testers (67%) used more than the stated 2600 mm (median used 2650 mm');
    // The same reason for a reader in inches and yards: the width in whole inches, the stated need
    // rounded up to the next 1/8 yd (2600 mm = 2.84 yd → 2 7/8 yd), the lengths used to the nearest 1/8 yd.
    expect(renderReasons(size2!.reasons, readerFor('in', 'yd')).join(' ')).toContain('Size 2, 45 in wide, without nap: 2 of 3 testers (67%) used more than the stated 2 7/8 yd (median used 2 7/8 yd');
    // One tester of two over is not most: not flagged even at a share of one half.
    const half = fabricCheck({ sizes: SIZES, fabricNeeds: needs, reports: [report('h1', '2', '1', fab(1150, 2700)), report('h2', '2', '1', fab(1150, 2500))] }, '1');
    expect(half[0]).toMatchObject({ overNeed: 1, overNeedShare: 0.5, flagged: false });
    const size4 = cells.find((c) => c.size === '4');
    expect(size4).toMatchObject({ needMm: null, flagged: false });
  });
});

describe('unclearSteps', () => {
  it('counts distinct testers per step and flags two or more', () => {
    const input: AnalysisInput = {
      sizes: SIZES,
      reports: [
        report('t1', '0', '1', { unclearSteps: ['7', '3'] }),
        report('t2', '2', '1', { unclearSteps: ['7'] }),
        report('t3', '4', '1', { unclearSteps: ['12'] }),
        report('t4', '4', '2', { unclearSteps: ['12'] }),
      ],
    };
    expect(unclearSteps(input, '1')).toEqual([
      { step: '7', count: 2, testers: ['t1', 't2'], flagged: true },
      { step: '3', count: 1, testers: ['t1'], flagged: false },
      { step: '12', count: 1, testers: ['t3'], flagged: false },
    ]);
  });
});

describe('runAnalysis', () => {
  it('includes the optional sections only when the input has that data', () => {
    const bare: AnalysisInput = { sizes: ['0', '2', '4', '6', '8', '10', '12', '14', '16', '18', '20'], reports: generateReports({ seed: 5, plants: ['draft-wide'] }) };
    const out = runAnalysis(bare);
    expect(Object.keys(out)).toEqual(['draft', 'drafts', 'testers', 'findings']);
    const full = runAnalysis(exampleTrial(), { draft: '1' });
    expect(Object.keys(full)).toEqual(['draft', 'drafts', 'testers', 'findings', 'fitRatings', 'fitAreas', 'fabric', 'unclearSteps']);
  });

  it('defaults to the latest draft and refuses a draft with no reports', () => {
    const input = exampleTrial();
    expect(runAnalysis(input).draft).toBe('3');
    expect(runAnalysis(input, { compare: ['1', '2'] }).draft).toBe('1');
    expect(() => runAnalysis(input, { draft: '9' })).toThrow('draft "9" has no reports; drafts in the file: 1, 2, 3');
  });
});
