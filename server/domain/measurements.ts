/**
 * The body-measurement vocabulary (DESIGN.md "Size chart" and "Tester profile"), shared by the
 * profile form, the call page's application form, size charts and the server's request schemas.
 *
 * Keys are the survey measurement keys of tests/reference/SOURCES.md §3; the definitions in the hints follow
 * SOURCES.md §1 (bust from EN 13402-1; the trouser landmarks from Brenne, "Focus on Fit: Trouser
 * fitting", 2020; inseam, outseam and height [MEM] there). Pure: the app bundles it too.
 */
import { z } from 'zod';
import { formatLength, type LengthUnit } from './units';

export const MEASUREMENT_KEYS = [
  'bust',
  'high_bust',
  'under_bust',
  'waist',
  'high_hip',
  'hip',
  'thigh',
  'knee',
  'calf',
  'inseam',
  'outseam',
  'crotch_depth_seated',
  'total_crotch_length',
  'back_waist_length',
  'shoulder_width',
  'upper_arm',
  'height',
] as const;
export type MeasurementKey = (typeof MEASUREMENT_KEYS)[number];

export type MeasurementDef = {
  key: MeasurementKey;
  label: string;
  /** How to take it, in a sentence, shown under the field. */
  hint: string;
  /** Plausible range in mm; outside it the value is almost surely a typo or the wrong unit. */
  minMm: number;
  maxMm: number;
};

/*
 * Ranges: deliberately wide plausibility bounds, not a size chart. They must admit a toddler
 * measured for children's wear (height from 50 cm) and the largest adult plus sizes, and refuse
 * only what cannot be a body: a hip of 3 cm, a bust of 25 m, inches typed as centimetres at the
 * low end. Chosen as common practice from the charts in SOURCES.md §1 widened generously on both
 * sides; no published source gives limits like these.
 */
export const MEASUREMENTS: readonly MeasurementDef[] = [
  { key: 'bust', label: 'Bust', hint: 'Around the fullest part of the bust, tape level, breathing normally.', minMm: 400, maxMm: 2000 },
  { key: 'high_bust', label: 'High bust', hint: 'Around the chest above the bust, high under the arms.', minMm: 400, maxMm: 1900 },
  { key: 'under_bust', label: 'Under bust', hint: 'Around the rib cage just below the bust.', minMm: 350, maxMm: 1800 },
  { key: 'waist', label: 'Waist', hint: 'Around the natural waist, the narrowest part of the torso.', minMm: 350, maxMm: 2000 },
  { key: 'high_hip', label: 'High hip', hint: 'Around the body about 8 cm (3 in) below the waist.', minMm: 400, maxMm: 2000 },
  { key: 'hip', label: 'Hip', hint: 'Around the fullest part of the seat, feet together.', minMm: 400, maxMm: 2200 },
  { key: 'thigh', label: 'Thigh', hint: 'Around the fullest part of one thigh, just below the crotch.', minMm: 200, maxMm: 1100 },
  { key: 'knee', label: 'Knee', hint: 'Around one knee, leg straight.', minMm: 150, maxMm: 750 },
  { key: 'calf', label: 'Calf', hint: 'Around the fullest part of one calf.', minMm: 150, maxMm: 800 },
  { key: 'inseam', label: 'Inseam', hint: 'From the crotch straight down the inside leg to the floor, without shoes.', minMm: 150, maxMm: 1100 },
  { key: 'outseam', label: 'Outseam', hint: 'From the waist down the side of the leg to the floor, without shoes.', minMm: 300, maxMm: 1400 },
  { key: 'crotch_depth_seated', label: 'Crotch depth (seated)', hint: 'Sitting on a firm chair: from the waist at the side down to the seat.', minMm: 100, maxMm: 500 },
  { key: 'total_crotch_length', label: 'Total crotch length', hint: 'From the front waist, down between the legs, up to the back waist.', minMm: 300, maxMm: 1300 },
  { key: 'back_waist_length', label: 'Back waist length', hint: 'From the bone at the base of the neck down the spine to the waist.', minMm: 150, maxMm: 650 },
  { key: 'shoulder_width', label: 'Shoulder width', hint: 'Across the back from one shoulder point to the other.', minMm: 150, maxMm: 650 },
  { key: 'upper_arm', label: 'Upper arm', hint: 'Around the fullest part of the upper arm, arm relaxed.', minMm: 120, maxMm: 700 },
  { key: 'height', label: 'Height', hint: 'Standing straight against a wall, without shoes. Feet and inches work too, e.g. 5 ft 4.', minMm: 500, maxMm: 2300 },
];

const BY_KEY = new Map<string, MeasurementDef>(MEASUREMENTS.map((m) => [m.key, m]));

export function isMeasurementKey(key: string): key is MeasurementKey {
  return BY_KEY.has(key);
}

export function measurementDef(key: MeasurementKey): MeasurementDef {
  const def = BY_KEY.get(key);
  if (!def) throw new RangeError(`unknown measurement key ${key}`);
  return def;
}

/**
 * Null when the value is plausible for the measurement, else a message in the person's unit that,
 * like the units messages, does not name the field (the caller puts the label in front).
 */
export function checkMeasurement(key: MeasurementKey, mm: number, unit: LengthUnit = 'cm'): string | null {
  const { minMm, maxMm } = measurementDef(key);
  if (!Number.isFinite(mm)) return 'must be a number';
  if (mm >= minMm && mm <= maxMm) return null;
  return `${formatLength(mm, unit)} is outside the plausible range ${formatLength(minMm, unit)} to ${formatLength(maxMm, unit)}: check the unit and the tape`;
}

/** One measurement in mm, range-checked; null clears a value (the measurement field emits null when emptied). */
function measurementValue(def: MeasurementDef) {
  return z
    .number({ error: 'must be a length in millimetres' })
    .refine((mm) => mm >= def.minMm && mm <= def.maxMm, {
      // Both units, because the API does not know the person's preference.
      error: (issue) =>
        `${typeof issue.input === 'number' ? `${formatLength(issue.input, 'cm')} is` : 'is'} outside the plausible range ` +
        `${formatLength(def.minMm, 'cm')} to ${formatLength(def.maxMm, 'cm')} ` +
        `(${formatLength(def.minMm, 'in')} to ${formatLength(def.maxMm, 'in')}): check the unit and the tape`,
    })
    .nullable()
    .optional();
}

const shape = Object.fromEntries(MEASUREMENTS.map((def) => [def.key, measurementValue(def)])) as Record<
  MeasurementKey,
  ReturnType<typeof measurementValue>
>;

/**
 * Body measurements in mm keyed by the vocabulary: each optional (or null to clear), each checked
 * against its plausible range; unknown keys are refused so a typo in a key is not silently dropped.
 */
export const measurementsSchema = z.strictObject(shape, {
  error: (issue) =>
    issue.code === 'unrecognized_keys'
      ? `has measurements we do not know (${issue.keys.join(', ')}): use ${MEASUREMENT_KEYS.join(', ')}`
      : undefined,
});
export type Measurements = z.infer<typeof measurementsSchema>;
