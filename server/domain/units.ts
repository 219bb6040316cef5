/**
 * Lengths as people type and read them, stored as millimetres (DESIGN.md "Units").
 *
 * Pure on purpose: no Node imports, because the app bundles this file too and both ends must read
 * "1 3/8" the same way.
 *
 * Exact definitions (tests/reference/SOURCES.md §5, the international yard and pound agreement of 1959):
 * 1 in = 25.4 mm and 1 yd = 0.9144 m.
 */

/** A person's preferred unit for body and garment lengths. */
export type LengthUnit = 'in' | 'cm';
/** A person's preferred unit for lengths of fabric. */
export type FabricUnit = 'yd' | 'm';

export const LENGTH_UNITS: readonly LengthUnit[] = ['in', 'cm'];
export const FABRIC_UNITS: readonly FabricUnit[] = ['yd', 'm'];

export const MM_PER_INCH = 25.4;
export const MM_PER_YARD = 914.4;
export const MM_PER_CM = 10;
export const MM_PER_METRE = 1000;

/**
 * Above this a body or garment length is surely a typo (a tall person is about 2 m; 5 m leaves
 * room for any hem circumference or cape). Common practice, not a standard.
 */
export const MAX_LENGTH_MM = 5000;
/**
 * Above this a length of fabric is surely a typo: a garment pattern rarely needs more than
 * about 10 m, and 50 m is a whole bolt. Common practice, not a standard.
 */
export const MAX_FABRIC_MM = 50_000;

export type ParseResult = { ok: true; mm: number } | { ok: false; message: string };

export function inchesToMm(inches: number): number {
  return inches * MM_PER_INCH;
}
export function mmToInches(mm: number): number {
  return mm / MM_PER_INCH;
}
export function cmToMm(cm: number): number {
  return cm * MM_PER_CM;
}
export function mmToCm(mm: number): number {
  return mm / MM_PER_CM;
}
export function yardsToMm(yards: number): number {
  return yards * MM_PER_YARD;
}
export function mmToYards(mm: number): number {
  return mm / MM_PER_YARD;
}
export function metresToMm(metres: number): number {
  return metres * MM_PER_METRE;
}
export function mmToMetres(mm: number): number {
  return mm / MM_PER_METRE;
}

// ---------------------------------------------------------------------------------------------
// Reading

/** The forms named in every refusal, so the person sees what would have worked. */
export const LENGTH_FORMS = '1 3/8, 1-3/8, 1.375 in, 3/8", 3.5 cm or 35 mm';
export const FABRIC_FORMS = '2 1/4 yd, 2.25 yd, 2.1 m or 210 cm';

type UnitWord = 'in' | 'cm' | 'mm' | 'm' | 'yd';

/** Every spelling we read, lower case, mapped to its unit. */
const UNIT_WORDS: Record<string, UnitWord> = {
  '"': 'in',
  "''": 'in',
  in: 'in',
  'in.': 'in',
  inch: 'in',
  inches: 'in',
  cm: 'cm',
  centimetre: 'cm',
  centimetres: 'cm',
  centimeter: 'cm',
  centimeters: 'cm',
  mm: 'mm',
  millimetre: 'mm',
  millimetres: 'mm',
  millimeter: 'mm',
  millimeters: 'mm',
  m: 'm',
  metre: 'm',
  metres: 'm',
  meter: 'm',
  meters: 'm',
  yd: 'yd',
  yds: 'yd',
  'yd.': 'yd',
  yard: 'yd',
  yards: 'yd',
};

const MM_PER: Record<UnitWord, number> = {
  in: MM_PER_INCH,
  cm: MM_PER_CM,
  mm: 1,
  m: MM_PER_METRE,
  yd: MM_PER_YARD,
};

/** Unicode vulgar fractions in eighths, as printed charts write them (SOURCES.md §1.1). */
const VULGAR: Record<string, string> = {
  '⅛': '1/8',
  '¼': '1/4',
  '⅜': '3/8',
  '½': '1/2',
  '⅝': '5/8',
  '¾': '3/4',
  '⅞': '7/8',
};

