// Lengths typed, stored and shown. Check values name their source beside them: the exact
// definitions are those of the international yard and pound agreement of 1959 (SOURCES.md §5);
// [CALC] = calculated in tests/reference/SOURCES.md §5; "by hand" = exact arithmetic on those definitions, shown.
import * as fc from 'fast-check';
import {
  checkMeasurement,
  MEASUREMENT_KEYS,
  MEASUREMENTS,
  measurementsSchema,
} from '../../../server/domain/measurements';
import {
  formatFabricLength,
  formatFabricNeed,
  formatLength,
  inchesToMm,
  metresToMm,
  mmToCm,
  mmToInches,
  parseFabricLength,
  parseLength,
  roundHalfAwayFromZero,
  yardsToMm,
  type FabricUnit,
  type LengthUnit,
  type ParseResult,
} from '../../../server/domain/units';

function mmOf(result: ParseResult): number {
  if (!result.ok) throw new Error(`expected a length, got a refusal: ${result.message}`);
  return result.mm;
}

function messageOf(result: ParseResult): string {
  if (result.ok) throw new Error(`expected a refusal, got ${result.mm} mm`);
  return result.message;
}

describe('the exact definitions', () => {
  it('1 in = 25.4 mm and 1 yd = 0.9144 m (international yard and pound agreement, 1959)', () => {
    expect(inchesToMm(1)).toBe(25.4);
    expect(mmToInches(25.4)).toBe(1);
    expect(yardsToMm(1)).toBe(914.4);
    expect(metresToMm(0.9144)).toBe(914.4);
    expect(mmOf(parseLength('1 in', 'cm'))).toBe(25.4);
    expect(mmOf(parseFabricLength('1 yd', 'm'))).toBe(914.4);
    // 1 yd = 36 in (same agreement): 36 × 25.4 = 914.4 mm
    expect(mmOf(parseFabricLength('36 in', 'm'))).toBeCloseTo(914.4, 9);
  });

  it('60 in = 152.4 cm, 54 in = 137.16 cm, 45 in = 114.3 cm (fabric widths, SOURCES.md §5 [CALC])', () => {
    expect(mmToCm(mmOf(parseLength('60 in', 'cm')))).toBeCloseTo(152.4, 9);
    expect(mmToCm(mmOf(parseLength('54"', 'cm')))).toBeCloseTo(137.16, 9);
    expect(mmToCm(mmOf(parseLength('45 inches', 'cm')))).toBeCloseTo(114.3, 9);
    expect(formatLength(1524, 'cm')).toBe('152.4 cm');
    expect(formatLength(1524, 'in')).toBe('60 in');
  });

  it('5/8 in = 15.875 mm, which is not the 15 mm of a 1.5 cm seam allowance (SOURCES.md §5 [CALC])', () => {
    const fiveEighths = mmOf(parseLength('5/8"', 'cm'));
    expect(fiveEighths).toBeCloseTo(15.875, 9);
    expect(Math.abs(fiveEighths - 15)).toBeGreaterThan(0.8);
    // Shown in centimetres the two stay apart: 15.875 mm → 1.6 cm, 15 mm → 1.5 cm.
    expect(formatLength(fiveEighths, 'cm')).toBe('1.6 cm');
    expect(formatLength(15, 'cm')).toBe('1.5 cm');
  });
});

