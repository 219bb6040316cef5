/**
 * Size advice for a tester (DESIGN.md "The computation" §1; issue 4 part 5): from the tester's body
 * measurements and a pattern's size chart, the size by the measurement that governs the garment,
 * the delta of every measurement against that size, a blend note when measurements point at
 * different sizes, a variant suggestion, and the expected leg-length change. Every conclusion
 * carries its reasons in plain words with the numbers in the person's unit.
 *
 * Pure on purpose: no Node imports (the tester's screen can run it on a draft profile too).
 *
 * The size-fit rule: a body fits a size when it is within the chart value ± half the interval to
 * the neighbouring size (Simmons et al. 2004, as applied by Shin & Saeidi, JFMM 2022,
 * doi:10.1108/JFMM-09-2020-0213; tests/reference/SOURCES.md §1). Where a chart grades progressively the interval
 * differs on each side of a size, so we take half the interval to the neighbour on the side the
 * body lies; at the ends of the range, half the interval to the only neighbour. The bands of
 * neighbouring sizes then meet exactly half-way between their chart values: a body on that line
 * fits both, anywhere else exactly one (or none, beyond the ends).
 */
import {
  blendMeasurements,
  garmentCategoryDef,
  governingRule,
  type FabricKind,
  type GarmentCategory,
} from './garments';
import { MEASUREMENT_KEYS, measurementDef, type MeasurementKey } from './measurements';
import { formatLength, MM_PER_INCH, type LengthUnit } from './units';

// ---------------------------------------------------------------------------------------------
// Input and output

export type BodyMm = Partial<Record<MeasurementKey, number>>;

export type ChartSize = { id: string; label: string; bodyMm: BodyMm };

export type VariantKind = 'fuller-belly' | 'cup' | 'other';

export type ChartVariant = {
  id: string;
  name: string;
  kind: VariantKind;
  /** Per size id, the body measurements this variant replaces. */
  overrides: Record<string, BodyMm>;
};

export type SizeChart = {
  /** Ordered small → large. */
  sizes: readonly ChartSize[];
  /** The height the pattern is drafted for, or null when the designer has not said. */
  draftedHeightMm: number | null;
  variants: readonly ChartVariant[];
};

export type SizeAdviceSettings = {
  /** Studio setting: how far the waist may exceed the size's waist before the fuller-belly variant is suggested. */
  fullerBellyMarginMm: number;
};

export type SizeAdviceInput = {
  category: GarmentCategory;
  fabricKind: FabricKind;
  chart: SizeChart;
  body: BodyMm;
  settings: SizeAdviceSettings;
  unit: LengthUnit;
};

export type SizeRef = { id: string; label: string };

export type SizeFit = 'within' | 'between' | 'below-range' | 'above-range';

/** Where one measurement of the body falls on the chart. */
export type Placement = 'within' | 'on-boundary' | 'below-range' | 'above-range';

export type SizePointer = {
  key: MeasurementKey;
  label: string;
  bodyMm: number;
  /** The size this measurement points at (on a boundary: the one the between-sizes rule picks). */
  size: SizeRef;
  placement: Placement;
};

export type BlendAdvice = {
  /** The smallest and largest of the sizes pointed at (the two sizes on a boundary). */
  fromSize: SizeRef;
  toSize: SizeRef;
  /** Governing measurement first, then the others in body order. */
  pointers: SizePointer[];
  text: string;
};

export type MeasurementDelta = {
  key: MeasurementKey;
  label: string;
  chartMm: number;
  /** Null when the tester has not given this measurement. */
  bodyMm: number | null;
  /** body − chart; null when the tester has not given it. */
  deltaMm: number | null;
  text: string;
};

export type VariantSuggestion = {
  kind: 'fuller-belly' | 'cup';
  /** Null when the pattern has no fitting variant and an alteration is suggested instead. */
  variantId: string | null;
  variantName: string | null;
  text: string;
};

export type LegLengthAdvice = {
  /** Positive: lengthen; negative: shorten (the estimate even when too small to act on). */
  changeMm: number;
  direction: 'lengthen' | 'shorten' | 'none';
  basis: 'inseam' | 'height';
  /** True for the height-based estimate. */
  rough: boolean;
  text: string;
};

