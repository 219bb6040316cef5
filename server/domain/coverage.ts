/**
 * Coverage of a trial and the automatic selection of its testers (DESIGN.md "The computation" §2;
 * issue 5 parts 3, 4 and 7): a grid of sizes × height bands (× variants) with the applicants and
 * the selected testers counted against the targets, a proposal that fills the emptiest places
 * first, and the best waitlisted applicant to offer a freed place to. Every pick and every
 * leave-out carries its reason in plain words.
 *
 * Pure on purpose: no Node imports, because the app bundles server/domain (the applicants screen
 * draws the grid from the same function the server uses to check a selection).
 *
 * Markers as in tests/reference/SOURCES.md: [CP] is common practice with no source.
 *
 * The model of the targets (the issue says "testers per size, height bands"):
 * - A target is set per size only: it is the size's capacity, never exceeded by a proposal.
 * - Height bands and variants carry no targets of their own. Instead the selection spreads each
 *   size's places over them: first at least one tester in every band where someone of that band
 *   applied, then at least one in every variant (when the trial has a variant axis), then evenly
 *   over the size × band × variant cells. Why: with 2–3 testers per size [CP] a per-band target
 *   would be 0 or 1 anyway, and a fixed band target cannot be met when nobody of that height
 *   applies; "cover every band that has applicants" is what the designer wants from the band
 *   axis (SOURCES.md §7.4: testers "across heights and shapes") and needs no extra settings.
 * - Band limits are lower-inclusive and upper-exclusive (petite < 160 cm, regular 160 cm up to
 *   172 cm, tall 172 cm and over), so contiguous bands never overlap.
 * - An applicant without a height (or with one outside every band) sits in a "height not given"
 *   column; they fill a size's place like anyone else but never count as covering a band.
 * - With a variant axis, an applicant without a variant (or with one the trial does not list)
 *   sews the pattern as drafted: the "no variant" column, which is covered like any variant.
 */
import { formatLength, type LengthUnit } from './units';

// ---------------------------------------------------------------------------------------------
// Input

export const APPLICATION_STATUSES = [
  'applied',
  'shortlisted',
  'selected',
  'waitlisted',
  'declined',
  'withdrawn',
] as const;
export type ApplicationStatus = (typeof APPLICATION_STATUSES)[number];

/** A size the trial wants and how many testers it wants in it (its capacity). */
export type SizeTarget = { id: string; label: string; target: number };

/** A height band; a null limit is open on that side. minMm is inclusive, maxMm exclusive. */
export type HeightBand = { id: string; label: string; minMm: number | null; maxMm: number | null };

export type TrialVariant = { id: string; name: string };

export type CoverageTargets = {
  /** Ordered small → large, as the size chart orders them. */
  sizes: readonly SizeTarget[];
  /** Ordered short → tall, contiguous (see heightBandProblems). Empty = no band axis. */
  heightBands: readonly HeightBand[];
  /** Empty = no variant axis. */
  variants: readonly TrialVariant[];
};

/** An applicant's record in the studio's past trials. */
export type ReliabilityRecord = { finishedOnTime: number; enrolled: number };

export type Applicant = {
  id: string;
  /** ISO 8601 time of the application. */
  appliedAt: string;
  status: ApplicationStatus;
  sizeId: string | null;
  variantId: string | null;
  heightMm: number | null;
  reliability: ReliabilityRecord;
};

/** The Beta prior of reliability, as a mean and a strength in pseudo-trials. */
export type ReliabilityPrior = { mean: number; strength: number };

export type CoverageOptions = {
  /** Unit for heights in the words of reasons and gaps; centimetres unless the viewer prefers inches. */
  unit?: LengthUnit;
  /** Share of extra applicants to aim for per size, for drop-outs. Default COMMON_OVER_RECRUIT_RATE. */
  overRecruitRate?: number;
};

export type SelectionOptions = CoverageOptions & {
  /**
   * The studio's reliability prior. Pass studioReliabilityPrior() over all the studio's past
   * enrollments; without it the prior is pooled from the records of these applicants.
   */
  prior?: ReliabilityPrior;
  /** Stop after this many new picks (the emptiest places are filled first). Default: no limit. */
  maxNewPicks?: number;
};

// ---------------------------------------------------------------------------------------------
// Common practice and defaults

/** Testers per size the trade commonly aims for: 2–3 [CP] (SOURCES.md §7.4). A default, not a rule. */
export const COMMON_TESTERS_PER_SIZE = 3;

/** Over-recruit about 20–30 % for drop-outs [CP] (SOURCES.md §7.4); we take the middle. */
export const COMMON_OVER_RECRUIT_RATE = 0.25;

/**
 * Starting limits for a new trial, for the designer to edit per pattern: petite under 160 cm,
 * regular 160 cm up to 172 cm, tall from 172 cm. Invented round numbers, not from a standard.
 */
export const DEFAULT_HEIGHT_BANDS: readonly HeightBand[] = [
  { id: 'petite', label: 'Petite', minMm: null, maxMm: 1600 },
  { id: 'regular', label: 'Regular', minMm: 1600, maxMm: 1720 },
  { id: 'tall', label: 'Tall', minMm: 1720, maxMm: null },
];

export const NO_BAND_LABEL = 'Height not given';
export const NO_VARIANT_LABEL = 'No variant';

// ---------------------------------------------------------------------------------------------
// Statuses, bands

/** Withdrawn and declined applicants take no part in counts or selection. */
export function isActiveStatus(status: ApplicationStatus): boolean {
  return status !== 'withdrawn' && status !== 'declined';
}