describe('parseLength accepts the forms of DESIGN.md "Units"', () => {
  // Expected mm by hand from 1 in = 25.4 mm: 1 3/8 in = 11 × 25.4 / 8 = 34.925; 3/8 in = 9.525.
  it.each<[string, LengthUnit, number]>([
    ['1 3/8', 'in', 34.925],
    ['1-3/8', 'in', 34.925],
    ['1 - 3/8', 'in', 34.925],
    ['1.375 in', 'in', 34.925],
    ['1.375 in', 'cm', 34.925],
    ['1.375"', 'cm', 34.925],
    ['1.375 IN', 'cm', 34.925],
    ['3/8"', 'cm', 9.525],
    ['3/8', 'in', 9.525],
    ['1 3/8 in', 'cm', 34.925],
    ['1 3/8in', 'cm', 34.925],
    ['1 3/8 inches', 'cm', 34.925],
    ['1 3/8 Inch', 'cm', 34.925],
    ['1 3 / 8 in.', 'cm', 34.925],
    ['  1   3/8  ', 'in', 34.925],
    // Printed-chart glyphs and typographic inch marks (printed charts write 38¾, SOURCES.md §1.1).
    ['1⅜', 'in', 34.925],
    ['1 ⅜″', 'cm', 34.925],
    ['1.375”', 'cm', 34.925],
    ['11/8', 'in', 34.925],
    ['3.5 cm', 'in', 35],
    ['3.5cm', 'in', 35],
    ['3,5 cm', 'in', 35],
    ['35 mm', 'in', 35],
    ['35mm', 'in', 35],
    ['35 millimetres', 'in', 35],
    ['0.5 m', 'in', 500],
    ['1.65 m', 'in', 1650],
    ['.5 in', 'cm', 12.7],
    ['+1/2', 'in', 12.7],
    // A bare number takes the preferred unit.
    ['2', 'in', 50.8],
    ['2', 'cm', 20],
    ['3.5', 'cm', 35],
    ['0', 'cm', 0],
  ])('%j (preferring %s) → %f mm', (text, preferred, mm) => {
    expect(mmOf(parseLength(text, preferred))).toBeCloseTo(mm, 9);
  });

  it.each<[string, LengthUnit, number]>([
    ['-1/2', 'in', -12.7],
    ['−1/2 in', 'cm', -12.7],
    ['-1-3/8', 'in', -34.925],
    ['- 1 3/8"', 'cm', -34.925],
    ['-1.3 cm', 'in', -13],
    ['−0.5', 'cm', -5],
  ])('with allowNegative, %j (preferring %s) → %f mm', (text, preferred, mm) => {
    expect(mmOf(parseLength(text, preferred, { allowNegative: true }))).toBeCloseTo(mm, 9);
  });

  // Feet and inches, as many people know their height. 1 ft = 12 in = 304.8 mm exactly
  // (international yard and pound agreement, 1959): 5 ft 2 = 62 in = 1574.8 mm.
  it.each<[string, LengthUnit, number]>([
    ['5 ft 2', 'cm', 62 * 25.4],
    ['5 ft 2', 'in', 62 * 25.4],
    ["5'2\"", 'cm', 62 * 25.4],
    ["5' 2\"", 'in', 62 * 25.4],
    ['5\u2032 2\u2033', 'cm', 62 * 25.4],
    ['5ft2in', 'in', 62 * 25.4],
    ['5 feet 2 inches', 'cm', 62 * 25.4],
    ["5' 2 1/2", 'cm', 62.5 * 25.4],
    ['5 ft 2.5', 'cm', 62.5 * 25.4],
    ['5 ft', 'cm', 60 * 25.4],
    ["6'", 'in', 72 * 25.4],
    ['62 in', 'cm', 62 * 25.4],
  ])('feet and inches: %j (preferring %s) → %f mm', (text, preferred, mm) => {
    expect(mmOf(parseLength(text, preferred))).toBeCloseTo(mm, 9);
  });

  it('never returns a negative zero', () => {
    expect(Object.is(mmOf(parseLength('-0', 'cm', { allowNegative: true })), 0)).toBe(true);
  });
});

