// Size advice checked against outside sources. Each check names its source beside it with the
// marker used in tests/reference/SOURCES.md: [SRC] a named source, [CALC] calculated (how is said there),
// [CP] common practice, [MEM] from memory; "by hand" = arithmetic shown in the comment.
// Lengths are given in inches as the sources print them and converted with 1 in = 25.4 mm exactly
// (international yard and pound agreement, 1959; SOURCES.md §5).
import { governingMeasurements } from '../../../server/domain/garments';
import type { MeasurementKey } from '../../../server/domain/measurements';
import {
  adviseSize,
  DEFAULT_FULLER_BELLY_MARGIN_MM,
  sizesFitting,
  toleranceBand,
  type ChartSize,
  type ChartVariant,
  type SizeAdviceInput,
} from '../../../server/domain/size-advice';
import type { LengthUnit } from '../../../server/domain/units';

const IN = 25.4;
const inch = (x: number) => x * IN;

// ASTM D5585-11e1, Table 1, inches (SOURCES.md §1, [SRC: ASTM page]). The hip rows were not
// retrieved, so tops are tested by bust and bottoms with waist-only charts from these rows; charts
// that need a hip are invented below and say so.
const D5585_SIZES = ['00', '0', '2', '4', '6', '8', '10', '12', '14', '16', '18', '20'];
const D5585_BUST = [31.125, 31.75, 33, 34.125, 35.25, 36.25, 37.25, 38.75, 40.375, 42.125, 44, 46];
const D5585_WAIST_CURVY = [23.875, 24.625, 25.375, 26.125, 27, 28, 29, 30.75, 32.5, 34.5, 36.75, 39];
const D5585_WAIST_STRAIGHT = [25.375, 26.125, 26.875, 27.625, 28.5, 29.5, 30.5, 32.25, 34, 36, 38.25, 40.5];

function chartOf(columns: Partial<Record<MeasurementKey, number[]>>, labels: string[] = D5585_SIZES): ChartSize[] {
  return labels.map((label, i) => ({
    id: `size-${label}`,
    label,
    bodyMm: Object.fromEntries(
      Object.entries(columns).map(([key, values]) => [key, inch((values as number[])[i] as number)]),
    ) as Partial<Record<MeasurementKey, number>>,
  }));
}

const d5585Tops = chartOf({ bust: D5585_BUST });

function input(over: Partial<SizeAdviceInput> & Pick<SizeAdviceInput, 'body'>): SizeAdviceInput {
  return {
    category: 'top',
    fabricKind: 'woven',
    chart: { sizes: d5585Tops, draftedHeightMm: null, variants: [] },
    settings: { fullerBellyMarginMm: DEFAULT_FULLER_BELLY_MARGIN_MM },
    unit: 'in' as LengthUnit,
    ...over,
  };
}

describe('size lookup on the ASTM D5585-11e1 chart', () => {
  it('a bust of 38 3/4 in is size 12 (ASTM D5585-11e1 Table 1: size 12 bust 38¾ in)', () => {
    const advice = adviseSize(input({ body: { bust: inch(38.75) } }));
    expect(advice.size?.label).toBe('12');
    expect(advice.governedBy).toBe('bust');
    expect(advice.fit).toBe('within');
    expect(advice.reasons.join(' ')).toContain('Your bust, 38 3/4 in, fits size 12');
  });

  it.each(D5585_SIZES.map((label, i) => [label, D5585_BUST[i] as number]))(
    'a bust equal to the chart value of size %s is that size (ASTM D5585-11e1 Table 1)',
    (label, bust) => {
      expect(adviseSize(input({ body: { bust: inch(bust) } })).size?.label).toBe(label);
    },
  );

  it('trousers on a waist-only chart: curvy waist 30 3/4 in and straight waist 32 1/4 in are size 12 (ASTM D5585-11e1; best check values)', () => {
    for (const waist of [D5585_WAIST_CURVY, D5585_WAIST_STRAIGHT]) {
      const body = { waist: inch(waist[7] as number) };
      const advice = adviseSize(input({ category: 'trousers', chart: { sizes: chartOf({ waist }), draftedHeightMm: null, variants: [] }, body }));
      expect(advice.size?.label).toBe('12');
      // The chart has no hip, so the waist decides, and the reasons say so.
      expect(advice.governedBy).toBe('waist');
      expect(advice.reasons[0]).toContain('the chart gives no hip, so your waist decides');
    }
  });

  it('the deltas of every chart measurement are given in the person\'s unit, against the chosen size', () => {
    const sizes = chartOf({ bust: D5585_BUST, waist: D5585_WAIST_CURVY });
    const advice = adviseSize(input({ chart: { sizes, draftedHeightMm: null, variants: [] }, body: { bust: inch(38.75), waist: inch(31) } }));
    expect(advice.size?.label).toBe('12');
    // by hand: 31 − 30 3/4 = 1/4 in
    const waist = advice.deltas.find((d) => d.key === 'waist');
    expect(waist?.deltaMm).toBeCloseTo(inch(0.25), 9);
    expect(waist?.text).toBe('Waist: 1/4 in more than size 12 (31 in vs 30 3/4 in).');
    expect(advice.deltas.find((d) => d.key === 'bust')?.text).toBe('Bust: the same as size 12 (38 3/4 in).');

    const cm = adviseSize(input({ chart: { sizes, draftedHeightMm: null, variants: [] }, body: { bust: inch(38.75), waist: inch(31) }, unit: 'cm' }));
    // by hand: 0.25 in = 6.35 mm → 0.6 cm; 31 in = 78.74 cm; 30.75 in = 78.105 cm → 78.1 cm
    expect(cm.deltas.find((d) => d.key === 'waist')?.text).toBe('Waist: 0.6 cm more than size 12 (78.7 cm vs 78.1 cm).');
    expect(cm.reasons.join(' ')).not.toMatch(/\d in\b/);
  });
});