/** The band a height falls in (lower limit inclusive, upper exclusive), or null. First match wins. */
export function bandOf(heightMm: number | null, bands: readonly HeightBand[]): HeightBand | null {
  if (heightMm == null || !Number.isFinite(heightMm)) return null;
  for (const band of bands) {
    if ((band.minMm == null || heightMm >= band.minMm) && (band.maxMm == null || heightMm < band.maxMm)) {
      return band;
    }
  }
  return null;
}

/** A band's limits in words, e.g. "under 160.0 cm", "160.0 cm up to 172.0 cm", "172.0 cm and over". */
export function describeBand(band: HeightBand, unit: LengthUnit = 'cm'): string {
  const { minMm, maxMm } = band;
  if (minMm == null && maxMm == null) return 'any height';
  if (minMm == null) return `under ${formatLength(maxMm as number, unit)}`;
  if (maxMm == null) return `${formatLength(minMm, unit)} and over`;
  return `${formatLength(minMm, unit)} up to ${formatLength(maxMm, unit)}`;
}

/**
 * What is wrong with a set of band limits as the designer edited them, in plain words; empty when
 * they are fine. Gaps and overlaps matter because a height in a gap belongs to no band and a height
 * in an overlap would be counted in the first band only.
 */
export function heightBandProblems(bands: readonly HeightBand[], unit: LengthUnit = 'cm'): string[] {
  const problems: string[] = [];
  const seen = new Set<string>();
  bands.forEach((band, i) => {
    if (seen.has(band.id)) problems.push(`Band "${band.label}" appears twice.`);
    seen.add(band.id);
    if (band.label.trim() === '') problems.push(`Band ${i + 1} needs a name.`);
    if (band.minMm != null && band.maxMm != null && band.minMm >= band.maxMm) {
      problems.push(`Band "${band.label}" starts at or above where it ends.`);
    }
    if (i > 0 && band.minMm == null) problems.push(`Only the first band may be open below; "${band.label}" is.`);
    if (i < bands.length - 1 && band.maxMm == null) {
      problems.push(`Only the last band may be open above; "${band.label}" is.`);
    }
    const next = bands[i + 1];
    if (next && band.maxMm != null && next.minMm != null && band.maxMm !== next.minMm) {
      problems.push(
        band.maxMm < next.minMm
          ? `Heights from ${formatLength(band.maxMm, unit)} up to ${formatLength(next.minMm, unit)} fall in no band ("${band.label}" ends before "${next.label}" starts).`
          : `"${band.label}" and "${next.label}" overlap: "${next.label}" should start where "${band.label}" ends.`,
      );
    }
  });
  return problems;
}

// ---------------------------------------------------------------------------------------------
// Reliability

/**
 * Strength of the prior in pseudo-trials. Two: one record of three to five trials already outweighs
 * it, yet a single trial cannot swing a score to 0 or 1 (1 of 1 on time with a 0.8 prior scores
 * (1 + 1.6) / 3 = 0.87, not 1).
 */
export const DEFAULT_PRIOR_STRENGTH = 2;

/** Laplace's rule of succession, (k + 1) / (n + 2): the prior when a studio has no history yet. */
export const NEUTRAL_PRIOR: ReliabilityPrior = { mean: 0.5, strength: DEFAULT_PRIOR_STRENGTH };

/**
 * The studio's prior: its pooled on-time rate over past enrollments, with DEFAULT_PRIOR_STRENGTH.
 * Shrinking towards the studio's own rate (empirical Bayes) is what makes a newcomer "neither
 * favoured nor punished": a newcomer scores exactly the studio's average tester. With no history at
 * all the neutral prior (0.5) applies.
 */
export function studioReliabilityPrior(
  records: readonly ReliabilityRecord[],
  strength: number = DEFAULT_PRIOR_STRENGTH,
): ReliabilityPrior {
  let k = 0;
  let n = 0;
  for (const r of records) {
    const c = cleanRecord(r);
    k += c.finishedOnTime;
    n += c.enrolled;
  }
  return { mean: n > 0 ? k / n : NEUTRAL_PRIOR.mean, strength };
}

/**
 * Smoothed share of past trials finished on time: the posterior mean of a Beta(a, b) prior with
 * a = mean × strength and b = (1 − mean) × strength, i.e. (k + a) / (n + a + b). A newcomer (n = 0)
 * scores exactly the prior mean; each further on-time finish raises the score.
 * Counts are cleaned rather than refused (negative → 0, finished capped at enrolled) because they
 * are computed from stored enrollments, and a screen must never fail on them.
 */
export function reliabilityScore(record: ReliabilityRecord, prior: ReliabilityPrior = NEUTRAL_PRIOR): number {
  const { finishedOnTime: k, enrolled: n } = cleanRecord(record);
  const mean = Math.min(1, Math.max(0, prior.mean));
  const strength = Math.max(0, prior.strength);
  if (n + strength === 0) return mean;
  return (k + mean * strength) / (n + strength);
}

/** "reliability 0.82 (4 of 5 past trials finished on time)" — the words every reason uses. */
export function describeReliability(record: ReliabilityRecord, prior: ReliabilityPrior = NEUTRAL_PRIOR): string {
  const score = reliabilityScore(record, prior);
  const { finishedOnTime: k, enrolled: n } = cleanRecord(record);
  if (n === 0) return `reliability ${score.toFixed(2)} (no past trials with the studio: scored at the studio average)`;
  return `reliability ${score.toFixed(2)} (${k} of ${n} past trial${n === 1 ? '' : 's'} finished on time)`;
}