describe('parseLength refuses anything else, saying what would work', () => {
  it.each<[string, LengthUnit, RegExp]>([
    ['', 'in', /is empty.*1 3\/8.*3\.5 cm/],
    ['   ', 'cm', /is empty/],
    ['abc', 'in', /could not be read.*1 3\/8, 1-3\/8, 1\.375 in, 3\/8", 3\.5 cm or 35 mm/],
    ['NaN', 'cm', /could not be read/],
    ['Infinity', 'in', /could not be read/],
    ['1e3', 'cm', /could not be read/],
    ['0x10', 'cm', /could not be read/],
    ['1/0', 'in', /divides by zero/],
    ['3/8/2', 'in', /could not be read/],
    ['1..5 cm', 'in', /could not be read/],
    ['1 2 3', 'in', /could not be read/],
    ['3 cm 5 mm', 'in', /more than one unit/],
    ['1 in cm', 'in', /more than one unit/],
    ['cm', 'in', /could not be read/],
    ['3 kg', 'cm', /unit we do not know \("kg"\)/],
    ['1 3/8', 'cm', /fractions are inches: add in or "/],
    ['3/8', 'cm', /fractions are inches/],
    ['3/8 cm', 'in', /fractions are for inches/],
    ['1 1/2 mm', 'in', /fractions are for inches/],
    ['1 9/8', 'in', /fraction of 1 or more/],
    ['1,250', 'cm', /ambiguous.*1250 or 1\.250/],
    ['5.5 ft', 'in', /whole feet and inches, e.g. 5 ft 6/],
    ['5 ft 14', 'cm', /inches after feet are under 12/],
    ['5 ft 2 cm', 'in', /could not be read: use feet and inches/],
    ["-5'", 'in', /cannot be negative/],
    ['2 yd', 'in', /yards/],
    ['6 m', 'cm', /too long/],
    ['5001 mm', 'cm', /too long/],
    ['-1/2', 'in', /cannot be negative/],
    ['−3.5 cm', 'cm', /cannot be negative/],
    ['1 3/8 in and some words that go on and on and on', 'in', /could not be read/],
  ])('%j (preferring %s)', (text, preferred, message) => {
    const result = parseLength(text, preferred);
    expect(result.ok).toBe(false);
    expect(messageOf(result)).toMatch(message);
  });

  it('does not name the field, so the caller can put the label in front', () => {
    for (const text of ['', 'abc', '1 3/8', '6 m', '-1']) {
      const message = messageOf(parseLength(text, 'cm'));
      expect(message).not.toMatch(/^[A-Z]/);
      expect(message).not.toMatch(/field|hip|bust|waist/i);
    }
  });

  it('allows up to 5 m and no further', () => {
    expect(mmOf(parseLength('5 m', 'cm'))).toBe(5000);
    expect(parseLength('500.1 cm', 'cm').ok).toBe(false);
    expect(mmOf(parseLength('-5 m', 'cm', { allowNegative: true }))).toBe(-5000);
    expect(parseLength('-5.01 m', 'cm', { allowNegative: true }).ok).toBe(false);
  });
});

describe('formatLength', () => {
  it.each<[number, LengthUnit, string]>([
    // by hand: 34.925 mm = 1.375 in = 1 3/8 in; 35 mm = 1.378 in → 11.02 eighths → 1 3/8
    [34.925, 'in', '1 3/8 in'],
    [35, 'in', '1 3/8 in'],
    [9.525, 'in', '3/8 in'],
    [50.8, 'in', '2 in'],
    [12.7, 'in', '1/2 in'],
    [-12.7, 'in', '-1/2 in'],
    [-34.925, 'in', '-1 3/8 in'],
    [19.05, 'in', '3/4 in'],
    [0, 'in', '0 in'],
    [35, 'cm', '3.5 cm'],
    [35.04, 'cm', '3.5 cm'],
    [-13, 'cm', '-1.3 cm'],
    [1650, 'cm', '165.0 cm'],
    [0, 'cm', '0.0 cm'],
  ])('%f mm in %s → %j', (mm, unit, text) => {
    expect(formatLength(mm, unit)).toBe(text);
  });

  it('rounds halves away from zero, mirror-image for negatives', () => {
    // 1/16 in = 25.4 / 16 = 1.5875 mm is exactly half an eighth (by hand).
    expect(formatLength(1.5875, 'in')).toBe('1/8 in');
    expect(formatLength(-1.5875, 'in')).toBe('-1/8 in');
    // 3/16 in = 4.7625 mm: half-way between 1/8 and 1/4.
    expect(formatLength(4.7625, 'in')).toBe('1/4 in');
    expect(formatLength(0.5, 'cm')).toBe('0.1 cm');
    expect(formatLength(-0.5, 'cm')).toBe('-0.1 cm');
    expect(formatLength(34.45, 'cm')).toBe('3.4 cm');
    expect(roundHalfAwayFromZero(2.5)).toBe(3);
    expect(roundHalfAwayFromZero(-2.5)).toBe(-3);
    expect(roundHalfAwayFromZero(2.4999)).toBe(2);
  });

  it('never prints a negative zero', () => {
    expect(formatLength(-0.1, 'in')).toBe('0 in');
    expect(formatLength(-0.4, 'cm')).toBe('0.0 cm');
    expect(formatLength(-0, 'in')).toBe('0 in');
    fc.assert(
      fc.property(fc.double({ min: -3, max: 3, noNaN: true }), fc.constantFrom<LengthUnit>('in', 'cm'), (mm, unit) => {
        expect(formatLength(mm, unit)).not.toMatch(/^-0(\.0)? /);
      }),
    );
  });
});

describe('fabric lengths', () => {
  it.each<[string, FabricUnit, number]>([
    // by hand: 2 1/4 yd = 2.25 × 914.4 = 2057.4 mm
    ['2 1/4 yd', 'm', 2057.4],
    ['2-1/4 yards', 'm', 2057.4],
    ['2.25 yd', 'm', 2057.4],
    ['2 1/4', 'yd', 2057.4],
    ['2.1 m', 'yd', 2100],
    ['2,1 m', 'yd', 2100],
    ['210 cm', 'yd', 2100],
    ['2', 'yd', 1828.8],
    ['2', 'm', 2000],
    ['18 in', 'm', 457.2],
    ['0', 'm', 0],
  ])('%j (preferring %s) → %f mm', (text, preferred, mm) => {
    expect(mmOf(parseFabricLength(text, preferred))).toBeCloseTo(mm, 9);
  });

  it.each<[string, FabricUnit, RegExp]>([
    ['', 'yd', /is empty.*2 1\/4 yd/],
    ['lots', 'm', /could not be read.*2 1\/4 yd, 2\.25 yd, 2\.1 m or 210 cm/],
    ['2 1/4', 'm', /fractions are yards: add yd/],
    ['2 1/4 m', 'yd', /fractions are for yards/],
    ['-1 yd', 'yd', /cannot be negative/],
    ['51 m', 'm', /too long/],
    ['3 ft', 'yd', /feet/],
    ['2 yd 1 m', 'yd', /more than one unit/],
  ])('refuses %j (preferring %s)', (text, preferred, message) => {
    expect(messageOf(parseFabricLength(text, preferred))).toMatch(message);
  });

  it.each<[number, FabricUnit, string]>([
    [2057.4, 'yd', '2 1/4 yd'],
    [2100, 'm', '2.10 m'],
    [2057.4, 'm', '2.06 m'],
    [914.4, 'yd', '1 yd'],
    [457.2, 'yd', '1/2 yd'],
    [0, 'yd', '0 yd'],
    [0, 'm', '0.00 m'],
    // by hand: 1/16 yd = 57.15 mm, half an eighth, rounds up
    [57.15, 'yd', '1/8 yd'],
  ])('%f mm in %s → %j', (mm, unit, text) => {
    expect(formatFabricLength(mm, unit)).toBe(text);
  });
});

describe('a stated fabric need is shown rounded up, never short', () => {
  // By hand on the exact definitions (1 yd = 914.4 mm, so 1/8 yd = 114.3 mm; 1 cm = 10 mm).
  it.each<[number, FabricUnit, string]>([
    // 2300 / 114.3 = 20.12 eighths → 21 eighths = 2 5/8 yd = 2400.3 mm; the nearest eighth,
    // 2 1/2 yd = 20 × 114.3 = 2286 mm, would be 14 mm short.
    [2300, 'yd', '2 5/8 yd'],
    // exactly 20 eighths stays 2 1/2 yd (float noise does not push it a step up)
    [2286, 'yd', '2 1/2 yd'],
    [2286.01, 'yd', '2 5/8 yd'],
    // 18 × 114.3 = 2057.4 mm, exact
    [2057.4, 'yd', '2 1/4 yd'],
    [914.4, 'yd', '1 yd'],
    [1, 'yd', '1/8 yd'],
    [0, 'yd', '0 yd'],
    [2300, 'm', '2.30 m'],
    // 230.04 cm → 231 cm, never 2.30 m
    [2300.4, 'm', '2.31 m'],
    [2299.6, 'm', '2.30 m'],
    // 205.74 cm → 206 cm (nearest rounding happens to agree here)
    [2057.4, 'm', '2.06 m'],
    [0, 'm', '0.00 m'],
  ])('%f mm in %s → %j', (mm, unit, text) => {
    expect(formatFabricNeed(mm, unit)).toBe(text);
  });

  it('differs from the nearest-step display exactly where nearest rounding would be short', () => {
    expect(formatFabricLength(2300, 'yd')).toBe('2 1/2 yd');
    expect(formatFabricNeed(2300, 'yd')).toBe('2 5/8 yd');
  });

  it('for needs from 0 to 49 m, reads back at or above the need and less than one step above it', () => {
    // One step: 1/8 yd = 114.3 mm or 1 cm = 10 mm (by hand). A hair of float slack.
    const step = { yd: 914.4 / 8, m: 10 };
    const slack = 1e-6;
    fc.assert(
      fc.property(fc.double({ min: 0, max: 49_000, noNaN: true }), fc.constantFrom<FabricUnit>('yd', 'm'), (mm, unit) => {
        const shown = formatFabricNeed(mm, unit);
        const back = mmOf(parseFabricLength(shown, unit));
        expect(back).toBeGreaterThanOrEqual(mm - slack);
        expect(back - mm).toBeLessThan(step[unit] + slack);
        // Showing what was read back shows the same text (it is already a whole step).
        expect(formatFabricNeed(back, unit)).toBe(shown);
      }),
      { numRuns: 500 },
    );
  });
});

describe('format then parse gives the value back within half the display step', () => {
  const units = fc.constantFrom<LengthUnit>('in', 'cm');
  // Half the step: 1/16 in = 1.5875 mm; 0.05 cm = 0.5 mm (by hand). A hair of float slack on top.
  const halfStep = { in: 25.4 / 16, cm: 0.5 };
  const slack = 1e-9;

  it('for lengths from 0 to 4.99 m, in either unit', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 4990, noNaN: true }), units, (mm, unit) => {
        const shown = formatLength(mm, unit);
        const back = mmOf(parseLength(shown, unit));
        expect(Math.abs(back - mm)).toBeLessThanOrEqual(halfStep[unit] + slack);
        // Reading it with the other preference changes nothing: the unit is written out.
        expect(mmOf(parseLength(shown, unit === 'in' ? 'cm' : 'in'))).toBe(back);
        // And showing it again shows the same text.
        expect(formatLength(back, unit)).toBe(shown);
      }),
      { numRuns: 500 },
    );
  });

  it('for signed alteration amounts when negatives are allowed', () => {
    fc.assert(
      fc.property(fc.double({ min: -1000, max: 1000, noNaN: true }), units, (mm, unit) => {
        const shown = formatLength(mm, unit);
        const back = mmOf(parseLength(shown, unit, { allowNegative: true }));
        expect(Math.abs(back - mm)).toBeLessThanOrEqual(halfStep[unit] + slack);
        expect(formatLength(back, unit)).toBe(shown);
      }),
      { numRuns: 500 },
    );
  });

  it('for fabric from 0 to 49 m, to 1/16 yd (57.15 mm) or 0.005 m (5 mm)', () => {
    const fabricHalfStep = { yd: 914.4 / 16, m: 5 };
    fc.assert(
      fc.property(fc.double({ min: 0, max: 49_000, noNaN: true }), fc.constantFrom<FabricUnit>('yd', 'm'), (mm, unit) => {
        const shown = formatFabricLength(mm, unit);
        const back = mmOf(parseFabricLength(shown, unit));
        expect(Math.abs(back - mm)).toBeLessThanOrEqual(fabricHalfStep[unit] + slack);
        expect(formatFabricLength(back, unit)).toBe(shown);
      }),
      { numRuns: 500 },
    );
  });
});

