/**
 * Garment and fabric vocabularies of a pattern (DESIGN.md "Domain": garment category, fabric kind,
 * finished measurements), and which body measurements decide the size of each kind of garment
 * (DESIGN.md "The computation" §1).
 *
 * Pure on purpose: no Node imports, because the app bundles this file too (the pattern editor and
 * the tester's size advice read the same lists).
 *
 * Markers as in tests/reference/SOURCES.md: a trade fact with a named source says so; [CP]
 * is common practice with no source; [MEM] is from memory, unverified.
 */
import type { MeasurementKey } from './measurements';

// ---------------------------------------------------------------------------------------------
// Garment categories

export const GARMENT_CATEGORY_KEYS = [
  'trousers',
  'shorts',
  'skirt',
  'dress',
  'top',
  'shirt',
  'jacket',
  'coat',
  'jumpsuit',
  'childrens-wear',
  'sleepwear',
  'other',
] as const;
export type GarmentCategory = (typeof GARMENT_CATEGORY_KEYS)[number];

export type GarmentCategoryDef = {
  key: GarmentCategory;
  label: string;
  /**
   * Whether the garment has full-length legs, so size advice estimates a leg-length change.
   * Shorts do not: their leg length is a matter of style, not of the tester's height. Children's
   * wear, sleepwear and other get leg advice only when their chart gives an inseam (the designer
   * has then said the legs matter).
   */
  fullLength: 'legs' | 'if-chart-has-inseam' | 'none';
  /** Trousers-like: the trouser ease figures (thigh at least 1 in, SOURCES.md §4) apply. */
  hasTrouserLegs: boolean;
};

export const GARMENT_CATEGORIES: readonly GarmentCategoryDef[] = [
  { key: 'trousers', label: 'Trousers', fullLength: 'legs', hasTrouserLegs: true },
  { key: 'shorts', label: 'Shorts', fullLength: 'none', hasTrouserLegs: true },
  { key: 'skirt', label: 'Skirt', fullLength: 'none', hasTrouserLegs: false },
  { key: 'dress', label: 'Dress', fullLength: 'none', hasTrouserLegs: false },
  { key: 'top', label: 'Top', fullLength: 'none', hasTrouserLegs: false },
  { key: 'shirt', label: 'Shirt', fullLength: 'none', hasTrouserLegs: false },
  { key: 'jacket', label: 'Jacket', fullLength: 'none', hasTrouserLegs: false },
  { key: 'coat', label: 'Coat', fullLength: 'none', hasTrouserLegs: false },
  { key: 'jumpsuit', label: 'Jumpsuit', fullLength: 'legs', hasTrouserLegs: true },
  { key: 'childrens-wear', label: "Children's wear", fullLength: 'if-chart-has-inseam', hasTrouserLegs: false },
  { key: 'sleepwear', label: 'Sleepwear', fullLength: 'if-chart-has-inseam', hasTrouserLegs: false },
  { key: 'other', label: 'Other', fullLength: 'if-chart-has-inseam', hasTrouserLegs: false },
];

const CATEGORY_BY_KEY = new Map<string, GarmentCategoryDef>(GARMENT_CATEGORIES.map((c) => [c.key, c]));

export function isGarmentCategory(key: string): key is GarmentCategory {
  return CATEGORY_BY_KEY.has(key);
}

export function garmentCategoryDef(key: GarmentCategory): GarmentCategoryDef {
  const def = CATEGORY_BY_KEY.get(key);
  if (!def) throw new RangeError(`unknown garment category ${key}`);
  return def;
}

// ---------------------------------------------------------------------------------------------
// Fabric kinds

export const FABRIC_KIND_KEYS = ['woven', 'woven-stretch', 'knit'] as const;
export type FabricKind = (typeof FABRIC_KIND_KEYS)[number];

export type FabricKindDef = {
  key: FabricKind;
  label: string;
  hint: string;
  /** A knit pattern states the minimum stretch its fabric needs, as a percentage, per pattern. */
  takesMinStretchPercent: boolean;
};

