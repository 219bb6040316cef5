/**
 * Chart checks for the designer and the grader (issue 4 part 3): the grade step of each measurement
 * between neighbouring sizes with the odd ones pointed out, and the ease (finished − body) per size
 * with negative ease, thin trouser thighs and ease drift across the range pointed out.
 *
 * Pure on purpose: no Node imports (the chart editor shows these as the designer types).
 * Markers as in tests/reference/SOURCES.md: [CP] common practice, [MEM] from memory.
 */
import { linearRegression } from 'simple-statistics';
import {
  FINISHED_MEASUREMENTS,
  garmentCategoryDef,
  type FabricKind,
  type FinishedMeasurementKey,
  type GarmentCategory,
} from './garments';
import { MEASUREMENT_KEYS, measurementDef, type MeasurementKey } from './measurements';
import { formatLength, MM_PER_INCH, type LengthUnit } from './units';

export type BodyMm = Partial<Record<MeasurementKey, number>>;
export type FinishedMm = Partial<Record<FinishedMeasurementKey, number>>;
export type SizeRef = { id: string; label: string };
export type GradedSize = { id: string; label: string; bodyMm: BodyMm };
export type EaseSize = GradedSize & { finishedMm: FinishedMm };

/** Float noise from inch → mm conversions, far below what a tape measures. */
const EPS_MM = 1e-6;

function isNum(x: number | null | undefined): x is number {
  return typeof x === 'number' && Number.isFinite(x);
}

function ref(s: { id: string; label: string }): SizeRef {
  return { id: s.id, label: s.label };
}

function lower(label: string): string {
  return label.charAt(0).toLowerCase() + label.slice(1);
}

/** True when the length prints as zero in the person's unit ("0 in", "0.0 cm"). */
function isZeroShown(mm: number, unit: LengthUnit): boolean {
  const shown = formatLength(Math.abs(mm), unit);
  return shown === '0 in' || shown === '0.0 cm';
}

/** "+1/2 in", "-1/4 in", "0 in": a change, with its sign. */
function signedLength(mm: number, unit: LengthUnit): string {
  if (isZeroShown(mm, unit)) return formatLength(0, unit);
  return mm > 0 ? `+${formatLength(mm, unit)}` : formatLength(mm, unit);
}

// ---------------------------------------------------------------------------------------------
// Grade steps

export type GradeStepFlag = 'shrinks' | 'negative' | 'jump';

export type GradeStep = {
  from: SizeRef;
  to: SizeRef;
  /** to − from, in mm. */
  stepMm: number;
  flags: GradeStepFlag[];
  text: string;
};

export type GradePattern = 'constant' | 'progressive' | 'irregular' | 'too-few';

export type GradeRun = {
  key: MeasurementKey;
  label: string;
  steps: GradeStep[];
  pattern: GradePattern;
  /** Sizes without a value for this measurement; steps are only taken between neighbours that both have one. */
  missing: SizeRef[];
  /** One sentence per flagged step or gap. */
  problems: string[];
  summary: string;
};

export type GradeOptions = {
  /**
   * Two steps closer than this count as equal. Default ⅛ in: inch charts print to the nearest ⅛ in
   * (DESIGN.md "Units"; ASTM D5585 prints in eighths, SOURCES.md §1), so a printed value may be off
   * by up to 1/16 in and a step between two of them by up to ⅛ in. With this default the
   * ⅛ in wobbles of D5585's bust steps (1¼ → 1⅛ → 1) read as rounding, and the run reads as the
   * progressive grade SOURCES.md §2 calls it; pass 0 to see every wobble.
   */
  toleranceMm?: number;
};

export const GRADE_TOLERANCE_MM = MM_PER_INCH / 8;
/**
 * A step is out of line (a jump) when it is more than 1.5 times each of its two nearest steps and at
 * least 6 mm (about ¼ in) more than each [our rule, CP]. 1.5 times lets a progressive grade pass
 * (SOURCES.md §2: the Aldrich-attributed chart goes from 4 cm to 6 cm steps, exactly 1.5 times;
 * D5585's largest rise is 1 in → 1½ in, also 1.5 times); 6 mm keeps tiny measurements (a ⅛ in step
 * next to a 1/16 in one) from being called jumps.
 */
export const JUMP_RATIO = 1.5;
export const JUMP_MIN_MM = 6;

function sizeStep(step: { from: SizeRef; to: SizeRef }): string {
  return `${step.from.label} → ${step.to.label}`;
}