function cleanRecord(r: ReliabilityRecord): ReliabilityRecord {
  const enrolled = Number.isFinite(r.enrolled) ? Math.max(0, Math.floor(r.enrolled)) : 0;
  const finished = Number.isFinite(r.finishedOnTime) ? Math.max(0, Math.floor(r.finishedOnTime)) : 0;
  return { finishedOnTime: Math.min(finished, enrolled), enrolled };
}

// ---------------------------------------------------------------------------------------------
// The grid

export type CellState =
  /** Nobody (active) applied in this cell: a recruiting gap. */
  | 'no-applicants'
  /** Applicants, but nobody selected yet: a gap the selection can fill. */
  | 'open'
  | 'covered';

export type SizeState = 'empty' | 'short' | 'full' | 'over';

export type CellCounts = {
  /** Active applicants: every status but withdrawn and declined (selected included). */
  applicants: number;
  /** Of them, still in status "applied" (not yet reviewed). */
  pending: number;
  shortlisted: number;
  selected: number;
  waitlisted: number;
  /** The active applicants' ids, sorted. */
  applicantIds: string[];
};

export type VariantCell = CellCounts & { variantId: string | null; label: string; state: CellState };

export type BandCell = CellCounts & {
  bandId: string | null;
  label: string;
  state: CellState;
  /** One per grid variant column; empty when the trial has no variant axis. */
  variants: VariantCell[];
};

export type SizeRow = CellCounts & {
  sizeId: string;
  label: string;
  target: number;
  /** Places still open: max(0, target − selected). */
  remaining: number;
  /** Selected beyond the target (only when stored data were over-filled). */
  over: number;
  /** selected / target (1 when the target is 0). */
  fill: number;
  state: SizeState;
  /** Applicants to aim for, with the over-recruit reserve: ceil(target × (1 + rate)). */
  applicantsWanted: number;
  /** How many more applicants would reach applicantsWanted. */
  recruitMore: number;
  /** One per grid band column, in order. */
  bands: BandCell[];
  /** The row's gaps in plain words ("No one selected yet in the tall band (2 applicants)"). */
  gaps: string[];
  /** One line for a collapsed phone row: "2 of 3 selected · 5 applicants · tall band not covered". */
  summary: string;
};

export type GridColumn = { id: string | null; label: string };

export type CoverageGrid = {
  /** Band columns: the trial's bands, plus "Height not given" (id null) when anyone needs it. */
  bands: GridColumn[];
  /** Variant columns: empty without a variant axis; else "No variant" (id null) when needed, then the variants. */
  variants: GridColumn[];
  rows: SizeRow[];
  /** Column totals over all wanted sizes. */
  bandTotals: (CellCounts & { bandId: string | null; label: string })[];
  variantTotals: (CellCounts & { variantId: string | null; label: string })[];
  totals: CellCounts & { target: number; remaining: number; over: number };
  /** Active applicants without a size this trial wants (no size, or one not in the targets). */
  unplaced: CellCounts;
};

/** The grid of sizes × height bands (× variants), with counts against the targets. */
export function coverageGrid(
  targets: CoverageTargets,
  applicants: readonly Applicant[],
  options: CoverageOptions = {},
): CoverageGrid {
  const rate = options.overRecruitRate ?? COMMON_OVER_RECRUIT_RATE;
  const placed = applicants.map((a) => place(a, targets));
  const active = placed.filter((p) => isActiveStatus(p.a.status));
  const inSize = active.filter((p) => p.size != null);

  const bands: GridColumn[] = targets.heightBands.map((b) => ({ id: b.id, label: b.label }));
  if (inSize.some((p) => p.band == null)) bands.push({ id: null, label: NO_BAND_LABEL });
  const variants: GridColumn[] = [];
  if (targets.variants.length > 0) {
    if (inSize.some((p) => p.variantId == null)) variants.push({ id: null, label: NO_VARIANT_LABEL });
    for (const v of targets.variants) variants.push({ id: v.id, label: v.name });
  }

  const rows: SizeRow[] = targets.sizes.map((size) => {
    const mine = inSize.filter((p) => p.size?.id === size.id);
    const target = cleanTarget(size.target);
    const bandCells: BandCell[] = bands.map((col) => {
      const inBand = mine.filter((p) => (p.band?.id ?? null) === col.id);
      const variantCells: VariantCell[] = variants.map((v) => {
        const c = countOf(inBand.filter((p) => p.variantId === v.id));
        return { ...c, variantId: v.id, label: v.label, state: cellState(c) };
      });
      const c = countOf(inBand);
      return { ...c, bandId: col.id, label: col.label, state: cellState(c), variants: variantCells };
    });
    const c = countOf(mine);
    const applicantsWanted = Math.ceil(target * (1 + rate) - 1e-9);
    const row: SizeRow = {
      ...c,
      sizeId: size.id,
      label: size.label,
      target,
      remaining: Math.max(0, target - c.selected),
      over: Math.max(0, c.selected - target),
      fill: target > 0 ? c.selected / target : 1,
      state: sizeState(c.selected, target),
      applicantsWanted,
      recruitMore: Math.max(0, applicantsWanted - c.applicants),
      bands: bandCells,
      gaps: [],
      summary: '',
    };
    row.gaps = rowGaps(row, variants.length > 0);
    row.summary = rowSummary(row);
    return row;
  });

  const bandTotals = bands.map((col) => ({
    ...countOf(inSize.filter((p) => (p.band?.id ?? null) === col.id)),
    bandId: col.id,
    label: col.label,
  }));
  const variantTotals = variants.map((v) => ({
    ...countOf(inSize.filter((p) => p.variantId === v.id)),
    variantId: v.id,
    label: v.label,
  }));
  const totals = {
    ...countOf(inSize),
    target: rows.reduce((s, r) => s + r.target, 0),
    remaining: rows.reduce((s, r) => s + r.remaining, 0),
    over: rows.reduce((s, r) => s + r.over, 0),
  };
  return { bands, variants, rows, bandTotals, variantTotals, totals, unplaced: countOf(active.filter((p) => p.size == null)) };
}