type Reading =
  // value = numerator / denominator, kept apart so 3/8 in is 3 × 25.4 / 8 = 9.525 mm, not 0.375 × 25.4.
  | { ok: true; sign: 1 | -1; numerator: number; denominator: number; isFraction: boolean; unit: UnitWord | null }
  | { ok: false; message: string };

/** Longer than any sensible length, e.g. "12 7/8 inches"; a paste of a paragraph is refused early. */
const MAX_INPUT_CHARS = 40;

/** Lower case, one kind of minus, quote and fraction, single spaces: the text every reader sees. */
function normalise(raw: string): string {
  return raw
    .trim()
    .toLowerCase()
    // The typographic minus and the dashes people paste from documents.
    .replace(/[\u2212\u2012\u2013]/g, '-')
    // Typographic inch and foot marks (double and single prime, curly quotes).
    .replace(/[\u2033\u201c\u201d]/g, '"')
    .replace(/[\u2032\u2018\u2019]/g, "'")
    // "1⅜" → "1 3/8"; "⅜" → "3/8".
    .replace(/[⅛¼⅜½⅝¾⅞]/g, (ch) => ` ${VULGAR[ch]}`)
    .replace(/\s*\/\s*/g, '/')
    .replace(/\s*-\s*/g, '-')
    .replace(/\s+/g, ' ')
    .trim();
}

/**
 * Feet, alone or with inches, as many people know their height: "5 ft 2", "5'2\"", "5' 2 1/2",
 * "5 feet 2 inches", "5 ft". Whole feet, then inches under 12 (a fraction or a decimal is fine).
 * Null when the text is not in feet at all; a refusal when it is, but cannot be read.
 * 1 ft = 12 in exactly (international yard and pound agreement, 1959).
 */
function readFeet(raw: string, allowNegative: boolean): ParseResult | null {
  if (raw.trim().length > MAX_INPUT_CHARS) return null;
  const text = normalise(raw);
  const m = /^([+-])?\s*(\d+)\s*(?:'(?!')|ft\.?|foot|feet)\s*(.*)$/.exec(text);
  if (!m) return null;
  const [, signText, feetText, restText] = m;
  const help = `use feet and inches such as 5 ft 2, 5'2" or 5' 2 1/2", or one unit, e.g. 62 in or 157 cm`;
  if (signText === '-' && !allowNegative) return { ok: false, message: 'cannot be negative here: enter the length without a minus sign' };
  let inches = 0;
  const rest = restText.replace(/^(and|,)\s*/, '').trim();
  if (rest !== '') {
    const r = readQuantity(rest, LENGTH_FORMS, false, help);
    if (!r.ok || (r.unit !== null && r.unit !== 'in')) return { ok: false, message: `could not be read: ${help}` };
    inches = r.numerator / r.denominator;
    if (inches >= 12) return { ok: false, message: `has ${rest} after the feet: the inches after feet are under 12 (${help})` };
  }
  const mm = unsignedZero(((signText === '-' ? -1 : 1) * (Number(feetText) * 12 + inches) * MM_PER_INCH));
  if (Math.abs(mm) > MAX_LENGTH_MM) return { ok: false, message: `is too long to be right (more than 5 m): check the unit, e.g. ${LENGTH_FORMS}` };
  return { ok: true, mm };
}

/**
 * Splits text into sign, number and unit without deciding what the unit means.
 * `forms` is the list of accepted forms to quote when the text is unreadable.
 */