export const FABRIC_KINDS: readonly FabricKindDef[] = [
  {
    key: 'woven',
    label: 'Woven, no stretch',
    hint: 'Cotton, linen, wool and the like with no elastane: the garment must be at least as big as the body.',
    takesMinStretchPercent: false,
  },
  {
    key: 'woven-stretch',
    label: 'Woven with stretch',
    hint: 'A woven with some elastane, such as stretch denim or twill: a little give, not a knit.',
    takesMinStretchPercent: false,
  },
  {
    key: 'knit',
    label: 'Knit',
    hint: 'Jersey, rib, interlock and the like: give the least stretch the pattern needs, as a percentage.',
    takesMinStretchPercent: true,
  },
];

const FABRIC_BY_KEY = new Map<string, FabricKindDef>(FABRIC_KINDS.map((f) => [f.key, f]));

export function isFabricKind(key: string): key is FabricKind {
  return FABRIC_BY_KEY.has(key);
}

export function fabricKindDef(key: FabricKind): FabricKindDef {
  const def = FABRIC_BY_KEY.get(key);
  if (!def) throw new RangeError(`unknown fabric kind ${key}`);
  return def;
}

// ---------------------------------------------------------------------------------------------
// Finished-garment measurements

export const FINISHED_MEASUREMENT_KEYS = [
  'bust',
  'under_bust',
  'waist',
  'high_hip',
  'hip',
  'thigh',
  'knee',
  'calf',
  'hem_width',
  'upper_arm',
  'shoulder_width',
  'front_rise',
  'back_rise',
  'crotch_length',
  'inseam',
  'outseam',
  'sleeve_length',
  'length',
] as const;
export type FinishedMeasurementKey = (typeof FINISHED_MEASUREMENT_KEYS)[number];

export type FinishedMeasurementDef = {
  key: FinishedMeasurementKey;
  label: string;
  hint: string;
  /**
   * The body measurement it is compared with for ease (finished − body, SOURCES.md §4), or null
   * when the body has no counterpart (a hem, a sleeve, a front rise on its own).
   */
  bodyKey: MeasurementKey | null;
  /**
   * girth: all the way round the garment, so ease below zero means it is smaller than the body.
   * length: along or across the garment (lengths, rises, shoulder span), where finished shorter than
   * the body is a design choice (cropped trousers, a narrow shoulder), never a warning by itself.
   */
  kind: 'girth' | 'length';
};

/*
 * Girths are taken all the way round, never flat (a flat half-width of 20 in is a 40 in girth): the
 * comparison with a body girth only makes sense that way. Total crotch length is compared with the
 * body's total crotch length; trouser extras of about +1 in there are quoted in SOURCES.md §4
 * (winmichele.wordpress.com, 2019). Front and back rise on their own have no body counterpart in
 * our vocabulary (the body is measured through the legs in one piece, Brenne 2020, SOURCES.md §1).
 */
