/**
 * What each garment category and fabric kind brings to the screens: which body and finished
 * measurements a chart of it usually has, which variants it is offered, and the examples its
 * fields show. Pure (the app bundles it). The lists are common practice [CP]: the measurements a
 * chart of such a garment is drafted from (SOURCES.md §1 for the landmarks themselves), not a
 * published table. Everything else stays available: these only decide what is offered first.
 */
import { garmentFamilies } from './alterations';
import type { FabricKind, FinishedMeasurementKey, GarmentCategory } from './garments';
import type { MeasurementKey } from './measurements';
import { formatLength, type LengthUnit } from './units';

export type VariantKind = 'fuller-belly' | 'cup' | 'other';

const BOTTOMS_BODY: readonly MeasurementKey[] = ['waist', 'high_hip', 'hip', 'thigh', 'knee', 'calf', 'inseam', 'outseam', 'crotch_depth_seated', 'total_crotch_length', 'height'];
const TOPS_BODY: readonly MeasurementKey[] = ['bust', 'high_bust', 'under_bust', 'waist', 'hip', 'back_waist_length', 'shoulder_width', 'upper_arm', 'height'];
/** A skirt has no legs or crotch seam: the waist and the hips decide it. */
const SKIRT_BODY: readonly MeasurementKey[] = ['waist', 'high_hip', 'hip', 'height'];

const BOTTOMS_FINISHED: readonly FinishedMeasurementKey[] = ['waist', 'high_hip', 'hip', 'thigh', 'knee', 'calf', 'hem_width', 'front_rise', 'back_rise', 'crotch_length', 'inseam', 'outseam', 'length'];
const TOPS_FINISHED: readonly FinishedMeasurementKey[] = ['bust', 'under_bust', 'waist', 'hip', 'hem_width', 'upper_arm', 'shoulder_width', 'sleeve_length', 'length'];
const SKIRT_FINISHED: readonly FinishedMeasurementKey[] = ['waist', 'high_hip', 'hip', 'hem_width', 'length'];

function union<T>(...lists: readonly (readonly T[])[]): T[] {
  return [...new Set(lists.flat())];
}

/** Body measurements a chart of this garment usually gives, in the order a chart lists them. */
export function bodyMeasurementsFor(category: GarmentCategory): MeasurementKey[] {
  if (category === 'skirt') return [...SKIRT_BODY];
  const families = garmentFamilies(category);
  return union(families.includes('tops') ? TOPS_BODY : [], families.includes('bottoms') ? BOTTOMS_BODY : []);
}

/** Finished-garment measurements usually given for this garment. */
export function finishedMeasurementsFor(category: GarmentCategory): FinishedMeasurementKey[] {
  if (category === 'skirt') return [...SKIRT_FINISHED];
  const families = garmentFamilies(category);
  return union(families.includes('tops') ? TOPS_FINISHED : [], families.includes('bottoms') ? BOTTOMS_FINISHED : []);
}

/**
 * The variants a garment is offered: a fuller-belly front where there is a front waist seam to
 * redraw (trousers, shorts, skirts, and garments with both halves), cup sizes where there is a
 * bodice, and always a variant of another kind.
 */
export function variantKindsFor(category: GarmentCategory): VariantKind[] {
  const families = garmentFamilies(category);
  return [...(families.includes('bottoms') ? (['fuller-belly'] as const) : []), ...(families.includes('tops') ? (['cup'] as const) : []), 'other'];
}

export const VARIANT_KIND_LABELS: Record<VariantKind, string> = { 'fuller-belly': 'Fuller belly', cup: 'Cup size', other: 'Other' };

/** Whether the fuller-belly variant (and the studio's setting for suggesting it) concerns this garment. */
export function offersFullerBelly(category: GarmentCategory): boolean {
  return variantKindsFor(category).includes('fuller-belly');
}

/** A new variant's starting name, kind and the columns it usually changes, for this garment and chart. */
export function newVariantFor(category: GarmentCategory, bodyColumns: readonly string[]): { name: string; kind: VariantKind; columns: string[] } {
  const kind = variantKindsFor(category)[0];
  if (kind === 'fuller-belly') return { name: 'Fuller belly front', kind, columns: bodyColumns.includes('waist') ? ['waist'] : [] };
  if (kind === 'cup') return { name: 'Fuller cup', kind, columns: bodyColumns.filter((c) => c === 'bust' || c === 'under_bust') };
  return { name: 'Variant', kind, columns: [] };
}

/** One sentence saying what a variant is, with examples that fit the garment. */
export function variantExplanation(category: GarmentCategory): string {
  const kinds = variantKindsFor(category);
  const examples = [kinds.includes('fuller-belly') ? 'a fuller-belly front' : null, kinds.includes('cup') ? 'a cup size' : null].filter(Boolean);
  return `A variant${examples.length ? ` (${examples.join(', ')})` : ''} replaces some body measurements in the sizes it is drafted for.`;
}

/** Examples of fabrics of this kind, for the fields where a tester names the fabric used or planned. */
export function fabricExamples(kind: FabricKind | string | null | undefined): string {
  switch (kind) {
    case 'knit':
      return 'cotton jersey, rib knit, French terry';
    case 'woven-stretch':
      return 'stretch denim, stretch twill, bengaline';
    case 'woven':
      return 'cotton twill, linen, viscose crepe';
    default:
      return 'cotton twill, linen, jersey';
  }
}

/**
 * A typical value of each body measurement, shown as a placeholder (an example of the format, never
 * an answer): an adult of middle size [CP]. Height is written in feet and inches in inch units.
 */
const TYPICAL_MM: Record<MeasurementKey, number> = {
  bust: 978,
  high_bust: 914,
  under_bust: 813,
  waist: 787,
  high_hip: 940,
  hip: 1041,
  thigh: 584,
  knee: 381,
  calf: 368,
  inseam: 762,
  outseam: 1041,
  crotch_depth_seated: 279,
  total_crotch_length: 711,
  back_waist_length: 419,
  shoulder_width: 394,
  upper_arm: 305,
  height: 1651,
};

export function measurementPlaceholder(key: MeasurementKey, unit: LengthUnit): string {
  const mm = TYPICAL_MM[key];
  if (key === 'height') return unit === 'in' ? 'e.g. 5 ft 5' : 'e.g. 165 cm';
  return `e.g. ${formatLength(mm, unit)}`;
}

/** The placeholder of a height field on its own (a pattern's drafted height, a tester's height). */
export function heightPlaceholder(unit: LengthUnit): string {
  return measurementPlaceholder('height', unit);
}