describe('the size-fit tolerance rule: within the chart value ± half the interval (Simmons et al. 2004, as applied by Shin & Saeidi 2022)', () => {
  const bust = D5585_BUST.map(inch);
  // by hand from ASTM D5585-11e1: size 12 (index 7) is 38 3/4; size 10 is 37 1/4, size 14 is 40 3/8.
  // Lower edge 38 3/4 − (38 3/4 − 37 1/4)/2 = 38; upper edge 38 3/4 + (40 3/8 − 38 3/4)/2 = 39 9/16.
  it('size 12 of D5585 fits busts from 38 in to 39 9/16 in', () => {
    const band = toleranceBand(bust, 7);
    expect(band?.lowMm).toBeCloseTo(inch(38), 9);
    expect(band?.highMm).toBeCloseTo(inch(39.5625), 9);
  });

  it('at the half-interval boundary the body fits both sizes; just past it, only the next', () => {
    expect(sizesFitting(bust, inch(39.5625))).toEqual([7, 8]);
    expect(sizesFitting(bust, inch(39.5625) + 0.1)).toEqual([8]);
    expect(sizesFitting(bust, inch(39.5625) - 0.1)).toEqual([7]);
    expect(sizesFitting(bust, inch(38))).toEqual([6, 7]);
    expect(sizesFitting(bust, inch(38) - 0.1)).toEqual([6]);
  });

  it('on the boundary a woven takes the larger size and a knit the smaller [CP], and the reasons say which and why', () => {
    const woven = adviseSize(input({ body: { bust: inch(39.5625) } }));
    expect(woven.size?.label).toBe('14');
    expect(woven.fit).toBe('between');
    expect(woven.blend?.fromSize.label).toBe('12');
    expect(woven.blend?.toSize.label).toBe('14');
    expect(woven.reasons.join(' ')).toContain('the larger for a woven');

    const knit = adviseSize(input({ fabricKind: 'knit', body: { bust: inch(39.5625) } }));
    expect(knit.size?.label).toBe('12');
    expect(knit.reasons.join(' ')).toContain('the smaller for a knit');

    const past = adviseSize(input({ body: { bust: inch(39.5625) + 0.1 } }));
    expect(past.size?.label).toBe('14');
    expect(past.fit).toBe('within');
    expect(past.blend).toBeNull();
  });

  it('beyond the ends of the range: below 00 and above 20, with the nearest size', () => {
    // by hand: 00 fits from 31 1/8 − (31 3/4 − 31 1/8)/2 = 30 13/16; 20 up to 46 + (46 − 44)/2 = 47
    const below = adviseSize(input({ body: { bust: inch(30.8125) - 0.1 } }));
    expect(below.fit).toBe('below-range');
    expect(below.size?.label).toBe('00');
    expect(adviseSize(input({ body: { bust: inch(30.8125) } })).fit).toBe('within');

    const above = adviseSize(input({ body: { bust: inch(47) + 0.1 } }));
    expect(above.fit).toBe('above-range');
    expect(above.size?.label).toBe('20');
    expect(above.reasons.join(' ')).toContain('above the largest size: size 20 fits up to 47 in');
    expect(adviseSize(input({ body: { bust: inch(47) } })).fit).toBe('within');
  });
});