export const FINISHED_MEASUREMENTS: readonly FinishedMeasurementDef[] = [
  { key: 'bust', label: 'Bust', hint: 'All the way round the garment at the bust line.', bodyKey: 'bust', kind: 'girth' },
  { key: 'under_bust', label: 'Under bust', hint: 'All the way round just below the bust.', bodyKey: 'under_bust', kind: 'girth' },
  { key: 'waist', label: 'Waist', hint: 'All the way round the waist, closed as worn (an elastic waist fully stretched).', bodyKey: 'waist', kind: 'girth' },
  { key: 'high_hip', label: 'High hip', hint: 'All the way round about 8 cm (3 in) below the waist.', bodyKey: 'high_hip', kind: 'girth' },
  { key: 'hip', label: 'Hip', hint: 'All the way round at the fullest part of the seat.', bodyKey: 'hip', kind: 'girth' },
  { key: 'thigh', label: 'Thigh', hint: 'All the way round one leg, just below the crotch.', bodyKey: 'thigh', kind: 'girth' },
  { key: 'knee', label: 'Knee', hint: 'All the way round one leg at the knee line.', bodyKey: 'knee', kind: 'girth' },
  { key: 'calf', label: 'Calf', hint: 'All the way round one leg at the calf.', bodyKey: 'calf', kind: 'girth' },
  { key: 'hem_width', label: 'Hem width', hint: 'All the way round the hem or leg opening.', bodyKey: null, kind: 'girth' },
  { key: 'upper_arm', label: 'Upper arm', hint: 'All the way round the sleeve at the underarm.', bodyKey: 'upper_arm', kind: 'girth' },
  { key: 'shoulder_width', label: 'Shoulder width', hint: 'Across the back from one shoulder seam to the other.', bodyKey: 'shoulder_width', kind: 'length' },
  { key: 'front_rise', label: 'Front rise', hint: 'Along the front crotch seam, waist to crotch point.', bodyKey: null, kind: 'length' },
  { key: 'back_rise', label: 'Back rise', hint: 'Along the back crotch seam, waist to crotch point.', bodyKey: null, kind: 'length' },
  { key: 'crotch_length', label: 'Crotch length', hint: 'Front and back rise together, front waist to back waist.', bodyKey: 'total_crotch_length', kind: 'length' },
  { key: 'inseam', label: 'Inseam', hint: 'Along the inside leg seam, crotch to hem.', bodyKey: 'inseam', kind: 'length' },
  { key: 'outseam', label: 'Outseam', hint: 'Along the side, waist to hem.', bodyKey: 'outseam', kind: 'length' },
  { key: 'sleeve_length', label: 'Sleeve length', hint: 'Shoulder point to the sleeve hem.', bodyKey: null, kind: 'length' },
  { key: 'length', label: 'Length', hint: 'Centre back, neck to hem (waist to hem for trousers and skirts).', bodyKey: null, kind: 'length' },
];

const FINISHED_BY_KEY = new Map<string, FinishedMeasurementDef>(FINISHED_MEASUREMENTS.map((m) => [m.key, m]));

export function isFinishedMeasurementKey(key: string): key is FinishedMeasurementKey {
  return FINISHED_BY_KEY.has(key);
}

export function finishedMeasurementDef(key: FinishedMeasurementKey): FinishedMeasurementDef {
  const def = FINISHED_BY_KEY.get(key);
  if (!def) throw new RangeError(`unknown finished measurement ${key}`);
  return def;
}

// ---------------------------------------------------------------------------------------------
// Which measurements decide the size

export type GoverningRule = {
  /** Body keys in order of preference. */
  keys: readonly MeasurementKey[];
  /**
   * first-available: the first key that both the chart and the body have decides.
   * largest-size: every key that both have is looked up and the largest size wins.
   */
  mode: 'first-available' | 'largest-size';
  /** One sentence for the reasons, e.g. "Trousers are sized by the hip, then the waist". */
  explanation: string;
};

/*
 * Decisions, with their grounds:
 *
 * - Trousers, shorts, skirts: the hip, then the waist (DESIGN.md "The computation" §1). The hip
 *   cannot be taken in or let out much without redrawing the crotch and side seams; the waist is
 *   easy to adjust at the side seams, darts and centre back (the waist/hip rows of SOURCES.md §3).
 *
 * - Tops, shirts, dresses, jackets, coats: the high bust where both the chart and the body have it,
 *   else the bust. The high bust measures the frame (shoulders, neck, upper chest), which is hard
 *   to alter, while the full bust adds the cup, which a cup variant or a full/small bust adjustment
 *   handles (SOURCES.md §3 "fba"; patterns are commonly drafted for a B cup [MEM]). Choosing by the
 *   full bust puts a full-busted tester in a size too big at the shoulders and neck [CP]. Dresses are
 *   sized from the top because the bodice is the hard part to alter; the waist and hip then show as a
 *   blend [CP].
 *
 * - Jumpsuits: the larger of the sizes the hip and the bust point at, because a one-piece garment
 *   cannot be let out at one end without the other, and too small in either is unwearable [CP].
 *
 * - Children's wear: height, then chest (our vocabulary records a child's chest under `bust`).
 *   Children's sizes are named by age or height (EN 13402 designates children's sizes by body
 *   height [MEM]), and length is what a child outgrows first; a chest that points at another size
 *   then shows as a blend of widths [CP].
 *
 * - Sleepwear and other: the bust, then the hip, then the waist — whichever the chart gives first
 *   (a nightgown or pyjama top by the bust, pyjama bottoms by the hip) [CP].
 */