/**
 * The grade step of one body measurement between each pair of neighbouring sizes, with flags:
 * - shrinks: the step is smaller than the step before it by more than the tolerance;
 * - negative: the measurement falls as the size rises;
 * - jump: out of line with its neighbours (JUMP_RATIO and JUMP_MIN_MM against both neighbouring
 *   steps; at an end of the range, against the two steps next to it).
 * The run is constant (all steps within the tolerance of each other), progressive (no negative or
 * shrinking step, and the last step larger than the first by more than the tolerance: the steps grow
 * across the range), irregular (anything else), or too-few (fewer than two steps to compare).
 */
export function gradeSteps(
  sizes: readonly GradedSize[],
  key: MeasurementKey,
  unit: LengthUnit,
  options: GradeOptions = {},
): GradeRun {
  const tol = options.toleranceMm ?? GRADE_TOLERANCE_MM;
  const label = measurementDef(key).label;
  const fmt = (mm: number) => formatLength(mm, unit);
  const missing = sizes.filter((s) => !isNum(s.bodyMm[key])).map(ref);

  // Steps between neighbouring sizes that both have a value; `joined` says whether a step shares
  // its first size with the previous step (a missing size breaks the chain).
  const raw: { from: SizeRef; to: SizeRef; stepMm: number; joined: boolean }[] = [];
  for (let i = 1; i < sizes.length; i++) {
    const a = sizes[i - 1] as GradedSize;
    const b = sizes[i] as GradedSize;
    const va = a.bodyMm[key];
    const vb = b.bodyMm[key];
    if (!isNum(va) || !isNum(vb)) continue;
    const prev = raw[raw.length - 1];
    raw.push({ from: ref(a), to: ref(b), stepMm: vb - va, joined: prev !== undefined && prev.to.id === a.id });
  }

  const steps: GradeStep[] = raw.map((s, i) => {
    const flags: GradeStepFlag[] = [];
    const notes: string[] = [];
    const prev = s.joined ? raw[i - 1] : undefined;
    const nextRaw = raw[i + 1];
    const next = nextRaw?.joined ? nextRaw : undefined;
    if (s.stepMm < -EPS_MM) {
      flags.push('negative');
      notes.push(`the ${lower(label)} falls as the size rises`);
    }
    if (prev !== undefined && s.stepMm < prev.stepMm - tol - EPS_MM) {
      flags.push('shrinks');
      notes.push(`smaller than the step before it (${fmt(prev.stepMm)}, ${sizeStep(prev)})`);
    }
    // The two nearest steps in the same unbroken run: both neighbours, or the two on one side at an end.
    let near: { stepMm: number }[];
    if (prev !== undefined && next !== undefined) near = [prev, next];
    else if (prev !== undefined) near = [prev, ...(raw[i - 2] !== undefined && prev.joined ? [raw[i - 2] as { stepMm: number }] : [])];
    else if (next !== undefined) near = [next, ...(raw[i + 2]?.joined ? [raw[i + 2] as { stepMm: number }] : [])];
    else near = [];
    if (
      near.length > 0 &&
      near.every((n) => s.stepMm > JUMP_RATIO * n.stepMm + EPS_MM && s.stepMm - n.stepMm >= JUMP_MIN_MM - EPS_MM)
    ) {
      flags.push('jump');
      notes.push(`out of line: more than ${JUMP_RATIO} times the steps next to it (${near.map((n) => fmt(n.stepMm)).join(' and ')})`);
    }
    const text = `${label} ${sizeStep(s)}: ${signedLength(s.stepMm, unit)}${notes.length > 0 ? ` — ${notes.join('; ')}` : ''}.`;
    return { from: s.from, to: s.to, stepMm: s.stepMm, flags, text };
  });

  const problems = steps.filter((s) => s.flags.length > 0).map((s) => s.text);
  if (missing.length > 0 && missing.length < sizes.length) {
    problems.push(`${label}: no value for size ${missing.map((m) => m.label).join(', ')}, so the steps around it are not shown.`);
  }

  let pattern: GradePattern;
  let summary: string;
  const values = steps.map((s) => s.stepMm);
  if (steps.length < 2) {
    pattern = 'too-few';
    summary = `${label}: fewer than two steps, nothing to compare.`;
  } else {
    const min = Math.min(...values);
    const max = Math.max(...values);
    const first = steps[0] as GradeStep;
    const last = steps[steps.length - 1] as GradeStep;
    const flagged = steps.some((s) => s.flags.includes('negative') || s.flags.includes('shrinks'));
    if (!flagged && max - min <= tol + EPS_MM) {
      pattern = 'constant';
      summary = `${label} grades by a constant ${fmt(first.stepMm)} per size.`;
    } else if (!flagged && last.stepMm > first.stepMm + tol + EPS_MM) {
      pattern = 'progressive';
      summary = `${label} grades progressively: from ${fmt(first.stepMm)} (${sizeStep(first)}) to ${fmt(last.stepMm)} (${sizeStep(last)}).`;
    } else {
      pattern = 'irregular';
      summary = flagged
        ? `${label} grades irregularly: see the steps pointed out.`
        : `${label} grades irregularly: the steps get smaller across the range, from ${fmt(first.stepMm)} (${sizeStep(first)}) to ${fmt(last.stepMm)} (${sizeStep(last)}).`;
      if (!flagged) problems.push(summary);
    }
  }
  return { key, label, steps, pattern, missing, problems, summary };
}