// An invented trouser chart (the D5585 hip rows were not retrieved): a 2 in hip grade, waist from
// D5585-11e1 curvy for sizes 10–16, and an inseam of 30 in in every size (inseam often ungraded,
// SOURCES.md §2 [MEM]). Drafted for 66 in, an invented but usual drafting height [CP].
const trouserSizes = chartOf(
  { hip: [39, 41, 43, 45], waist: [29, 30.75, 32.5, 34.5], inseam: [30, 30, 30, 30] },
  ['10', '12', '14', '16'],
);
const fullerFront: ChartVariant = {
  id: 'fuller-front',
  name: 'Fuller front',
  kind: 'fuller-belly',
  overrides: { 'size-12': { waist: inch(32) } },
};
const trousers = (body: SizeAdviceInput['body'], extra: Partial<SizeAdviceInput> = {}) =>
  adviseSize(
    input({
      category: 'trousers',
      chart: { sizes: trouserSizes, draftedHeightMm: inch(66), variants: [fullerFront] },
      body,
      ...extra,
    }),
  );

describe('blend between sizes', () => {
  it('hip says 12, waist says 14: the size is 12 by the hip, with a blend to 14 at the waist', () => {
    const advice = trousers({ hip: inch(41), waist: inch(32.5) });
    expect(governingMeasurements('trousers')).toEqual(['hip', 'waist']);
    expect(advice.size?.label).toBe('12');
    expect(advice.governedBy).toBe('hip');
    expect(advice.fit).toBe('between');
    expect(advice.blend?.fromSize.label).toBe('12');
    expect(advice.blend?.toSize.label).toBe('14');
    expect(advice.blend?.text).toBe('Hip says 12, waist says 14: blend from 12 at the hip to 14 at the waist.');
    expect(advice.reasons).toContain(advice.blend?.text);
  });

  it('no blend when the waist points at the same size as the hip', () => {
    const advice = trousers({ hip: inch(41), waist: inch(30.75) });
    expect(advice.fit).toBe('within');
    expect(advice.blend).toBeNull();
    expect(advice.reasons.join(' ')).toContain('no blend needed');
  });

  it('a jumpsuit takes the larger of the sizes the hip and the bust point at [CP]', () => {
    const sizes = chartOf({ bust: [37.25, 38.75, 40.375], hip: [39, 41, 43] }, ['10', '12', '14']);
    const advice = adviseSize(input({ category: 'jumpsuit', chart: { sizes, draftedHeightMm: null, variants: [] }, body: { bust: inch(40.375), hip: inch(41) } }));
    expect(advice.size?.label).toBe('14');
    expect(advice.governedBy).toBe('bust');
    expect(advice.blend?.text).toBe('Bust says 14, hip says 12: blend from 14 at the bust to 12 at the hip.');
  });
});

describe('the fuller-belly variant (studio margin, default 1 in)', () => {
  it('at the margin — waist exactly 1 in over size 12\'s — the standard front is kept', () => {
    // by hand: 30 3/4 + 1 = 31 3/4 in; the hip (41 in) keeps size 12
    const advice = trousers({ hip: inch(41), waist: inch(31.75) });
    expect(advice.size?.label).toBe('12');
    expect(advice.variantSuggestions).toEqual([]);
    expect(advice.reasons.join(' ')).toContain("Your waist is 1 in more than size 12's, within the studio's margin of 1 in");
  });

  it('just past the margin the fuller-belly variant is suggested, with the numbers', () => {
    const advice = trousers({ hip: inch(41), waist: inch(31.875) });
    expect(advice.variantSuggestions).toHaveLength(1);
    const [s] = advice.variantSuggestions;
    expect(s?.kind).toBe('fuller-belly');
    expect(s?.variantId).toBe('fuller-front');
    expect(s?.text).toContain("Your waist is 1 1/8 in more than size 12's (31 7/8 in vs 30 3/4 in), more than the studio's margin of 1 in");
    expect(s?.text).toContain('"Fuller front"');
  });

  it('follows the studio setting, not a fixed amount', () => {
    const half = trousers({ hip: inch(41), waist: inch(31.5) }, { settings: { fullerBellyMarginMm: inch(0.5) } });
    expect(half.variantSuggestions.map((v) => v.variantId)).toEqual(['fuller-front']);
    const one = trousers({ hip: inch(41), waist: inch(31.5) });
    expect(one.variantSuggestions).toEqual([]);
  });
});