export type SizeAdvice = {
  unit: LengthUnit;
  /** Null when no size can be picked; noSizeReason says why. */
  size: SizeRef | null;
  noSizeReason: string | null;
  governedBy: MeasurementKey | null;
  fit: SizeFit | null;
  blend: BlendAdvice | null;
  deltas: MeasurementDelta[];
  variantSuggestions: VariantSuggestion[];
  legLength: LegLengthAdvice | null;
  /** Every conclusion above, in order, in plain words. */
  reasons: string[];
};

/** The studio setting's default: 1 in (common practice; a studio changes it in its settings). */
export const DEFAULT_FULLER_BELLY_MARGIN_MM = 25.4;

/**
 * Inseam is commonly about 45 % of height in adults, so a height difference is expected to change
 * the leg by about 0.45 of it [CP: a rule of thumb, no published source; used only for the rough
 * estimate when the inseam is unknown].
 */
export const LEG_SHARE_OF_HEIGHT = 0.45;

/**
 * Below ½ in, a rough estimate from height is not worth acting on: lengthen/shorten alterations
 * commonly run ½–3 in (SOURCES.md §3, leg_length, [CP]).
 */
export const ROUGH_LEG_CHANGE_MIN_MM = 12.7;

/**
 * A full-minus-high-bust difference of about 2 in is what a pattern drafted for a B cup assumes,
 * and about 1 in more or less is one cup size (SOURCES.md §3 "fba": trigger when full − high bust
 * > 2 in on a B-cup draft [MEM]; 1 in per cup [CP]).
 */
export const ASSUMED_DRAFT_CUP_DIFF_MM = 2 * MM_PER_INCH;
export const ONE_CUP_MM = MM_PER_INCH;

/** Float noise from inch → mm conversions, far below what a tape measures. */
const EPS_MM = 1e-6;

// ---------------------------------------------------------------------------------------------
// The size-fit rule

export type ToleranceBand = { lowMm: number; highMm: number };

function isNum(x: number | null | undefined): x is number {
  return typeof x === 'number' && Number.isFinite(x);
}

/**
 * The band of bodies that fit the size at `index` for one measurement (Simmons et al. 2004, see the
 * file comment). `values` are the chart's values in size order, null where a size lacks one; sizes
 * without a value are skipped when finding neighbours. Null when the size has no value; unbounded
 * when no other size has one (nothing to take an interval from).
 */
export function toleranceBand(values: readonly (number | null)[], index: number): ToleranceBand | null {
  const v = values[index];
  if (!isNum(v)) return null;
  let prev: number | null = null;
  for (let i = index - 1; i >= 0; i--) {
    const x = values[i];
    if (isNum(x)) {
      prev = x;
      break;
    }
  }
  let next: number | null = null;
  for (let i = index + 1; i < values.length; i++) {
    const x = values[i];
    if (isNum(x)) {
      next = x;
      break;
    }
  }
  // abs(): a chart whose values fall as the size rises is a chart error (chart-checks points it
  // out); the band still has to be a band.
  const below = prev !== null ? Math.abs(v - prev) / 2 : next !== null ? Math.abs(next - v) / 2 : Infinity;
  const above = next !== null ? Math.abs(next - v) / 2 : prev !== null ? Math.abs(v - prev) / 2 : Infinity;
  return { lowMm: v - below, highMm: v + above };
}

/** Indices of the sizes whose band holds the body value (two on a boundary, none beyond the ends). */
export function sizesFitting(values: readonly (number | null)[], bodyMm: number): number[] {
  const hits: number[] = [];
  values.forEach((_, i) => {
    const band = toleranceBand(values, i);
    if (band && bodyMm >= band.lowMm - EPS_MM && bodyMm <= band.highMm + EPS_MM) hits.push(i);
  });
  return hits;
}

type Located = {
  placement: Placement;
  /** The size index the between-sizes rule picks. */
  index: number;
  /** On a boundary: the two sizes. */
  lower: number;
  upper: number;
};

/**
 * Between two sizes, the larger for a woven (with or without stretch): it can be taken in at the
 * seams, while a woven cannot be let out much. The smaller for a knit: knits are usually worn close
 * to the body or with negative ease and the fabric stretches to the larger body [CP].
 */