function countOf(list: readonly Placed[]): CellCounts {
  const c: CellCounts = { applicants: 0, pending: 0, shortlisted: 0, selected: 0, waitlisted: 0, applicantIds: [] };
  for (const p of list) {
    if (!isActiveStatus(p.a.status)) continue;
    c.applicants += 1;
    if (p.a.status === 'applied') c.pending += 1;
    if (p.a.status === 'shortlisted') c.shortlisted += 1;
    if (p.a.status === 'selected') c.selected += 1;
    if (p.a.status === 'waitlisted') c.waitlisted += 1;
    c.applicantIds.push(p.a.id);
  }
  c.applicantIds.sort(compareIds);
  return c;
}

function cellState(c: CellCounts): CellState {
  if (c.selected > 0) return 'covered';
  return c.applicants > 0 ? 'open' : 'no-applicants';
}

function sizeState(selected: number, target: number): SizeState {
  if (selected > target) return 'over';
  if (selected === target) return 'full';
  return selected === 0 ? 'empty' : 'short';
}

function rowGaps(row: SizeRow, hasVariants: boolean): string[] {
  const gaps: string[] = [];
  if (row.over > 0) gaps.push(`Over the target: ${row.selected} selected for ${row.target} places.`);
  if (row.remaining > 0) {
    gaps.push(`${row.remaining} of ${row.target} place${row.target === 1 ? '' : 's'} still open.`);
  }
  for (const band of row.bands) {
    if (band.bandId == null) continue; // "height not given" is no band to cover
    if (band.state === 'open') {
      gaps.push(`No one selected yet in the ${band.label} band (${plural(band.applicants, 'applicant')}).`);
    } else if (band.state === 'no-applicants') {
      gaps.push(`No applicants in the ${band.label} band.`);
    }
  }
  if (hasVariants) {
    // A variant is covered in a size when any band has someone selected in it.
    const variantIds = row.bands[0]?.variants.map((v) => v.variantId) ?? [];
    for (const id of variantIds) {
      const cells = row.bands.map((b) => b.variants.find((v) => v.variantId === id)).filter((v) => v != null);
      const applied = cells.reduce((s, v) => s + v.applicants, 0);
      const selected = cells.reduce((s, v) => s + v.selected, 0);
      const label = id == null ? 'the pattern without a variant' : (cells[0]?.label ?? id);
      if (applied > 0 && selected === 0) gaps.push(`No one selected yet for ${label} (${plural(applied, 'applicant')}).`);
      if (applied === 0 && id != null) gaps.push(`No applicants for ${label}.`);
    }
  }
  if (row.recruitMore > 0) {
    gaps.push(
      `${plural(row.applicants, 'applicant')}: aim for ${row.applicantsWanted} to allow for drop-outs (common practice: over-recruit 20–30 %).`,
    );
  }
  return gaps;
}

function rowSummary(row: SizeRow): string {
  const parts = [`${row.selected} of ${row.target} selected`, plural(row.applicants, 'applicant')];
  const uncovered = row.bands.filter((b) => b.bandId != null && b.state !== 'covered').map((b) => b.label);
  if (uncovered.length > 0) parts.push(`not covered: ${uncovered.join(', ')}`);
  return parts.join(' · ');
}

function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

// ---------------------------------------------------------------------------------------------
// Placing applicants in the grid

type Placed = {
  a: Applicant;
  size: SizeTarget | null;
  sizeIndex: number;
  band: HeightBand | null;
  bandIndex: number;
  variantId: string | null;
  variantIndex: number;
};

function place(a: Applicant, targets: CoverageTargets): Placed {
  const sizeIndex = a.sizeId == null ? -1 : targets.sizes.findIndex((s) => s.id === a.sizeId);
  const band = bandOf(a.heightMm, targets.heightBands);
  const variantIndex = a.variantId == null ? -1 : targets.variants.findIndex((v) => v.id === a.variantId);
  return {
    a,
    size: sizeIndex >= 0 ? (targets.sizes[sizeIndex] as SizeTarget) : null,
    sizeIndex: sizeIndex >= 0 ? sizeIndex : targets.sizes.length,
    band,
    // "Height not given" sorts after the trial's bands; "no variant" before the variants.
    bandIndex: band ? targets.heightBands.indexOf(band) : targets.heightBands.length,
    variantId: variantIndex >= 0 ? (targets.variants[variantIndex] as TrialVariant).id : null,
    variantIndex,
  };
}

/** A target is the designer's count of places; anything but a whole number ≥ 0 is read as one. */
function cleanTarget(target: number): number {
  return Number.isFinite(target) ? Math.max(0, Math.floor(target)) : 0;
}

/** Plain code-unit order: the same on every machine and locale, unlike localeCompare. */
function compareIds(x: string, y: string): number {
  return x < y ? -1 : x > y ? 1 : 0;
}

// ---------------------------------------------------------------------------------------------
// Order of preference