describe('the measurement vocabulary', () => {
  it('has the survey keys of SOURCES.md §3, each with a label, a hint and a sensible range', () => {
    expect([...MEASUREMENT_KEYS].sort()).toEqual(
      [
        'bust', 'high_bust', 'under_bust', 'waist', 'high_hip', 'hip', 'thigh', 'knee', 'calf', 'height',
        'inseam', 'outseam', 'crotch_depth_seated', 'total_crotch_length', 'back_waist_length',
        'shoulder_width', 'upper_arm',
      ].sort(),
    );
    expect(MEASUREMENTS.map((m) => m.key)).toEqual([...MEASUREMENT_KEYS]);
    for (const m of MEASUREMENTS) {
      expect(m.label.length).toBeGreaterThan(0);
      expect(m.hint.length).toBeGreaterThan(0);
      expect(m.minMm).toBeGreaterThan(0);
      expect(m.maxMm).toBeGreaterThan(m.minMm);
    }
  });

  it('admits every body of the charts in SOURCES.md §1 and refuses a hip of 30 mm', () => {
    // ASTM D5585-11e1 size 00 bust 31 1/8 in and size 20 bust 46 in (SOURCES.md §1 [SRC]);
    // Aldrich-attributed hip 84–127 cm (SOURCES.md §1 [2nd]).
    expect(checkMeasurement('bust', inchesToMm(31.125))).toBeNull();
    expect(checkMeasurement('bust', inchesToMm(46))).toBeNull();
    expect(checkMeasurement('hip', 840)).toBeNull();
    expect(checkMeasurement('hip', 1270)).toBeNull();
    expect(checkMeasurement('hip', 30)).toMatch(/3\.0 cm is outside the plausible range 40\.0 cm to 220\.0 cm/);
    expect(checkMeasurement('hip', 30, 'in')).toMatch(/1 1\/8 in is outside/);
    expect(checkMeasurement('height', 25_000)).toMatch(/outside/);
  });

  it('validates a profile in mm: optional, null clears, out-of-range and unknown keys refused', () => {
    expect(measurementsSchema.parse({ hip: 1000, height: 1650, bust: null })).toEqual({
      hip: 1000,
      height: 1650,
      bust: null,
    });
    expect(measurementsSchema.parse({})).toEqual({});

    const tooSmall = measurementsSchema.safeParse({ hip: 30 });
    expect(tooSmall.success).toBe(false);
    expect(tooSmall.error?.issues[0].path).toEqual(['hip']);
    expect(tooSmall.error?.issues[0].message).toMatch(/outside the plausible range/);

    const unknown = measurementsSchema.safeParse({ hips: 1000 });
    expect(unknown.success).toBe(false);
    expect(unknown.error?.issues[0].message).toMatch(/hips/);

    expect(measurementsSchema.safeParse({ hip: '1000' }).success).toBe(false);
    expect(measurementsSchema.safeParse({ hip: Number.POSITIVE_INFINITY }).success).toBe(false);
  });
});