const GOVERNING: Record<GarmentCategory, GoverningRule> = {
  trousers: { keys: ['hip', 'waist'], mode: 'first-available', explanation: 'Trousers are sized by the hip, then the waist' },
  shorts: { keys: ['hip', 'waist'], mode: 'first-available', explanation: 'Shorts are sized by the hip, then the waist' },
  skirt: { keys: ['hip', 'waist'], mode: 'first-available', explanation: 'Skirts are sized by the hip, then the waist' },
  dress: { keys: ['high_bust', 'bust'], mode: 'first-available', explanation: 'Dresses are sized by the high bust where the chart gives it, else the bust' },
  top: { keys: ['high_bust', 'bust'], mode: 'first-available', explanation: 'Tops are sized by the high bust where the chart gives it, else the bust' },
  shirt: { keys: ['high_bust', 'bust'], mode: 'first-available', explanation: 'Shirts are sized by the high bust where the chart gives it, else the bust' },
  jacket: { keys: ['high_bust', 'bust'], mode: 'first-available', explanation: 'Jackets are sized by the high bust where the chart gives it, else the bust' },
  coat: { keys: ['high_bust', 'bust'], mode: 'first-available', explanation: 'Coats are sized by the high bust where the chart gives it, else the bust' },
  jumpsuit: { keys: ['hip', 'bust'], mode: 'largest-size', explanation: 'Jumpsuits take the larger of the sizes the hip and the bust point at' },
  'childrens-wear': { keys: ['height', 'bust'], mode: 'first-available', explanation: "Children's wear is sized by height, then chest" },
  sleepwear: { keys: ['bust', 'hip', 'waist'], mode: 'first-available', explanation: 'Sleepwear is sized by the bust, then the hip, then the waist' },
  other: { keys: ['bust', 'hip', 'waist'], mode: 'first-available', explanation: 'This garment is sized by the bust, then the hip, then the waist' },
};

export function governingRule(category: GarmentCategory): GoverningRule {
  return GOVERNING[category];
}

/** Ordered body keys that decide the size of a garment of this category (see governingRule for how). */
export function governingMeasurements(category: GarmentCategory): readonly MeasurementKey[] {
  return GOVERNING[category].keys;
}

/*
 * The girths where a tester may cut one size and blend to another (testers report the size cut
 * and any blending, SOURCES.md §7.4). Lower-body garments blend between waist and hip; garments with a bodice blend
 * between bust, waist and hip [CP]. Only those the chart gives are used.
 */
const LOWER: readonly MeasurementKey[] = ['waist', 'high_hip', 'hip'];
const WHOLE: readonly MeasurementKey[] = ['bust', 'waist', 'hip'];
const BLEND: Record<GarmentCategory, readonly MeasurementKey[]> = {
  trousers: LOWER,
  shorts: LOWER,
  skirt: LOWER,
  dress: WHOLE,
  top: WHOLE,
  shirt: WHOLE,
  jacket: WHOLE,
  coat: WHOLE,
  jumpsuit: WHOLE,
  'childrens-wear': WHOLE,
  sleepwear: WHOLE,
  other: WHOLE,
};

/** Girths that may point at other sizes than the governing one, where a blend is cut. */
export function blendMeasurements(category: GarmentCategory): readonly MeasurementKey[] {
  return BLEND[category];
}
