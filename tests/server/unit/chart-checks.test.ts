// Chart checks (grade steps, ease) against outside sources. Each check names its source beside it
// with the marker used in tests/reference/SOURCES.md: [SRC] a named source, [2nd] a
// secondary copy, [CALC] calculated, [CP] common practice, [MEM] from memory; "by hand" =
// arithmetic shown in the comment. 1 in = 25.4 mm exactly (1959 agreement; SOURCES.md §5).
import { linearRegression } from 'simple-statistics';
import {
  easeTable,
  gradeAllSteps,
  gradeSteps,
  type EaseSize,
  type GradedSize,
} from '../../../server/domain/chart-checks';
import type { FinishedMeasurementKey } from '../../../server/domain/garments';
import type { MeasurementKey } from '../../../server/domain/measurements';

const IN = 25.4;
const inch = (x: number) => x * IN;

function sizesOf(labels: string[], columns: Partial<Record<MeasurementKey, number[]>>, toMm = inch): GradedSize[] {
  return labels.map((label, i) => ({
    id: `size-${label}`,
    label,
    bodyMm: Object.fromEntries(Object.entries(columns).map(([k, v]) => [k, toMm((v as number[])[i] as number)])),
  }));
}

// ASTM D5585-11e1, Table 1, inches (SOURCES.md §1 [SRC: ASTM page]).
const D5585_SIZES = ['00', '0', '2', '4', '6', '8', '10', '12', '14', '16', '18', '20'];
const D5585_BUST = [31.125, 31.75, 33, 34.125, 35.25, 36.25, 37.25, 38.75, 40.375, 42.125, 44, 46];
const D5585_WAIST_CURVY = [23.875, 24.625, 25.375, 26.125, 27, 28, 29, 30.75, 32.5, 34.5, 36.75, 39];
const d5585 = sizesOf(D5585_SIZES, { bust: D5585_BUST, waist: D5585_WAIST_CURVY });

describe('grade steps of the ASTM D5585-11e1 bust: a progressive grade', () => {
  const run = gradeSteps(d5585, 'bust', 'in');

  it('has the steps 0.625, 1.25, 1.125, 1.125, 1, 1, 1.5, 1.625, 1.75, 1.875, 2 in (SOURCES.md §2 [CALC])', () => {
    const expected = [0.625, 1.25, 1.125, 1.125, 1, 1, 1.5, 1.625, 1.75, 1.875, 2];
    expect(run.steps).toHaveLength(expected.length);
    run.steps.forEach((s, i) => expect(s.stepMm / IN).toBeCloseTo(expected[i] as number, 9));
  });

  it('10 → 12 = 1.5 in against 6 → 8 = 1.0 in (D5585-11e1, SOURCES.md §2 [CALC])', () => {
    const step = (from: string) => run.steps.find((s) => s.from.label === from);
    expect((step('10')?.stepMm ?? NaN) / IN).toBeCloseTo(1.5, 9);
    expect((step('6')?.stepMm ?? NaN) / IN).toBeCloseTo(1.0, 9);
    expect(step('10')?.text).toBe('Bust 10 → 12: +1 1/2 in.');
  });

  it('is classed progressive, with no step flagged, under the default 1/8 in chart resolution', () => {
    expect(run.pattern).toBe('progressive');
    expect(run.problems).toEqual([]);
    expect(run.summary).toBe('Bust grades progressively: from 5/8 in (00 → 0) to 2 in (18 → 20).');
  });

  it('with no tolerance the 1/8 in shrinks at 2 → 4 and 6 → 8 are shown, and the run reads irregular', () => {
    const strict = gradeSteps(d5585, 'bust', 'in', { toleranceMm: 0 });
    expect(strict.steps.filter((s) => s.flags.includes('shrinks')).map((s) => s.from.label)).toEqual(['2', '6']);
    expect(strict.pattern).toBe('irregular');
  });

  it('the curvy waist grades progressively too (steps recomputed here by hand from Table 1: 3/4 … 2 1/4 in)', () => {
    const waist = gradeSteps(d5585, 'waist', 'in');
    expect(waist.steps.map((s) => s.stepMm / IN).map((x) => Math.round(x * 8) / 8)).toEqual([
      0.75, 0.75, 0.75, 0.875, 1, 1, 1.75, 1.75, 2, 2.25, 2.25,
    ]);
    expect(waist.pattern).toBe('progressive');
  });

  it('gradeAllSteps covers every measurement the chart gives', () => {
    expect(gradeAllSteps(d5585, 'in').map((r) => r.key)).toEqual(['bust', 'waist']);
  });
});