function pickBetween(lower: number, upper: number, fabricKind: FabricKind): number {
  return fabricKind === 'knit' ? lower : upper;
}

function betweenRule(fabricKind: FabricKind): string {
  return fabricKind === 'knit'
    ? 'Between two sizes we suggest the smaller for a knit: knits are usually worn close to the body and the fabric stretches.'
    : 'Between two sizes we suggest the larger for a woven: it can be taken in at the seams, but a woven cannot be let out much.';
}

function locate(values: readonly (number | null)[], bodyMm: number, fabricKind: FabricKind): Located | null {
  const valued = values.map((v, i) => (isNum(v) ? i : -1)).filter((i) => i >= 0);
  if (valued.length === 0) return null;
  const hits = sizesFitting(values, bodyMm);
  if (hits.length === 1) {
    const i = hits[0] as number;
    return { placement: 'within', index: i, lower: i, upper: i };
  }
  if (hits.length > 1) {
    const lower = Math.min(...hits);
    const upper = Math.max(...hits);
    return { placement: 'on-boundary', index: pickBetween(lower, upper, fabricKind), lower, upper };
  }
  const first = valued[0] as number;
  const last = valued[valued.length - 1] as number;
  const firstBand = toleranceBand(values, first) as ToleranceBand;
  const lastBand = toleranceBand(values, last) as ToleranceBand;
  if (bodyMm < firstBand.lowMm) return { placement: 'below-range', index: first, lower: first, upper: first };
  if (bodyMm > lastBand.highMm) return { placement: 'above-range', index: last, lower: last, upper: last };
  // Only a chart whose values do not rise with the size leaves a gap inside the range: take the
  // nearest chart value.
  let best = first;
  for (const i of valued) {
    if (Math.abs(bodyMm - (values[i] as number)) < Math.abs(bodyMm - (values[best] as number))) best = i;
  }
  return { placement: 'within', index: best, lower: best, upper: best };
}

// ---------------------------------------------------------------------------------------------
// Words

function labelOf(key: MeasurementKey, category: GarmentCategory): string {
  // Our vocabulary records a child's chest under `bust`; say "chest" to the parent.
  if (key === 'bust' && category === 'childrens-wear') return 'Chest';
  return measurementDef(key).label;
}

function lower(label: string): string {
  return label.charAt(0).toLowerCase() + label.slice(1);
}

function sizeName(size: SizeRef): string {
  return `size ${size.label}`;
}

function isZeroShown(mm: number, unit: LengthUnit): boolean {
  const shown = formatLength(Math.abs(mm), unit);
  return shown === '0 in' || shown === '0.0 cm';
}