/** gradeSteps for every body measurement the chart gives for at least two sizes, in vocabulary order. */
export function gradeAllSteps(sizes: readonly GradedSize[], unit: LengthUnit, options: GradeOptions = {}): GradeRun[] {
  return MEASUREMENT_KEYS.filter((k) => sizes.filter((s) => isNum(s.bodyMm[k])).length >= 2).map((k) =>
    gradeSteps(sizes, k, unit, options),
  );
}

// ---------------------------------------------------------------------------------------------
// Ease

export type EaseCell = {
  size: SizeRef;
  finishedMm: number;
  bodyMm: number;
  /** finished − body. */
  easeMm: number;
  text: string;
};

export type EaseDrift = {
  /** Least-squares slope of ease on size position (simple-statistics linearRegression), mm per size. */
  slopeMmPerSize: number;
  /** The fitted change from the first to the last size with a value: slope × the sizes between them. */
  changeMm: number;
  from: SizeRef;
  to: SizeRef;
  firstEaseMm: number;
  lastEaseMm: number;
  /** True for a girth whose fitted change exceeds the drift limit. */
  flagged: boolean;
  text: string;
};

export type EaseRow = {
  key: FinishedMeasurementKey;
  label: string;
  bodyKey: MeasurementKey;
  kind: 'girth' | 'length';
  cells: EaseCell[];
  /** Null with fewer than two sizes. */
  drift: EaseDrift | null;
};

export type EaseWarningCode = 'negative-ease' | 'thigh-ease-low' | 'ease-drift';

export type EaseWarning = {
  code: EaseWarningCode;
  /** warning: a problem to fix or justify; note: worth a look, may be intended. */
  severity: 'warning' | 'note';
  key: FinishedMeasurementKey;
  /** Null for a warning about the whole range (drift). */
  size: SizeRef | null;
  text: string;
};

export type EaseTable = { rows: EaseRow[]; warnings: EaseWarning[]; driftLimitMm: number };

export type EaseOptions = { driftLimitMm?: number };

/**
 * Trouser thigh ease of at least 1 in (Central Washington Univ. costume text, ch. 16 "Ease in
 * Clothing", SOURCES.md §4; quoted there for non-stretch wovens).
 */
export const MIN_TROUSER_THIGH_EASE_MM = MM_PER_INCH;

/**
 * Ease that changes by more than 1 in from the smallest to the largest size is pointed out [our
 * choice, CP]. Why 1 in: the published ease sets for one and the same area differ by about that much
 * between a close and an easy fit (bodice bust 1½–2 in in the CWU text against 2½ in in the set
 * quoted by Wikipedia, SOURCES.md §4), so a drift beyond it gives the two ends of the range
 * different fits. A studio can pass its own limit.
 */
export const DEFAULT_EASE_DRIFT_LIMIT_MM = MM_PER_INCH;

/**
 * Ease = finished − body (SOURCES.md §4) per size for every finished measurement with a body
 * counterpart, with warnings:
 * - negative ease on a girth: a warning for a woven without stretch (it cannot stretch onto the
 *   body), a note for a woven with stretch (it relies on the stretch), nothing for a knit (negative
 *   ease is normal there);
 * - trouser thigh ease under 1 in (CWU text, above): a warning for a woven without stretch, a note
 *   for a woven with stretch (the source's figures are for non-stretch wovens), nothing for a knit;
 *   not repeated where the thigh ease is already negative;
 * - drift: for girths, when the fitted change across the range exceeds the limit. Lengths (inseam,
 *   crotch length, shoulder) show their drift but are not flagged: a garment length graded apart from
 *   the body is often intended.
 */