/** Where two candidates first differ, best first: the tier that decided between them. */
type Tier = 'band' | 'variant' | 'cell' | 'reliability' | 'time' | 'id';

type Key = {
  /** 0 when this candidate would be the first selected in their band in this size. */
  newBand: number;
  /** 0 when they would be the first in their variant in this size (variant axis only). */
  newVariant: number;
  /** Already selected in their size × band × variant cell. */
  cellCount: number;
  score: number;
  /** The score rounded to 9 decimals, so float noise never decides. */
  scoreKey: number;
  time: number;
  id: string;
};

/** Who is selected in one size so far, by band, variant and cell. */
class SizeTally {
  selected = 0;
  private readonly bands = new Map<string, number>();
  private readonly variants = new Map<string, number>();
  private readonly cells = new Map<string, number>();

  add(p: Placed): void {
    this.selected += 1;
    if (p.band) bump(this.bands, p.band.id);
    bump(this.variants, variantKey(p.variantId));
    bump(this.cells, cellKey(p));
  }

  keyOf(p: Placed, hasVariants: boolean, prior: ReliabilityPrior): Key {
    const score = reliabilityScore(p.a.reliability, prior);
    const t = Date.parse(p.a.appliedAt);
    return {
      newBand: p.band && !this.bands.get(p.band.id) ? 0 : 1,
      newVariant: hasVariants && !this.variants.get(variantKey(p.variantId)) ? 0 : 1,
      cellCount: this.cells.get(cellKey(p)) ?? 0,
      score,
      scoreKey: Math.round(score * 1e9),
      // An unreadable time sorts last: it cannot claim to be early.
      time: Number.isFinite(t) ? t : Number.POSITIVE_INFINITY,
      id: p.a.id,
    };
  }

  bandCount(bandId: string): number {
    return this.bands.get(bandId) ?? 0;
  }
}

function bump(map: Map<string, number>, key: string): void {
  map.set(key, (map.get(key) ?? 0) + 1);
}
function variantKey(id: string | null): string {
  return JSON.stringify(id);
}
function cellKey(p: Placed): string {
  return JSON.stringify([p.band?.id ?? null, p.variantId]);
}

/** Negative when x is preferred, with the tier that decided. */
function compareKeys(x: Key, y: Key): { order: number; tier: Tier } {
  if (x.newBand !== y.newBand) return { order: x.newBand - y.newBand, tier: 'band' };
  if (x.newVariant !== y.newVariant) return { order: x.newVariant - y.newVariant, tier: 'variant' };
  if (x.cellCount !== y.cellCount) return { order: x.cellCount - y.cellCount, tier: 'cell' };
  if (x.scoreKey !== y.scoreKey) return { order: y.scoreKey - x.scoreKey, tier: 'reliability' };
  if (x.time !== y.time) return { order: x.time < y.time ? -1 : 1, tier: 'time' };
  return { order: compareIds(x.id, y.id), tier: 'id' };
}

type Ranked = { p: Placed; key: Key };

function rank(candidates: readonly Placed[], tally: SizeTally, hasVariants: boolean, prior: ReliabilityPrior): Ranked[] {
  return candidates
    .map((p) => ({ p, key: tally.keyOf(p, hasVariants, prior) }))
    .sort((x, y) => compareKeys(x.key, y.key).order);
}

// ---------------------------------------------------------------------------------------------
// The proposal

export type SelectionPick = {
  applicantId: string;
  /** Null only for an already-selected applicant whose size the trial does not want (kept all the same). */
  sizeId: string | null;
  bandId: string | null;
  variantId: string | null;
  /** kept = already selected before the proposal (stays selected); new = proposed now. */
  kind: 'kept' | 'new';
  /** 1, 2, … in the order the new picks were made (emptiest first); 0 for kept. */
  order: number;
  reliability: number;
  reason: string;
};

export type LeftOutCause =
  | 'withdrawn'
  | 'declined'
  | 'no-size'
  | 'size-not-wanted'
  /** The size filled up during this proposal. */
  | 'size-full'
  /** The size was full before this proposal (already-selected testers). */
  | 'size-already-full'
  /** options.maxNewPicks was reached while the size still had places. */
  | 'limit-reached';

export type SelectionLeftOut = {
  applicantId: string;
  sizeId: string | null;
  bandId: string | null;
  variantId: string | null;
  cause: LeftOutCause;
  /**
   * For the size-full, size-already-full and limit-reached causes: 1, 2, … within the applicant's
   * size × band × variant cell, the order in which to offer them a freed place. Null otherwise.
   */
  waitlistRank: number | null;
  reliability: number;
  reason: string;
};

export type SelectionProposal = {
  picks: SelectionPick[];
  leftOut: SelectionLeftOut[];
  /** The grid as it would be with every pick selected. */
  gridAfter: CoverageGrid;
  /** The prior the reliability scores were computed with. */
  prior: ReliabilityPrior;
};

/**
 * Proposes testers to select. Per step it takes the size with the largest relative shortfall
 * ((target − selected) / target) and in it the best candidate by, in turn: covers a band with
 * nobody selected yet, covers a variant with nobody selected yet, fewest already in their cell,
 * reliability, earlier application, and finally the id (so the result never depends on input
 * order). Already-selected applicants stay selected and use up places; withdrawn and declined ones
 * are never picked; a size never receives more new picks than it has open places.
 *
 * Applicants in status applied, shortlisted and waitlisted are all candidates on equal terms: the
 * shortlist is the designer's own working set, and the order of preference is the issue's.
 *
 * Throws on duplicate applicant ids (a caller's bug: the result would be ambiguous).
 */