describe('grade steps of other charts', () => {
  it('a 1 in grade is constant (numeric ranges usually use a 1 in grade, SOURCES.md §2 [SRC: A. Hoenes])', () => {
    const run = gradeSteps(sizesOf(['8', '10', '12', '14'], { hip: [36, 37, 38, 39] }), 'hip', 'in');
    expect(run.pattern).toBe('constant');
    expect(run.summary).toBe('Hip grades by a constant 1 in per size.');
  });

  it('4 cm steps then 6 cm is progressive and not a jump (Aldrich-attributed chart, SOURCES.md §1 and §2 [2nd])', () => {
    const bustCm = [76, 80, 84, 88, 92, 96, 100, 104, 110, 116, 122];
    const labels = ['6', '8', '10', '12', '14', '16', '18', '20', '22', '24', '26'];
    const run = gradeSteps(sizesOf(labels, { bust: bustCm }, (cm) => cm * 10), 'bust', 'cm');
    expect(run.pattern).toBe('progressive');
    expect(run.steps.flatMap((s) => s.flags)).toEqual([]);
    expect(run.summary).toBe('Bust grades progressively: from 4.0 cm (6 → 8) to 6.0 cm (24 → 26).');
  });

  it('a step out of line is a jump, and the step after it shrinks [our rule: > 1.5 × both neighbours and ≥ 6 mm more]', () => {
    const run = gradeSteps(sizesOf(['8', '10', '12', '14', '16'], { hip: [36, 37, 39.5, 40.5, 41.5] }), 'hip', 'in');
    expect(run.steps.map((s) => s.flags)).toEqual([[], ['jump'], ['shrinks'], []]);
    expect(run.pattern).toBe('irregular');
    expect(run.problems[0]).toBe('Hip 10 → 12: +2 1/2 in — out of line: more than 1.5 times the steps next to it (1 in and 1 in).');
  });

  it('the jump rule at its edges: exactly 1.5 × is not a jump; more is, but only with 6 mm to spare', () => {
    const mm = (v: number[]) => sizesOf(['a', 'b', 'c', 'd', 'e'], { hip: v }, (x) => x);
    // steps 20, 20, 30, 20: 30 = 1.5 × 20 exactly → not a jump
    expect(gradeSteps(mm([900, 920, 940, 970, 990]), 'hip', 'cm').steps[2]?.flags).toEqual([]);
    // steps 20, 20, 31, 20: 31 > 30 and 11 mm more → jump
    expect(gradeSteps(mm([900, 920, 940, 971, 991]), 'hip', 'cm').steps[2]?.flags).toContain('jump');
    // steps 4, 4, 9, 4: 9 > 6 but only 5 mm more → not a jump
    expect(gradeSteps(mm([900, 904, 908, 917, 921]), 'hip', 'cm').steps[2]?.flags).not.toContain('jump');
    // steps 4, 4, 10, 4: 10 > 6 and 6 mm more → jump
    expect(gradeSteps(mm([900, 904, 908, 918, 922]), 'hip', 'cm').steps[2]?.flags).toContain('jump');
  });

  it('a measurement that falls as the size rises is flagged negative', () => {
    const run = gradeSteps(sizesOf(['8', '10', '12'], { inseam: [30, 30.5, 30.25] }), 'inseam', 'in');
    expect(run.steps[1]?.flags).toContain('negative');
    expect(run.steps[1]?.text).toContain('the inseam falls as the size rises');
    expect(run.pattern).toBe('irregular');
  });

  it('an ungraded length (steps of 0) is constant, not negative', () => {
    const run = gradeSteps(sizesOf(['8', '10', '12'], { inseam: [30, 30, 30] }), 'inseam', 'in');
    expect(run.pattern).toBe('constant');
    expect(run.steps.flatMap((s) => s.flags)).toEqual([]);
  });

  it('a size without a value breaks the run and is named', () => {
    const sizes = sizesOf(['8', '10', '12', '14'], { hip: [36, 37, 38, 39] });
    delete (sizes[2] as GradedSize).bodyMm.hip;
    const run = gradeSteps(sizes, 'hip', 'in');
    expect(run.steps.map((s) => `${s.from.label}-${s.to.label}`)).toEqual(['8-10']);
    expect(run.missing.map((m) => m.label)).toEqual(['12']);
    expect(run.pattern).toBe('too-few');
  });
});