export function easeTable(
  sizes: readonly EaseSize[],
  fabricKind: FabricKind,
  category: GarmentCategory,
  unit: LengthUnit,
  options: EaseOptions = {},
): EaseTable {
  const driftLimitMm = options.driftLimitMm ?? DEFAULT_EASE_DRIFT_LIMIT_MM;
  const fmt = (mm: number) => formatLength(mm, unit);
  const trouserLegs = garmentCategoryDef(category).hasTrouserLegs;
  const rows: EaseRow[] = [];
  const warnings: EaseWarning[] = [];

  for (const def of FINISHED_MEASUREMENTS) {
    const bodyKey = def.bodyKey;
    if (bodyKey === null) continue;
    const cells: EaseCell[] = [];
    const positions: number[] = [];
    sizes.forEach((s, i) => {
      const f = s.finishedMm[def.key];
      const b = s.bodyMm[bodyKey];
      if (!isNum(f) || !isNum(b)) return;
      const ease = f - b;
      const text =
        def.kind === 'girth'
          ? `Size ${s.label}: ${signedLength(ease, unit)} (finished ${fmt(f)}, body ${fmt(b)}).`
          : `Size ${s.label}: finished ${fmt(f)}, body ${fmt(b)}: ${
              isZeroShown(ease, unit)
                ? 'the same as the body'
                : `${fmt(Math.abs(ease))} ${ease > 0 ? 'longer' : 'shorter'} than the body`
            }.`;
      cells.push({ size: ref(s), finishedMm: f, bodyMm: b, easeMm: ease, text });
      positions.push(i);
    });
    if (cells.length === 0) continue;

    for (const c of cells) {
      const where = `${def.label}, size ${c.size.label}`;
      const negative = def.kind === 'girth' && c.easeMm < -EPS_MM;
      if (negative && fabricKind !== 'knit') {
        const amounts = `${fmt(-c.easeMm)} smaller than the body (finished ${fmt(c.finishedMm)}, body ${fmt(c.bodyMm)})`;
        warnings.push(
          fabricKind === 'woven'
            ? {
                code: 'negative-ease',
                severity: 'warning',
                key: def.key,
                size: c.size,
                text:
                  `${where}: negative ease, the garment is ${amounts}. A woven without stretch cannot stretch onto the body: check the measurement` +
                  `${def.key === 'waist' ? ' (an elastic or drawstring waist is measured fully stretched)' : ''}.`,
              }
            : {
                code: 'negative-ease',
                severity: 'note',
                key: def.key,
                size: c.size,
                text: `${where}: negative ease, the garment is ${amounts}. A woven with stretch gives only a little: make sure the fabric's stretch covers it.`,
              },
        );
      }
      if (trouserLegs && def.key === 'thigh' && !negative && fabricKind !== 'knit' && c.easeMm < MIN_TROUSER_THIGH_EASE_MM - EPS_MM) {
        warnings.push({
          code: 'thigh-ease-low',
          severity: fabricKind === 'woven' ? 'warning' : 'note',
          key: def.key,
          size: c.size,
          text:
            `${where}: thigh ease ${fmt(c.easeMm)}, under the ${fmt(MIN_TROUSER_THIGH_EASE_MM)} usually allowed in a woven trouser thigh` +
            `${fabricKind === 'woven' ? '' : ' (less can work with stretch)'}: the leg may bind when sitting or bending.`,
        });
      }
    }

    let drift: EaseDrift | null = null;
    if (cells.length >= 2) {
      const { m } = linearRegression(cells.map((c, i) => [positions[i] as number, c.easeMm]));
      const span = (positions[positions.length - 1] as number) - (positions[0] as number);
      const change = m * span;
      const first = cells[0] as EaseCell;
      const last = cells[cells.length - 1] as EaseCell;
      const flagged = def.kind === 'girth' && Math.abs(change) > driftLimitMm + EPS_MM;
      const what = def.kind === 'girth' ? `${def.label} ease` : `${def.label} (finished − body)`;
      const text =
        `${what} goes from ${fmt(first.easeMm)} at size ${first.size.label} to ${fmt(last.easeMm)} at size ${last.size.label}: ` +
        `a fitted change of ${signedLength(change, unit)} across the range (${signedLength(m, unit)} per size)` +
        (flagged ? `, more than ${fmt(driftLimitMm)}: the small and large sizes will not fit alike.` : '.');
      drift = { slopeMmPerSize: m, changeMm: change, from: first.size, to: last.size, firstEaseMm: first.easeMm, lastEaseMm: last.easeMm, flagged, text };
      if (flagged) warnings.push({ code: 'ease-drift', severity: 'warning', key: def.key, size: null, text });
    }
    rows.push({ key: def.key, label: def.label, bodyKey, kind: def.kind, cells, drift });
  }
  return { rows, warnings, driftLimitMm };
}