export function proposeSelection(
  targets: CoverageTargets,
  applicants: readonly Applicant[],
  options: SelectionOptions = {},
): SelectionProposal {
  assertUniqueIds(applicants);
  const prior = options.prior ?? studioReliabilityPrior(applicants.map((a) => a.reliability));
  const hasVariants = targets.variants.length > 0;
  const score = (a: Applicant) => reliabilityScore(a.reliability, prior);
  const rel = (a: Applicant) => describeReliability(a.reliability, prior);

  const placed = applicants.map((a) => place(a, targets)).sort((x, y) => compareIds(x.a.id, y.a.id));
  const tallies = targets.sizes.map(() => new SizeTally());
  const candidates: Placed[][] = targets.sizes.map(() => []);
  const picks: SelectionPick[] = [];
  const leftOut: SelectionLeftOut[] = [];
  const leaveOut = (p: Placed, cause: LeftOutCause, reason: string) =>
    leftOut.push({
      applicantId: p.a.id,
      sizeId: p.a.sizeId,
      bandId: p.band?.id ?? null,
      variantId: p.variantId,
      cause,
      waitlistRank: null,
      reliability: score(p.a),
      reason,
    });

  // Kept first, in size order, so their reasons read top to bottom like the grid.
  const kept = placed
    .filter((p) => p.a.status === 'selected')
    .sort((x, y) => x.sizeIndex - y.sizeIndex || compareIds(x.a.id, y.a.id));
  for (const p of kept) {
    const i = p.size ? p.sizeIndex : -1;
    if (i >= 0) (tallies[i] as SizeTally).add(p);
    picks.push({
      applicantId: p.a.id,
      sizeId: p.size ? p.size.id : p.a.sizeId,
      bandId: p.band?.id ?? null,
      variantId: p.variantId,
      kind: 'kept',
      order: 0,
      reliability: score(p.a),
      reason: p.size
        ? `Kept: already selected for size ${p.size.label}.`
        : `Kept: already selected, but for ${p.a.sizeId == null ? 'no size' : 'a size this trial does not ask for'}: check their size.`,
    });
  }

  for (const p of placed) {
    if (p.a.status === 'selected') continue;
    if (p.a.status === 'withdrawn') leaveOut(p, 'withdrawn', 'Left out: withdrew their application.');
    else if (p.a.status === 'declined') leaveOut(p, 'declined', 'Left out: already declined.');
    else if (p.a.sizeId == null) leaveOut(p, 'no-size', 'Left out: applied without a size, so there is no place to fill.');
    else if (!p.size) leaveOut(p, 'size-not-wanted', 'Left out: applied for a size this trial does not ask for.');
    else (candidates[p.sizeIndex] as Placed[]).push(p);
  }

  const keptBySize = tallies.map((t) => t.selected);
  let budget = options.maxNewPicks == null ? Number.POSITIVE_INFINITY : Math.max(0, Math.floor(options.maxNewPicks));
  // (target − selected) / target compared by cross-multiplying: exact for whole numbers.
  const fillsBefore = (i: number, ranked: Ranked[], j: number, other: Ranked[]): boolean => {
    const ti = cleanTarget((targets.sizes[i] as SizeTarget).target);
    const tj = cleanTarget((targets.sizes[j] as SizeTarget).target);
    const mine = (ti - (tallies[i] as SizeTally).selected) * tj;
    const theirs = (tj - (tallies[j] as SizeTally).selected) * ti;
    if (mine !== theirs) return mine > theirs;
    const order = compareKeys((ranked[0] as Ranked).key, (other[0] as Ranked).key).order;
    return order !== 0 ? order < 0 : i < j;
  };
  let order = 0;
  while (budget > 0) {
    // The size to fill next: largest relative shortfall, then the better best candidate, then size order.
    let best: { i: number; ranked: Ranked[] } | null = null;
    for (let i = 0; i < targets.sizes.length; i += 1) {
      const tally = tallies[i] as SizeTally;
      const target = cleanTarget((targets.sizes[i] as SizeTarget).target);
      const pool = candidates[i] as Placed[];
      if (tally.selected >= target || pool.length === 0) continue;
      const ranked = rank(pool, tally, hasVariants, prior);
      if (best == null || fillsBefore(i, ranked, best.i, best.ranked)) best = { i, ranked };
    }
    if (best == null) break;
    const { i, ranked } = best;
    const size = targets.sizes[i] as SizeTarget;
    const tally = tallies[i] as SizeTally;
    const target = cleanTarget(size.target);
    const chosen = ranked[0] as Ranked;
    const runnerUp = ranked[1];
    order += 1;
    budget -= 1;
    picks.push({
      applicantId: chosen.p.a.id,
      sizeId: size.id,
      bandId: chosen.p.band?.id ?? null,
      variantId: chosen.p.variantId,
      kind: 'new',
      order,
      reliability: chosen.key.score,
      reason: pickReason(chosen, runnerUp, size, tally, targets, rel),
    });
    const selectedBefore = tally.selected;
    tally.add(chosen.p);
    candidates[i] = (candidates[i] as Placed[]).filter((p) => p !== chosen.p);
    if (selectedBefore + 1 >= target) {
      // The size is full: everyone still waiting lost to this last pick, at this moment.
      for (const other of ranked.slice(1)) {
        const tier = compareKeys(chosen.key, other.key).tier;
        leaveOut(
          other.p,
          'size-full',
          `Left out: size ${size.label} is full (${tally.selected} of ${target}); ${lostBecause(tier, chosen, other, rel)}.`,
        );
      }
      candidates[i] = [];
    }
  }

  // Whoever is still waiting: their size was full from the start, or the pick limit was reached.
  targets.sizes.forEach((size, i) => {
    const tally = tallies[i] as SizeTally;
    const target = cleanTarget(size.target);
    for (const p of candidates[i] as Placed[]) {
      if (tally.selected >= target) {
        leaveOut(
          p,
          'size-already-full',
          target === 0
            ? `Left out: size ${size.label} has no places in this trial (target 0).`
            : `Left out: size ${size.label} was already full (${keptBySize[i]} of ${target} selected before this proposal).`,
        );
      } else {
        const open = target - tally.selected;
        leaveOut(
          p,
          'limit-reached',
          `Left out: the proposal stopped at ${order} new pick${order === 1 ? '' : 's'}; size ${size.label} still has ${plural(open, 'open place')}.`,
        );
      }
    }
  });

  assignWaitlistRanks(leftOut, placed, targets, prior);
  const byId = new Map(placed.map((p) => [p.a.id, p]));
  leftOut.sort((x, y) => {
    const px = byId.get(x.applicantId) as Placed;
    const py = byId.get(y.applicantId) as Placed;
    return (
      px.sizeIndex - py.sizeIndex ||
      px.bandIndex - py.bandIndex ||
      px.variantIndex - py.variantIndex ||
      (x.waitlistRank ?? Number.POSITIVE_INFINITY) - (y.waitlistRank ?? Number.POSITIVE_INFINITY) ||
      compareIds(x.applicantId, y.applicantId)
    );
  });

  const pickedIds = new Set(picks.map((p) => p.applicantId));
  const after = applicants.map((a) => (pickedIds.has(a.id) ? { ...a, status: 'selected' as const } : a));
  return { picks, leftOut, gridAfter: coverageGrid(targets, after, options), prior };
}