function easeSizes(rows: { label: string; body: Partial<Record<MeasurementKey, number>>; finished: Partial<Record<FinishedMeasurementKey, number>> }[]): EaseSize[] {
  return rows.map((r) => ({
    id: `size-${r.label}`,
    label: r.label,
    bodyMm: Object.fromEntries(Object.entries(r.body).map(([k, v]) => [k, inch(v as number)])),
    finishedMm: Object.fromEntries(Object.entries(r.finished).map(([k, v]) => [k, inch(v as number)])),
  }));
}

describe('ease = finished − body', () => {
  it('40.5 − 38 = +2.5 in (ease definition, SOURCES.md §4 [CP])', () => {
    const table = easeTable(easeSizes([{ label: '12', body: { hip: 38 }, finished: { hip: 40.5 } }]), 'woven', 'trousers', 'in');
    const cell = table.rows.find((r) => r.key === 'hip')?.cells[0];
    expect(cell?.easeMm).toBeCloseTo(inch(2.5), 9);
    expect(cell?.text).toBe('Size 12: +2 1/2 in (finished 40 1/2 in, body 38 in).');
    expect(table.warnings).toEqual([]);
  });

  it('finished measurements with no body counterpart (hem width) are left out of the ease table', () => {
    const table = easeTable(easeSizes([{ label: '12', body: { hip: 38 }, finished: { hip: 40.5, hem_width: 16 } }]), 'woven', 'trousers', 'in');
    expect(table.rows.map((r) => r.key)).toEqual(['hip']);
  });

  it('trouser thigh ease under 1 in is warned (Central Washington Univ. costume text, ch. 16: thigh at least 1 in; SOURCES.md §4)', () => {
    const table = easeTable(easeSizes([{ label: '12', body: { thigh: 22 }, finished: { thigh: 22.75 } }]), 'woven', 'trousers', 'in');
    expect(table.warnings.map((w) => [w.code, w.severity, w.size?.label])).toEqual([['thigh-ease-low', 'warning', '12']]);
    expect(table.warnings[0]?.text).toContain('thigh ease 3/4 in, under the 1 in');
  });

  it('trouser thigh ease of exactly 1 in passes (at least 1 in, same source)', () => {
    const table = easeTable(easeSizes([{ label: '12', body: { thigh: 22 }, finished: { thigh: 23 } }]), 'woven', 'trousers', 'in');
    expect(table.warnings).toEqual([]);
  });

  it('the thigh minimum is for trousers in wovens: not warned on a knit', () => {
    const table = easeTable(easeSizes([{ label: '12', body: { thigh: 22 }, finished: { thigh: 22.75 } }]), 'knit', 'trousers', 'in');
    expect(table.warnings).toEqual([]);
  });

  it('negative ease is warned for a woven without stretch only: a note for a woven with stretch, nothing for a knit', () => {
    const sizes = easeSizes([{ label: '12', body: { bust: 38.75 }, finished: { bust: 37.75 } }]);
    const woven = easeTable(sizes, 'woven', 'top', 'in');
    expect(woven.warnings.map((w) => [w.code, w.severity])).toEqual([['negative-ease', 'warning']]);
    expect(woven.warnings[0]?.text).toContain('the garment is 1 in smaller than the body (finished 37 3/4 in, body 38 3/4 in)');
    expect(easeTable(sizes, 'woven-stretch', 'top', 'in').warnings.map((w) => w.severity)).toEqual(['note']);
    expect(easeTable(sizes, 'knit', 'top', 'in').warnings).toEqual([]);
  });

  it('a finished length shorter than the body (cropped trousers) is not negative ease', () => {
    const table = easeTable(easeSizes([{ label: '12', body: { inseam: 30 }, finished: { inseam: 27 } }]), 'woven', 'trousers', 'in');
    expect(table.warnings).toEqual([]);
    expect(table.rows[0]?.cells[0]?.text).toBe('Size 12: finished 27 in, body 30 in: 3 in shorter than the body.');
  });
});