describe('cup variants', () => {
  // Invented: size 12 drafted with bust 38 3/4 and high bust 36 3/4 (2 in, the B-cup draft of
  // SOURCES.md §3 [MEM]); a "C/D" variant adds 1 1/2 in to the bust.
  const sizes = chartOf({ high_bust: [35.25, 36.75, 38.375], bust: [37.25, 38.75, 40.375] }, ['10', '12', '14']);
  const cupVariant: ChartVariant = { id: 'cd', name: 'C/D cup', kind: 'cup', overrides: { 'size-12': { bust: inch(40.25) } } };
  const dress = (body: SizeAdviceInput['body']) =>
    adviseSize(input({ category: 'dress', chart: { sizes, draftedHeightMm: null, variants: [cupVariant] }, body }));

  it('sizes a dress by the high bust and suggests the cup variant when full − high bust is nearer its own', () => {
    const advice = dress({ high_bust: inch(36.75), bust: inch(40.25) });
    expect(advice.governedBy).toBe('high_bust');
    expect(advice.size?.label).toBe('12');
    // The full bust is the cup's business here, not a blend to a larger size.
    expect(advice.blend).toBeNull();
    expect(advice.variantSuggestions.map((v) => v.variantId)).toEqual(['cd']);
  });

  it('keeps the standard cup when the body difference matches the draft', () => {
    expect(dress({ high_bust: inch(36.75), bust: inch(38.75) }).variantSuggestions).toEqual([]);
  });
});

describe('leg length', () => {
  it('a tester about 3 1/2 in shorter than the drafted height is advised to shorten the leg [CP: rule of thumb, no published source]', () => {
    // 66 − 3 1/2 = 62 1/2 in; no inseam given, so the rough estimate from height is used:
    // 45% of the height difference [CP], by hand 0.45 × 3.5 = 1.575 in → shown as 1 5/8 in.
    const advice = trousers({ hip: inch(41), height: inch(62.5) });
    expect(advice.legLength?.direction).toBe('shorten');
    expect(advice.legLength?.basis).toBe('height');
    expect(advice.legLength?.rough).toBe(true);
    expect(advice.legLength?.changeMm).toBeCloseTo(-inch(1.575), 9);
    expect(advice.legLength?.text).toContain('Expect to shorten the leg by roughly 1 5/8 in');
    expect(advice.legLength?.text).toContain('rough estimate');
  });

  it('a tester 1 in shorter gets no change from the rough estimate (under 1/2 in, SOURCES.md §3 leg_length [CP])', () => {
    expect(trousers({ hip: inch(41), height: inch(65) }).legLength?.direction).toBe('none');
  });

  it('the inseam, when given, decides exactly: 29 in against size 12\'s 30 in is 1 in shorter', () => {
    const advice = trousers({ hip: inch(41), inseam: inch(29), height: inch(70) });
    expect(advice.legLength?.basis).toBe('inseam');
    expect(advice.legLength?.rough).toBe(false);
    expect(advice.legLength?.changeMm).toBeCloseTo(-IN, 9);
    expect(advice.legLength?.text).toBe("Shorten the leg by 1 in: your inseam is 29 in, size 12's is 30 in.");
  });

  it('no leg advice for a skirt', () => {
    const sizes = chartOf({ hip: [39, 41], waist: [29, 30.75] }, ['10', '12']);
    const advice = adviseSize(input({ category: 'skirt', chart: { sizes, draftedHeightMm: inch(66), variants: [] }, body: { hip: inch(41), height: inch(62.5) } }));
    expect(advice.legLength).toBeNull();
  });
});

describe('when no size can be picked', () => {
  it('says the chart lacks the governing measurement', () => {
    const advice = adviseSize(input({ category: 'trousers', body: { hip: inch(40) } }));
    expect(advice.size).toBeNull();
    expect(advice.noSizeReason).toContain('this chart gives no hip or waist');
    expect(advice.reasons[0]).toBe(advice.noSizeReason);
  });

  it('says the body lacks the governing measurement', () => {
    const advice = adviseSize(input({ body: { waist: inch(30) } }));
    expect(advice.size).toBeNull();
    expect(advice.noSizeReason).toContain('add your bust');
  });
});