function pickReason(
  chosen: Ranked,
  runnerUp: Ranked | undefined,
  size: SizeTarget,
  tally: SizeTally,
  targets: CoverageTargets,
  rel: (a: Applicant) => string,
): string {
  const target = cleanTarget(size.target);
  let text = `Picked: size ${size.label} had ${tally.selected} of ${target} tester${target === 1 ? '' : 's'}`;
  const band = chosen.p.band;
  if (band && chosen.key.newBand === 0) text += ` and no one yet in the ${band.label} band`;
  else if (band) text += `; the ${band.label} band already had ${tally.bandCount(band.id)}`;
  else if (targets.heightBands.length > 0) text += '; height not given, so no band';
  if (targets.variants.length > 0 && chosen.key.newVariant === 0) {
    text += ` and no one yet for ${variantName(chosen.p.variantId, targets)}`;
  }
  text += `; ${rel(chosen.p.a)}`;
  if (!runnerUp) return `${text}; the only applicant left for this size.`;
  const tier = compareKeys(chosen.key, runnerUp.key).tier;
  switch (tier) {
    case 'band':
      return `${text}; chosen before the others in this size to cover that band.`;
    case 'variant':
      return `${text}; chosen before the others in this size to cover that variant.`;
    case 'cell':
      return `${text}; chosen to spread the size's testers over its bands and variants.`;
    case 'reliability':
      return `${text}; more reliable than the next in line (${fmtScore(chosen.key.score, runnerUp.key.score)}).`;
    case 'time':
      return `${text}; as reliable as the next in line and applied earlier.`;
    case 'id':
      return `${text}; fully tied with the next in line (same coverage, reliability and application time), so the fixed order by applicant id decided, to keep the proposal repeatable.`;
  }
}

function lostBecause(tier: Tier, winner: Ranked, loser: Ranked, rel: (a: Applicant) => string): string {
  switch (tier) {
    case 'band':
      return 'places went first to cover every height band with applicants';
    case 'variant':
      return 'places went first to cover every variant with applicants';
    case 'cell':
      return "places went first to spread the size's testers over its bands and variants";
    case 'reliability':
      return `the last place went to a more reliable applicant (${fmtScore(winner.key.score, loser.key.score)}); this applicant: ${rel(loser.p.a)}`;
    case 'time':
      return 'the last place went to an equally reliable applicant who applied earlier';
    case 'id':
      return 'fully tied with the last pick (same coverage, reliability and application time), so the fixed order by applicant id decided';
  }
}

/** "0.82 against 0.60", with a third decimal when two decimals would read as equal. */
function fmtScore(x: number, y: number): string {
  const digits = x.toFixed(2) === y.toFixed(2) ? 3 : 2;
  return `${x.toFixed(digits)} against ${y.toFixed(digits)}`;
}

function variantName(id: string | null, targets: CoverageTargets): string {
  if (id == null) return 'the pattern without a variant';
  return targets.variants.find((v) => v.id === id)?.name ?? id;
}