describe('ease drift across the range (least squares with simple-statistics; limit 1 in [our choice, CP])', () => {
  const labels = ['8', '10', '12', '14', '16', '18'];
  const body = [36, 37, 38, 39, 40, 41];

  it('hip ease growing 1/4 in per size over six sizes (+1 1/4 in in all) is flagged', () => {
    const sizes = easeSizes(labels.map((label, i) => ({ label, body: { hip: body[i] as number }, finished: { hip: (body[i] as number) + 2 + 0.25 * i } })));
    const table = easeTable(sizes, 'woven', 'skirt', 'in');
    const drift = table.rows[0]?.drift;
    // by hand: the eases lie on a line of slope 1/4 in per size; 5 steps → 1 1/4 in
    expect((drift?.slopeMmPerSize ?? NaN) / IN).toBeCloseTo(0.25, 9);
    expect((drift?.changeMm ?? NaN) / IN).toBeCloseTo(1.25, 9);
    expect(drift?.flagged).toBe(true);
    expect(table.warnings.map((w) => w.code)).toEqual(['ease-drift']);
    expect(drift?.text).toBe(
      'Hip ease goes from 2 in at size 8 to 3 1/4 in at size 18: a fitted change of +1 1/4 in across the range (+1/4 in per size), more than 1 in: the small and large sizes will not fit alike.',
    );
  });

  it('ease growing 1/8 in per size (+5/8 in in all) is shown but not flagged', () => {
    const sizes = easeSizes(labels.map((label, i) => ({ label, body: { hip: body[i] as number }, finished: { hip: (body[i] as number) + 2 + 0.125 * i } })));
    const table = easeTable(sizes, 'woven', 'skirt', 'in');
    expect(table.rows[0]?.drift?.flagged).toBe(false);
    expect(table.warnings).toEqual([]);
  });

  it('the slope is the least-squares one, not the end-to-end difference', () => {
    const eases = [2, 2.5, 1.75, 2.25, 2, 3.5];
    const sizes = easeSizes(labels.map((label, i) => ({ label, body: { hip: body[i] as number }, finished: { hip: (body[i] as number) + (eases[i] as number) } })));
    const drift = easeTable(sizes, 'woven', 'skirt', 'in').rows[0]?.drift;
    const { m } = linearRegression(eases.map((e, i) => [i, e]));
    expect((drift?.slopeMmPerSize ?? NaN) / IN).toBeCloseTo(m, 9);
    // end to end is 1 1/2 in, the fitted change 5 × m ≈ 0.9 in: under the limit
    expect(drift?.flagged).toBe(false);
  });
});