function readQuantity(raw: string, forms: string, allowNegative: boolean, feetMessage: string): Reading {
  const notReadable = { ok: false as const, message: `could not be read: use a form such as ${forms}` };
  let text = raw.trim();
  if (text === '') return { ok: false, message: `is empty: enter a length such as ${forms}` };
  if (text.length > MAX_INPUT_CHARS) return notReadable;

  text = normalise(text);

  // No digit at all ("abc", "NaN", "Infinity", a lone unit): nothing to read.
  if (!/\d/.test(text)) return notReadable;
  // Feet, alone or with inches ("5'6\"", "5 ft 6 in"): one unit per field keeps the reading plain.
  if (/(^|[^'])'(?!')|(^|[\d\s])(ft|foot|feet)\b/.test(text)) return { ok: false, message: feetMessage };

  let sign: 1 | -1 = 1;
  if (text.startsWith('-') || text.startsWith('+')) {
    if (text.startsWith('-')) {
      if (!allowNegative) return { ok: false, message: 'cannot be negative here: enter the length without a minus sign' };
      sign = -1;
    }
    text = text.slice(1).trim();
  }

  // The unit is the trailing run of letters or quote marks, with an optional dot ("in.", "yd.").
  let unit: UnitWord | null = null;
  const unitMatch = /^(.*?)\s*([a-z"']+\.?)$/.exec(text);
  if (unitMatch) {
    const word = unitMatch[2];
    const known = UNIT_WORDS[word];
    if (known === undefined) {
      return { ok: false, message: `has a unit we do not know ("${word}"): use a form such as ${forms}` };
    }
    unit = known;
    text = unitMatch[1];
  }
  const words = text.match(/[a-z"']+/g);
  if (words) {
    return words.some((w) => UNIT_WORDS[w] !== undefined)
      ? { ok: false, message: `has more than one unit: use one unit, such as ${forms}` }
      : notReadable;
  }

  // Decimal: 1.375, .5, 3,5 (a comma only before one or two digits: "1,250" could be a thousand).
  let m = /^(\d+)(?:([.,])(\d+))?$/.exec(text) ?? /^()([.])(\d+)$/.exec(text);
  if (m) {
    const [, whole, mark, decimals] = m;
    if (mark === ',' && decimals.length > 2) {
      return {
        ok: false,
        message: `is ambiguous ("${text}" could be a thousand or a decimal): write ${whole}${decimals} or ${whole}.${decimals}`,
      };
    }
    const value = Number(`${whole || '0'}.${decimals ?? '0'}`);
    return Number.isFinite(value) ? { ok: true, sign, numerator: value, denominator: 1, isFraction: false, unit } : notReadable;
  }

  // Fraction or mixed number: 3/8, 11/8, 1 3/8, 1-3/8.
  m = /^(?:(\d+)[ -])?(\d+)\/(\d+)$/.exec(text);
  if (m) {
    const [, wholeText, numText, denText] = m;
    const num = Number(numText);
    const den = Number(denText);
    if (den === 0) return { ok: false, message: 'divides by zero: use a fraction such as 3/8' };
    if (wholeText !== undefined && num >= den) {
      return { ok: false, message: 'has a fraction of 1 or more after the whole number: use a fraction below 1, e.g. 1 3/8' };
    }
    const numerator = (wholeText === undefined ? 0 : Number(wholeText)) * den + num;
    return Number.isFinite(numerator) && Number.isFinite(den)
      ? { ok: true, sign, numerator, denominator: den, isFraction: true, unit }
      : notReadable;
  }
  return notReadable;
}

/** Turns -0 into 0 so no caller ever stores or prints a signed zero. */
function unsignedZero(n: number): number {
  return n === 0 ? 0 : n;
}

/**
 * Reads a body or garment length typed by a person.
 *
 * - A bare number takes the preferred unit; a bare fraction or mixed number ("1 3/8", "3/8") is
 *   inches for a person who prefers inches and is refused for a person who prefers centimetres
 *   (nobody writes centimetres as fractions, so it is more likely a mistake than a guess).
 * - Units: in / inch / inches / ", cm, mm, and m (metres: "1.65 m" is how many people give a
 *   height, and anything absurd is caught by the 5 m ceiling). Feet and inches are read too
 *   ("5 ft 2", "5'2\"", "5' 2 1/2"), since many people know their height that way.
 * - A decimal comma is read only before one or two digits ("3,5 cm"); "1,250" is refused as
 *   ambiguous between a thousands separator and a decimal comma.
 * - A leading minus (ASCII "-" or the typographic "−") only with allowNegative, for signed
 *   alteration amounts; a leading "+" is always accepted.
 *
 * Messages never name the field: the caller puts the field's label in front ("Hip: …").
 */
export function parseLength(text: string, preferred: LengthUnit, opts: { allowNegative?: boolean } = {}): ParseResult {
  const feet = readFeet(text, opts.allowNegative ?? false);
  if (feet) return feet;
  const r = readQuantity(
    text,
    LENGTH_FORMS,
    opts.allowNegative ?? false,
    'is in feet: give whole feet and inches, e.g. 5 ft 6, or one unit such as 66 in or 168 cm',
  );
  if (!r.ok) return r;
  let unit = r.unit;
  if (unit === 'yd') {
    return { ok: false, message: `is in yards, which are for fabric: use a form such as ${LENGTH_FORMS}` };
  }
  if (unit === null) {
    if (r.isFraction && preferred === 'cm') {
      return { ok: false, message: 'fractions are inches: add in or " (e.g. 1 3/8 in), or write centimetres as a decimal (3.5 cm)' };
    }
    unit = preferred;
  }
  if (r.isFraction && unit !== 'in') {
    return { ok: false, message: `fractions are for inches: write ${unit === 'm' ? 'metres' : unit === 'mm' ? 'millimetres' : 'centimetres'} as a decimal, e.g. 3.5 cm` };
  }
  const mm = unsignedZero((r.sign * r.numerator * MM_PER[unit]) / r.denominator);
  if (Math.abs(mm) > MAX_LENGTH_MM) {
    return { ok: false, message: `is too long to be right (more than 5 m): check the unit, e.g. ${LENGTH_FORMS}` };
  }
  return { ok: true, mm };
}

/**
 * Reads a length of fabric. A bare number or fraction takes the preferred unit, except that a
 * fraction is refused for a person who prefers metres (fractions are yards). Accepts yd / yard(s),
 * m / metre(s), cm, and inches (fat quarters and remnants are given in inches); never negative.
 * Zero is accepted: a view may need none of a contrast fabric.
 */
export function parseFabricLength(text: string, preferred: FabricUnit): ParseResult {
  const r = readQuantity(text, FABRIC_FORMS, false, `is in feet: give it in yards or metres, e.g. ${FABRIC_FORMS}`);
  if (!r.ok) return r;
  let unit = r.unit;
  if (unit === null) {
    if (r.isFraction && preferred === 'm') {
      return { ok: false, message: 'fractions are yards: add yd (e.g. 2 1/4 yd), or write metres as a decimal (2.1 m)' };
    }
    unit = preferred;
  }
  if (r.isFraction && unit !== 'yd' && unit !== 'in') {
    return { ok: false, message: 'fractions are for yards or inches: write metres as a decimal, e.g. 2.1 m' };
  }
  const mm = unsignedZero((r.numerator * MM_PER[unit]) / r.denominator);
  if (mm > MAX_FABRIC_MM) {
    return { ok: false, message: `is too long to be right (more than 50 m): check the unit, e.g. ${FABRIC_FORMS}` };
  }
  return { ok: true, mm };
}

// ---------------------------------------------------------------------------------------------
// Writing

/**
 * Rounds half away from zero (1.5 → 2, −1.5 → −2), so a value and its negative always round to
 * mirror images. The value is first cut to 9 decimals so that float noise such as
 * 34.925 / 25.4 * 8 = 11.000000000000002 or a half that comes out as 0.49999999999 still rounds
 * as the exact arithmetic would.
 */
export function roundHalfAwayFromZero(x: number): number {
  const abs = Number(Math.abs(x).toFixed(9));
  return unsignedZero(Math.sign(x) * Math.round(abs));
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b);
}

/** "1 3/8", "3/8", "2", "0" from a count of 1/denominator steps (non-negative). */
function mixedFraction(steps: number, denominator: number): string {
  const whole = Math.floor(steps / denominator);
  const rest = steps % denominator;
  if (rest === 0) return String(whole);
  const g = gcd(rest, denominator);
  const fraction = `${rest / g}/${denominator / g}`;
  return whole === 0 ? fraction : `${whole} ${fraction}`;
}

function signed(steps: number, body: string): string {
  return steps < 0 ? `-${body}` : body;
}

/**
 * Shows a stored length in the person's unit: inches to the nearest 1/8 in (1/16 in with
 * `sixteenths`) as a mixed fraction in lowest terms ("1 3/8 in", "3/8 in", "2 in", "-1/2 in",
 * "5/16 in"), centimetres to one decimal ("3.5 cm").
 * Halves round away from zero; a value that rounds to zero prints "0 in" / "0.0 cm", never "-0".
 * The output is itself accepted by parseLength.
 */
export function formatLength(mm: number, unit: LengthUnit, opts: { sixteenths?: boolean } = {}): string {
  if (!Number.isFinite(mm)) return '';
  if (unit === 'in') {
    // Sixteenths where they matter: small amounts and the ends of narrow bands (an eighth is 3.2 mm).
    const steps = opts.sixteenths ? 16 : 8;
    const count = roundHalfAwayFromZero((mm / MM_PER_INCH) * steps);
    return `${signed(count, mixedFraction(Math.abs(count), steps))} in`;
  }
  // Tenths of a centimetre are whole millimetres.
  const tenths = roundHalfAwayFromZero(mm);
  const abs = Math.abs(tenths);
  return `${signed(tenths, `${Math.floor(abs / 10)}.${abs % 10}`)} cm`;
}

/**
 * Shows a length of fabric: yards to the nearest 1/8 yd as a mixed fraction ("2 1/4 yd"), metres to
 * two decimals ("2.10 m"). Both are common practice on pattern envelopes and at the cutting table
 * (fabric is cut in eighths of a yard, or to the centimetre). Halves round away from zero.
 */
export function formatFabricLength(mm: number, unit: FabricUnit): string {
  if (!Number.isFinite(mm)) return '';
  if (unit === 'yd') {
    const eighths = roundHalfAwayFromZero((mm / MM_PER_YARD) * 8);
    return `${signed(eighths, mixedFraction(Math.abs(eighths), 8))} yd`;
  }
  // Hundredths of a metre are whole centimetres.
  const cm = roundHalfAwayFromZero(mm / MM_PER_CM);
  const abs = Math.abs(cm);
  return `${signed(cm, `${Math.floor(abs / 100)}.${String(abs % 100).padStart(2, '0')}`)} m`;
}

/**
 * Rounds up to a whole number of steps, after cutting float noise at 9 decimals so an exact
 * eighth (2286 mm = 2 1/2 yd: 2286 / 914.4 × 8 = 20.000000000000004) is not pushed a step up.
 */
function ceilSteps(x: number): number {
  return unsignedZero(Math.ceil(Number(x.toFixed(9))));
}

/**
 * Shows a stated fabric NEED (how much to buy): yards rounded UP to the next 1/8 yd, metres UP to
 * the next centimetre, so the length shown is never less than the need (2300 mm is 2 5/8 yd,
 * not the 2 1/2 yd = 2286 mm that nearest rounding gives). Fabric is sold in eighths of a yard or
 * by the centimetre (common practice, tests/reference/SOURCES.md §5.3). A length already used or measured is shown to the nearest
 * step with formatFabricLength instead. Needs are never negative; the output is accepted by
 * parseFabricLength.
 */
export function formatFabricNeed(mm: number, unit: FabricUnit): string {
  if (!Number.isFinite(mm)) return '';
  const need = Math.max(0, mm);
  if (unit === 'yd') return `${mixedFraction(ceilSteps((need / MM_PER_YARD) * 8), 8)} yd`;
  const cm = ceilSteps(need / MM_PER_CM);
  return `${Math.floor(cm / 100)}.${String(cm % 100).padStart(2, '0')} m`;
}