function assignWaitlistRanks(
  leftOut: SelectionLeftOut[],
  placed: readonly Placed[],
  targets: CoverageTargets,
  prior: ReliabilityPrior,
): void {
  const byId = new Map(placed.map((p) => [p.a.id, p]));
  const cells = new Map<string, { entry: SelectionLeftOut; key: Key }[]>();
  const empty = new SizeTally(); // within one cell the coverage tiers are equal: only reliability, time, id decide
  for (const entry of leftOut) {
    if (entry.cause !== 'size-full' && entry.cause !== 'size-already-full' && entry.cause !== 'limit-reached') continue;
    const p = byId.get(entry.applicantId) as Placed;
    if (!p.size || cleanTarget(p.size.target) === 0) continue; // no place will ever free up
    const k = JSON.stringify([p.size.id, p.band?.id ?? null, p.variantId]);
    const list = cells.get(k) ?? [];
    list.push({ entry, key: empty.keyOf(p, targets.variants.length > 0, prior) });
    cells.set(k, list);
  }
  for (const list of cells.values()) {
    list.sort((x, y) => compareKeys(x.key, y.key).order);
    list.forEach(({ entry }, n) => {
      entry.waitlistRank = n + 1;
      const p = byId.get(entry.applicantId) as Placed;
      const where = [
        `size ${(p.size as SizeTarget).label}`,
        p.band ? `${p.band.label} band` : targets.heightBands.length > 0 ? NO_BAND_LABEL.toLowerCase() : null,
        targets.variants.length > 0 ? variantName(p.variantId, targets) : null,
      ].filter((s) => s != null);
      entry.reason += ` Waitlist suggestion ${n + 1} for ${where.join(', ')}.`;
    });
  }
}

function assertUniqueIds(applicants: readonly Applicant[]): void {
  const seen = new Set<string>();
  for (const a of applicants) {
    if (seen.has(a.id)) throw new Error(`Applicant id ${a.id} appears twice.`);
    seen.add(a.id);
  }
}

// ---------------------------------------------------------------------------------------------
// After a withdrawal

export type WaitlistOffer = {
  applicantId: string;
  sizeId: string;
  bandId: string | null;
  variantId: string | null;
  /** Whether they are in the band of the freed place (always true when no band was given). */
  sameBand: boolean;
  reliability: number;
  reason: string;
};

/**
 * The best waitlisted applicant to offer a freed place in a size to, by the proposal's order of
 * preference; null when the size is unknown, still full, or nobody in it is waitlisted.
 *
 * Call it after the withdrawal is stored (the withdrawn applicant no longer counts as selected).
 * freedBandId is the band of the tester who left (null = their height was not given); when given,
 * waitlisted applicants of that band come first, and anyone else in the size is the fallback:
 * a place in the size is what was freed, the band is a preference.
 */
export function bestWaitlisted(
  targets: CoverageTargets,
  applicants: readonly Applicant[],
  freedSizeId: string,
  freedBandId?: string | null,
  options: Pick<SelectionOptions, 'prior'> = {},
): WaitlistOffer | null {
  assertUniqueIds(applicants);
  const size = targets.sizes.find((s) => s.id === freedSizeId);
  if (!size) return null;
  const prior = options.prior ?? studioReliabilityPrior(applicants.map((a) => a.reliability));
  const hasVariants = targets.variants.length > 0;
  const placed = applicants.map((a) => place(a, targets)).filter((p) => p.size?.id === freedSizeId);
  const tally = new SizeTally();
  for (const p of placed) if (p.a.status === 'selected') tally.add(p);
  const target = cleanTarget(size.target);
  if (tally.selected >= target) return null;
  const waiting = placed.filter((p) => p.a.status === 'waitlisted');
  if (waiting.length === 0) return null;

  const bandGiven = freedBandId !== undefined;
  const inBand = bandGiven ? waiting.filter((p) => (p.band?.id ?? null) === freedBandId) : waiting;
  const pool = inBand.length > 0 ? inBand : waiting;
  const ranked = rank(pool, tally, hasVariants, prior);
  const chosen = ranked[0] as Ranked;
  const runnerUp = ranked[1];
  const sameBand = !bandGiven || (chosen.p.band?.id ?? null) === freedBandId;
  const bandLabel = (id: string | null | undefined) =>
    id == null ? NO_BAND_LABEL.toLowerCase() : `the ${targets.heightBands.find((b) => b.id === id)?.label ?? id} band`;

  let reason = `Offer: size ${size.label} has ${tally.selected} of ${target} after the withdrawal`;
  if (bandGiven && sameBand) reason += `; waitlisted in the same band (${bandLabel(freedBandId)})`;
  if (bandGiven && !sameBand) {
    reason += `; nobody is waitlisted in ${bandLabel(freedBandId)}, so the best waitlisted in the size (${bandLabel(chosen.p.band?.id ?? null)})`;
  }
  if (chosen.p.band && chosen.key.newBand === 0 && !(bandGiven && sameBand)) {
    reason += `; no one selected yet in the ${chosen.p.band.label} band`;
  }
  if (hasVariants && chosen.key.newVariant === 0) reason += `; no one selected yet for ${variantName(chosen.p.variantId, targets)}`;
  reason += `; ${describeReliability(chosen.p.a.reliability, prior)}`;
  if (!runnerUp) reason += '; the only one waitlisted there';
  else {
    const tier = compareKeys(chosen.key, runnerUp.key).tier;
    if (tier === 'reliability') reason += `; more reliable than the next on the waitlist (${fmtScore(chosen.key.score, runnerUp.key.score)})`;
    else if (tier === 'time') reason += '; as reliable as the next on the waitlist and applied earlier';
    else if (tier === 'id') reason += '; fully tied with the next on the waitlist, so the fixed order by applicant id decided';
    else reason += '; covers a band or variant the size lacks';
  }
  return {
    applicantId: chosen.p.a.id,
    sizeId: size.id,
    bandId: chosen.p.band?.id ?? null,
    variantId: chosen.p.variantId,
    sameBand,
    reliability: chosen.key.score,
    reason: `${reason}.`,
  };
}