/** "1/2 in more than size 12 (40 1/2 in vs 40 in)" and its kin. */
function compareWords(bodyMm: number, chartMm: number, what: string, unit: LengthUnit): string {
  const delta = bodyMm - chartMm;
  if (isZeroShown(delta, unit)) return `the same as ${what} (${formatLength(chartMm, unit)})`;
  return `${formatLength(Math.abs(delta), unit)} ${delta > 0 ? 'more' : 'less'} than ${what} (${formatLength(bodyMm, unit)} vs ${formatLength(chartMm, unit)})`;
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

function joinWith(items: readonly string[], word: 'and' | 'or'): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} ${word} ${items[items.length - 1]}`;
}

function joinAnd(items: readonly string[]): string {
  return joinWith(items, 'and');
}

// ---------------------------------------------------------------------------------------------
// The advice

function chartValues(sizes: readonly ChartSize[], key: MeasurementKey): (number | null)[] {
  return sizes.map((s) => {
    const v = s.bodyMm[key];
    return isNum(v) ? v : null;
  });
}

function chartHas(sizes: readonly ChartSize[], key: MeasurementKey): boolean {
  return sizes.some((s) => isNum(s.bodyMm[key]));
}

function ref(size: ChartSize): SizeRef {
  return { id: size.id, label: size.label };
}

/** Body order for the blend text: top to bottom, as the vocabulary lists them. */
function bodyOrder(key: MeasurementKey): number {
  return MEASUREMENT_KEYS.indexOf(key);
}

export function adviseSize(input: SizeAdviceInput): SizeAdvice {
  const { category, fabricKind, chart, body, unit } = input;
  const sizes = chart.sizes;
  const rule = governingRule(category);
  const reasons: string[] = [];
  const fmt = (mm: number) => formatLength(mm, unit);
  const label = (key: MeasurementKey) => labelOf(key, category);

  const advice: SizeAdvice = {
    unit,
    size: null,
    noSizeReason: null,
    governedBy: null,
    fit: null,
    blend: null,
    deltas: [],
    variantSuggestions: [],
    legLength: null,
    reasons,
  };

  // --- which measurement governs -------------------------------------------------------------
  const inChart = rule.keys.filter((k) => chartHas(sizes, k));
  const usable = inChart.filter((k) => isNum(body[k]));
  const keyWords = joinWith(rule.keys.map((k) => lower(label(k))), 'or');
  if (sizes.length === 0) {
    advice.noSizeReason = 'The size chart has no sizes yet, so no size can be suggested.';
  } else if (inChart.length === 0) {
    advice.noSizeReason = `${rule.explanation}, and this chart gives no ${keyWords}, so no size can be suggested: the designer needs to add one of them to the chart.`;
  } else if (usable.length === 0) {
    advice.noSizeReason = `${rule.explanation}: add your ${joinWith(inChart.map((k) => lower(label(k))), 'or')} to your measurements to get a size.`;
  }
  if (advice.noSizeReason !== null) {
    reasons.push(advice.noSizeReason);
    advice.legLength = legAdvice(input, null, reasons);
    return advice;
  }

  // Locate the body on the chart for every measurement the chart and the body share.
  const located = new Map<MeasurementKey, Located>();
  for (const key of MEASUREMENT_KEYS) {
    const b = body[key];
    if (!isNum(b) || !chartHas(sizes, key)) continue;
    const loc = locate(chartValues(sizes, key), b, fabricKind);
    if (loc) located.set(key, loc);
  }

  let governedBy: MeasurementKey;
  if (rule.mode === 'largest-size') {
    governedBy = usable[0] as MeasurementKey;
    for (const k of usable) {
      if ((located.get(k) as Located).index > (located.get(governedBy) as Located).index) governedBy = k;
    }
    const said = usable.map((k) => `your ${lower(label(k))} points at ${sizeName(ref(sizes[(located.get(k) as Located).index] as ChartSize))}`);
    reasons.push(`${rule.explanation}: ${joinAnd(said)}, so your ${lower(label(governedBy))} decides.`);
  } else {
    governedBy = usable[0] as MeasurementKey;
    const skipped = rule.keys.slice(0, rule.keys.indexOf(governedBy));
    const why = skipped.map((k) =>
      chartHas(sizes, k) ? `you have not given your ${lower(label(k))}` : `the chart gives no ${lower(label(k))}`,
    );
    reasons.push(
      why.length === 0
        ? `${rule.explanation}: your ${lower(label(governedBy))} decides.`
        : `${rule.explanation}; ${joinAnd(why)}, so your ${lower(label(governedBy))} decides.`,
    );
  }
  const gov = located.get(governedBy) as Located;
  const chosen = sizes[gov.index] as ChartSize;
  advice.governedBy = governedBy;
  advice.size = ref(chosen);

  // --- the fit of the governing measurement ---------------------------------------------------
  const govBody = body[governedBy] as number;
  const govValues = chartValues(sizes, governedBy);
  const govLabel = label(governedBy);
  const band = toleranceBand(govValues, gov.index) as ToleranceBand;
  const bandWords = (b: ToleranceBand) =>
    Number.isFinite(b.lowMm) ? `${fmt(b.lowMm)} to ${fmt(b.highMm)}` : 'any value (it is the only size with this measurement)';
  if (gov.placement === 'within') {
    reasons.push(
      `Your ${lower(govLabel)}, ${fmt(govBody)}, fits ${sizeName(advice.size)}: its chart ${lower(govLabel)} is ` +
        `${fmt(govValues[gov.index] as number)}, and a size fits from half-way to the size below to half-way to the size above ` +
        `(${bandWords(band)}).`,
    );
  } else if (gov.placement === 'on-boundary') {
    const lo = sizes[gov.lower] as ChartSize;
    const hi = sizes[gov.upper] as ChartSize;
    reasons.push(
      `Your ${lower(govLabel)}, ${fmt(govBody)}, is exactly half-way between ${sizeName(ref(lo))} ` +
        `(${fmt(govValues[gov.lower] as number)}) and ${sizeName(ref(hi))} (${fmt(govValues[gov.upper] as number)}), so both fit.`,
    );
    reasons.push(`${betweenRule(fabricKind)} So: ${sizeName(advice.size)}.`);
  } else if (gov.placement === 'below-range') {
    reasons.push(
      `Your ${lower(govLabel)}, ${fmt(govBody)}, is below the smallest size: ${sizeName(advice.size)} fits from ${fmt(band.lowMm)}. ` +
        `It is the nearest size; expect to take it in, and tell the designer.`,
    );
  } else {
    reasons.push(
      `Your ${lower(govLabel)}, ${fmt(govBody)}, is above the largest size: ${sizeName(advice.size)} fits up to ${fmt(band.highMm)}. ` +
        `It is the nearest size; expect to let it out or grade it up, and tell the designer.`,
    );
  }

  // --- blend ------------------------------------------------------------------------------------
  const pointerOf = (key: MeasurementKey): SizePointer => {
    const loc = located.get(key) as Located;
    return { key, label: label(key), bodyMm: body[key] as number, size: ref(sizes[loc.index] as ChartSize), placement: loc.placement };
  };
  // When the high bust governs, the full bust is the cup's business (cup variant or bust
  // adjustment below), not a blend.
  const others = blendMeasurements(category)
    .filter((k) => k !== governedBy && located.has(k) && !(governedBy === 'high_bust' && k === 'bust'))
    .sort((a, b) => bodyOrder(a) - bodyOrder(b))
    .map(pointerOf);
  const pointers = [pointerOf(governedBy), ...others];
  const indexOf = (p: SizePointer) => sizes.findIndex((s) => s.id === p.size.id);
  const pointed = new Set(pointers.map(indexOf));

  for (const p of others) {
    if (p.placement === 'below-range' || p.placement === 'above-range') {
      const b = toleranceBand(chartValues(sizes, p.key), indexOf(p)) as ToleranceBand;
      reasons.push(
        p.placement === 'above-range'
          ? `Your ${lower(p.label)}, ${fmt(p.bodyMm)}, is above the largest size (${sizeName(p.size)} fits up to ${fmt(b.highMm)}): expect to let out or grade up the ${lower(p.label)}.`
          : `Your ${lower(p.label)}, ${fmt(p.bodyMm)}, is below the smallest size (${sizeName(p.size)} fits from ${fmt(b.lowMm)}): expect to take in the ${lower(p.label)}.`,
      );
    }
  }

  if (pointed.size > 1) {
    const idx = [...pointed];
    const from = sizes[Math.min(...idx)] as ChartSize;
    const to = sizes[Math.max(...idx)] as ChartSize;
    // "hip says 12, waist says 14": the governing size's group first, then by size.
    const groups = new Map<number, SizePointer[]>();
    for (const p of pointers) groups.set(indexOf(p), [...(groups.get(indexOf(p)) ?? []), p]);
    const order = [gov.index, ...[...groups.keys()].filter((i) => i !== gov.index).sort((a, b) => a - b)];
    const says = order
      .map((i) => {
        const ps = groups.get(i) as SizePointer[];
        return `${joinAnd(ps.map((p) => lower(p.label)))} ${ps.length > 1 ? 'say' : 'says'} ${(sizes[i] as ChartSize).label}`;
      })
      .join(', ');
    const differing = others.filter((p) => indexOf(p) !== gov.index);
    let how: string;
    if (governedBy === 'height') {
      // A child who is tall for their girth (or stocky for their height): widths from one size,
      // lengths from the other at the lengthen/shorten lines [CP].
      const widths = joinAnd(differing.map((p) => `${p.size.label} at the ${lower(p.label)}`));
      how = `cut the width of ${widths} and keep the lengths of ${chosen.label} (lengthen/shorten lines)`;
    } else {
      const to = joinAnd(differing.map((p) => `${p.size.label} at the ${lower(p.label)}`));
      how = `blend from ${chosen.label} at the ${lower(govLabel)} to ${to}`;
    }
    const text = `${capitalise(says)}: ${how}.`;
    advice.blend = { fromSize: ref(from), toSize: ref(to), pointers, text };
    reasons.push(text);
  } else if (gov.placement === 'on-boundary') {
    const lo = sizes[gov.lower] as ChartSize;
    const hi = sizes[gov.upper] as ChartSize;
    const text = `Your ${lower(govLabel)} is between ${lo.label} and ${hi.label}: cut ${chosen.label}, or blend towards ${gov.index === gov.upper ? lo.label : hi.label} if a toile shows it is loose or tight.`;
    advice.blend = { fromSize: ref(lo), toSize: ref(hi), pointers, text };
    reasons.push(text);
  } else if (others.length > 0) {
    reasons.push(`Your ${joinAnd(others.map((p) => lower(p.label)))} also ${others.length > 1 ? 'point' : 'points'} at ${sizeName(advice.size)}: no blend needed.`);
  }

  if (gov.placement === 'below-range') advice.fit = 'below-range';
  else if (gov.placement === 'above-range') advice.fit = 'above-range';
  else if (advice.blend !== null) advice.fit = 'between';
  else advice.fit = 'within';

  // --- deltas ---------------------------------------------------------------------------------
  for (const key of MEASUREMENT_KEYS) {
    const chartMm = chosen.bodyMm[key];
    if (!isNum(chartMm)) continue;
    const b = body[key];
    const l = label(key);
    if (!isNum(b)) {
      advice.deltas.push({ key, label: l, chartMm, bodyMm: null, deltaMm: null, text: `${l}: ${sizeName(advice.size)} is ${fmt(chartMm)}; you have not given yours.` });
    } else {
      advice.deltas.push({ key, label: l, chartMm, bodyMm: b, deltaMm: b - chartMm, text: `${l}: ${compareWords(b, chartMm, sizeName(advice.size), unit)}.` });
    }
  }

  // --- variants -------------------------------------------------------------------------------
  fullerBellyAdvice(input, chosen, advice, reasons);
  cupAdvice(input, chosen, advice, reasons);

  // --- leg length -----------------------------------------------------------------------------
  advice.legLength = legAdvice(input, chosen, reasons);

  return advice;
}

function fullerBellyAdvice(input: SizeAdviceInput, chosen: ChartSize, advice: SizeAdvice, reasons: string[]): void {
  const { chart, body, settings, unit } = input;
  const fmt = (mm: number) => formatLength(mm, unit);
  const variants = chart.variants.filter((v) => v.kind === 'fuller-belly');
  const chartWaist = chosen.bodyMm.waist;
  const bodyWaist = body.waist;
  const size = sizeName(ref(chosen));
  if (!isNum(chartWaist)) {
    if (variants.length > 0) reasons.push(`The chart gives no waist for ${size}, so we cannot say whether the fuller-belly variant suits.`);
    return;
  }
  if (!isNum(bodyWaist)) {
    if (variants.length > 0) reasons.push('Add your waist to see whether the fuller-belly variant suits you.');
    return;
  }
  const over = bodyWaist - chartWaist;
  const margin = settings.fullerBellyMarginMm;
  if (!(over > margin + EPS_MM)) {
    if (variants.length > 0) {
      reasons.push(
        `Your waist is ${over > 0 ? `${fmt(over)} more than` : 'no more than'} ${size}'s, within the studio's margin of ${fmt(margin)}: the standard front should do.`,
      );
    }
    return;
  }
  const head = `Your waist is ${fmt(over)} more than ${size}'s (${fmt(bodyWaist)} vs ${fmt(chartWaist)}), more than the studio's margin of ${fmt(margin)}`;
  // Prefer a variant drawn for the chosen size.
  const variant = variants.find((v) => v.overrides[chosen.id] !== undefined) ?? variants[0];
  if (variant === undefined) {
    // Without a variant, say so only where the trade's full tummy alteration applies (front
    // crotch length and waist shaping of a lower garment, SOURCES.md §3 full_tummy); on a top or
    // dress the blend above already tells the tester to grade out at the waist.
    if (!FULL_TUMMY.has(input.category)) return;
    const text = `${head}: this pattern has no fuller-belly variant, so expect to add room at the front (a full tummy adjustment).`;
    advice.variantSuggestions.push({ kind: 'fuller-belly', variantId: null, variantName: null, text });
    reasons.push(text);
    return;
  }
  let text = `${head}: we suggest the fuller-belly variant "${variant.name}".`;
  const overWaist = variant.overrides[chosen.id]?.waist;
  if (isNum(overWaist)) {
    text += ` Its ${size} waist is ${fmt(overWaist)}; yours is ${compareWords(bodyWaist, overWaist, 'that', unit)}.`;
  } else if (variant.overrides[chosen.id] === undefined) {
    text += ` It has no values for ${size}: ask the designer how it applies.`;
  }
  advice.variantSuggestions.push({ kind: 'fuller-belly', variantId: variant.id, variantName: variant.name, text });
  reasons.push(text);
}

/** Lower garments, where a full tummy adjustment is the usual answer to a waist bigger than the size's. */
const FULL_TUMMY: ReadonlySet<GarmentCategory> = new Set<GarmentCategory>(['trousers', 'shorts', 'skirt', 'jumpsuit']);

/** Garments with a bodice, where a bust adjustment is suggested when no cup variant fits. */
const BODICE: ReadonlySet<GarmentCategory> = new Set<GarmentCategory>(['top', 'shirt', 'dress', 'jacket', 'coat', 'jumpsuit', 'sleepwear', 'other']);

/**
 * Cup rule (our decision, [MEM]/[CP] as marked on the constants): the tester's full − high bust
 * difference is compared with each option's difference at the chosen size — the standard chart's
 * (its own bust − high bust, or an assumed 2 in from a B-cup draft when the chart has no high bust)
 * and each cup variant's (its overriding bust and high bust). The nearest option wins, the standard
 * one on a tie. When the standard one wins but is a cup (1 in) or more away, a full or small bust
 * adjustment is suggested for a garment with a bodice.
 */
function cupAdvice(input: SizeAdviceInput, chosen: ChartSize, advice: SizeAdvice, reasons: string[]): void {
  const { chart, body, unit, category } = input;
  const fmt = (mm: number) => formatLength(mm, unit);
  const variants = chart.variants.filter((v) => v.kind === 'cup');
  const baseBust = chosen.bodyMm.bust;
  const baseHigh = chosen.bodyMm.high_bust;
  const size = sizeName(ref(chosen));
  if (variants.length === 0 && !BODICE.has(category)) return;
  if (!isNum(baseBust)) return;
  if (!isNum(body.bust) || !isNum(body.high_bust)) {
    if (variants.length > 0) reasons.push('Add your bust and high bust to see which cup variant suits you.');
    return;
  }
  const bodyDiff = body.bust - body.high_bust;
  const assumed = !isNum(baseHigh);
  const baseDiff = assumed ? ASSUMED_DRAFT_CUP_DIFF_MM : baseBust - baseHigh;
  type Option = { variant: ChartVariant | null; diff: number };
  const options: Option[] = [{ variant: null, diff: baseDiff }];
  for (const v of variants) {
    const o = v.overrides[chosen.id];
    if (o === undefined) continue;
    const vBust = isNum(o.bust) ? o.bust : baseBust;
    let diff: number;
    if (isNum(o.high_bust)) diff = vBust - o.high_bust;
    else if (isNum(baseHigh)) diff = vBust - baseHigh;
    // The chart has no high bust: the variant keeps the frame and adds to the full bust only.
    else diff = ASSUMED_DRAFT_CUP_DIFF_MM + (vBust - baseBust);
    options.push({ variant: v, diff });
  }
  let best = options[0] as Option;
  for (const o of options) if (Math.abs(bodyDiff - o.diff) < Math.abs(bodyDiff - best.diff) - EPS_MM) best = o;
  const baseWords = assumed
    ? `the standard ${size} assumes about ${fmt(baseDiff)} (a pattern drafted for a B cup; the chart gives no high bust)`
    : `the standard ${size} allows ${fmt(baseDiff)}`;
  const head = `Your full bust is ${fmt(bodyDiff)} more than your high bust`;
  if (best.variant !== null) {
    const text = `${head}; the cup variant "${best.variant.name}" allows ${fmt(best.diff)} at ${size}, nearer than ${baseWords}: we suggest it.`;
    advice.variantSuggestions.push({ kind: 'cup', variantId: best.variant.id, variantName: best.variant.name, text });
    reasons.push(text);
    return;
  }
  const gap = bodyDiff - baseDiff;
  if (BODICE.has(category) && Math.abs(gap) >= ONE_CUP_MM - EPS_MM) {
    const text =
      gap > 0
        ? `${head}, and ${baseWords}${variants.length > 0 ? ', with no cup variant nearer' : ''}: expect a full bust adjustment of about ${fmt(gap)} in all.`
        : `${head}, and ${baseWords}${variants.length > 0 ? ', with no cup variant nearer' : ''}: expect a small bust adjustment of about ${fmt(-gap)} in all.`;
    advice.variantSuggestions.push({ kind: 'cup', variantId: null, variantName: null, text });
    reasons.push(text);
  } else if (variants.length > 0 || BODICE.has(category)) {
    reasons.push(`${head}; ${baseWords}: the standard cup should do.`);
  }
}

function legAdvice(input: SizeAdviceInput, chosen: ChartSize | null, reasons: string[]): LegLengthAdvice | null {
  const { category, chart, body, unit } = input;
  const fmt = (mm: number) => formatLength(mm, unit);
  const def = garmentCategoryDef(category);
  const chartInseam = chart.sizes.some((s) => isNum(s.bodyMm.inseam));
  if (def.fullLength === 'none') return null;
  if (def.fullLength === 'if-chart-has-inseam' && !chartInseam) return null;

  const sizeInseam = chosen?.bodyMm.inseam;
  if (chosen !== null && isNum(sizeInseam) && isNum(body.inseam)) {
    const change = body.inseam - sizeInseam;
    const base = `your inseam is ${fmt(body.inseam)}, ${sizeName(ref(chosen))}'s is ${fmt(sizeInseam)}`;
    let advice: LegLengthAdvice;
    if (isZeroShown(change, unit)) {
      advice = { changeMm: change, direction: 'none', basis: 'inseam', rough: false, text: `No leg-length change: ${base}.` };
    } else {
      const direction = change > 0 ? 'lengthen' : 'shorten';
      advice = { changeMm: change, direction, basis: 'inseam', rough: false, text: `${capitalise(direction)} the leg by ${fmt(Math.abs(change))}: ${base}.` };
    }
    reasons.push(advice.text);
    return advice;
  }

  if (isNum(body.height) && isNum(chart.draftedHeightMm)) {
    const heightDiff = body.height - chart.draftedHeightMm;
    const change = heightDiff * LEG_SHARE_OF_HEIGHT;
    const why =
      `you are ${isZeroShown(heightDiff, unit) ? 'the height' : `${fmt(Math.abs(heightDiff))} ${heightDiff < 0 ? 'shorter than the height' : 'taller than the height'}`} ` +
      `the pattern is drafted for (${fmt(chart.draftedHeightMm)}), and the leg is commonly about ${Math.round(LEG_SHARE_OF_HEIGHT * 100)}% of height. ` +
      `This is a rough estimate from height${chartInseam ? '; your inseam would tell for sure' : ''}.`;
    let advice: LegLengthAdvice;
    if (Math.abs(change) < ROUGH_LEG_CHANGE_MIN_MM) {
      advice = { changeMm: change, direction: 'none', basis: 'height', rough: true, text: `Probably no leg-length change: ${why}` };
    } else {
      const direction = change > 0 ? 'lengthen' : 'shorten';
      advice = {
        changeMm: change,
        direction,
        basis: 'height',
        rough: true,
        text: `Expect to ${direction} the leg by roughly ${fmt(Math.abs(change))}: ${why}`,
      };
    }
    reasons.push(advice.text);
    return advice;
  }

  if (!chartInseam && !isNum(chart.draftedHeightMm)) {
    reasons.push('The chart gives neither an inseam nor the height it is drafted for, so we cannot estimate the leg length.');
  } else if (chartInseam) {
    reasons.push(`Add your inseam${isNum(chart.draftedHeightMm) ? ' (or at least your height)' : ''} to see how much to lengthen or shorten the leg.`);
  } else {
    reasons.push('Add your height to get a rough leg-length estimate (the chart gives no inseam).');
  }
  return null;
}
