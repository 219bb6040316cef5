// Calibration of the findings on generated trials: how often the rules flag a problem that is not
// there (nothing planted), and how often they find one that is (planted). Pure and seeded, so the
// command (`npm run -s analyze:calibrate`) and the tests see the same numbers for the same seed.
//
// The trials look like real ones: 5–20 sizes, 2–6 testers per size, ten alteration kinds, each made
// by a tester with the base rate in a random direction, amounts and body differences unrelated to
// size. Everything here is invented data.
import { analyzeDraft } from './draft-analysis';
import { fitRatingAreas, fitRatingCells } from './fit-ratings';
import { wilsonInterval, type Interval } from './proportions';
import type { Thresholds } from './thresholds';
import type { AnalysisInput, Finding, FindingClass, TesterReport } from './types';

/** mulberry32: a small, well-known 32-bit generator; enough for reproducible test data. */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Box–Muller normal deviate. */
export function normal(rng: () => number, mean: number, sd: number): number {
  const u = Math.max(rng(), Number.EPSILON);
  const v = rng();
  return mean + sd * Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

/** Testers type eighths of an inch: store what they would have typed, in mm. */
export function eighths(mmValue: number): number {
  const e = Math.round(mmValue / 3.175);
  const v = (e === 0 ? Math.sign(mmValue) || 1 : e) * 3.175;
  return Math.round(v * 1000) / 1000;
}

function int(rng: () => number, lo: number, hi: number): number {
  return lo + Math.floor(rng() * (hi - lo + 1));
}

export interface Shape {
  /** Number of sizes (labels 0, 2, 4 …). */
  sizes: [number, number];
  /** Testers per size, drawn for each size. */
  perSize: [number, number];
}

/** What the graders meet: 5–20 sizes, 2–6 testers per size. */
export const USUAL_SHAPE: Shape = { sizes: [5, 20], perSize: [2, 6] };

export const NOISE_KINDS = 10;

interface Roster {
  sizes: string[];
  testers: { id: string; size: string; index: number }[];
}

function roster(rng: () => number, shape: Shape, minPerSize = 0): Roster {
  const k = int(rng, shape.sizes[0], shape.sizes[1]);
  const sizes = Array.from({ length: k }, (_, i) => String(2 * i));
  const testers: Roster['testers'] = [];
  sizes.forEach((size, index) => {
    const n = Math.max(minPerSize, int(rng, shape.perSize[0], shape.perSize[1]));
    for (let j = 0; j < n; j++) testers.push({ id: `t${testers.length + 1}`, size, index });
  });
  return { sizes, testers };
}

function noise(rng: () => number, report: TesterReport, kinds: number, rate: number): void {
  for (let k = 1; k <= kinds; k++) {
    const kind = `kind-${String(k).padStart(2, '0')}`;
    (report.bodyDeltaMm as Record<string, number>)[kind] = Math.round(normal(rng, 0, 30));
    if (rng() < rate) {
      const sign = rng() < 0.5 ? -1 : 1;
      report.alterations.push({ kind, amountMm: eighths(sign * Math.abs(normal(rng, 12, 6))) });
    }
  }
}

/** A trial with nothing planted: every kind is noise at `rate`. */
export function nullTrial(seed: number, rate: number, shape: Shape = USUAL_SHAPE, kinds = NOISE_KINDS): AnalysisInput {
  const rng = mulberry32(seed);
  const { sizes, testers } = roster(rng, shape);
  const reports = testers.map((t) => {
    const report: TesterReport = { tester: t.id, size: t.size, draft: '1', alterations: [], bodyDeltaMm: {} };
    noise(rng, report, kinds, rate);
    // Fit ratings with no problem anywhere: symmetric around "right".
    report.fit = Object.fromEntries(FIT_AREAS.map((a) => [a, nullRating(rng)]));
    return report;
  });
  return { sizes, reports };
}

const FIT_AREAS = ['waist', 'hip', 'seat', 'rise', 'thigh', 'leg'];

/** A rating with no fit problem: 0 half the time, ±1 often, ±2 now and then. */
function nullRating(rng: () => number): number {
  const u = rng();
  return u < 0.05 ? -2 : u < 0.25 ? -1 : u < 0.75 ? 0 : u < 0.95 ? 1 : 2;
}

export type PlantedClass = 'draft-wide' | 'grading' | 'personal-fit' | 'size-specific';
export const PLANTED_KIND = 'planted';

export interface PlantedTrial {
  input: AnalysisInput;
  /** The kind + direction the plant put in, and the size that stands out (size-specific). */
  direction: 'add' | 'remove';
  standout?: string;
}

/**
 * A trial with one planted problem on the kind "planted", and nine noise kinds at `rate`:
 *   draft-wide     three in four testers of every size add about 20 mm;
 *   grading        nobody in the smallest third of the range, then a share rising to 90 % in the
 *                  largest size, and an amount growing with size (3 → 18 mm);
 *   personal-fit   testers whose own measurement is more than 15 mm off the chart alter by about
 *                  that difference, in its direction;
 *   size-specific  one interior size (≥ 3 testers) where 9 in 10 testers take in about 30 mm,
 *                  against 1 in 20 elsewhere.
 */
export function plantedTrial(seed: number, plant: PlantedClass, rate: number, shape: Shape = USUAL_SHAPE): PlantedTrial {
  const rng = mulberry32(seed);
  const { sizes, testers } = roster(rng, shape, plant === 'size-specific' ? 3 : 0);
  const last = sizes.length - 1;
  const standoutIndex = plant === 'size-specific' ? int(rng, 1, last - 1) : -1;
  const reports = testers.map((t) => {
    const report: TesterReport = { tester: t.id, size: t.size, draft: '1', alterations: [], bodyDeltaMm: {} };
    noise(rng, report, NOISE_KINDS - 1, rate);
    const add = (amountMm: number) => report.alterations.push({ kind: PLANTED_KIND, amountMm: eighths(amountMm) });
    const u = last > 0 ? t.index / last : 0;
    const delta = Math.round(normal(rng, 0, 35));
    (report.bodyDeltaMm as Record<string, number>)[PLANTED_KIND] = delta;
    switch (plant) {
      case 'draft-wide':
        if (rng() < 0.75) add(Math.max(3, normal(rng, 20, 5)));
        break;
      case 'grading':
        if (rng() < Math.max(0, Math.min(1, (u - 0.3) / 0.7)) * 0.9) add(Math.max(2, 3 + 15 * u + normal(rng, 0, 2)));
        break;
      case 'personal-fit':
        if (Math.abs(delta) > 15) add(delta + normal(rng, 0, 6));
        break;
      case 'size-specific':
        if (t.index === standoutIndex) {
          if (rng() < 0.9) add(-Math.abs(normal(rng, 30, 6)));
        } else if (rng() < 0.05) {
          add((rng() < 0.5 ? -1 : 1) * Math.abs(normal(rng, 12, 6)));
        }
        break;
    }
    return report;
  });
  const direction = plant === 'draft-wide' || plant === 'grading' ? 'add' : 'remove';
  return { input: { sizes, reports }, direction, ...(standoutIndex >= 0 ? { standout: sizes[standoutIndex] } : {}) };
}

const FLAGGED: readonly FindingClass[] = ['draft-wide', 'grading', 'size-specific', 'personal-fit'];
export function isFlagged(f: Finding): boolean {
  return FLAGGED.includes(f.class);
}

export interface NullSummary {
  rate: number;
  trials: number;
  kinds: number;
  kindsFlagged: number;
  kindShare: number;
  kindInterval: Interval;
  trialsWithFalse: number;
  trialShare: number;
  trialInterval: Interval;
  /** Kinds flagged with a single maker (must be 0). */
  oneMakerFlags: number;
  fitCells: number;
  fitCellsFlagged: number;
  fitCellHints: number;
  fitAreas: number;
  fitAreasFlagged: number;
  byClass: Partial<Record<FindingClass, number>>;
}

/** False flags over `trials` null trials at one base rate. */
export function calibrateNull(rate: number, trials: number, seed: number, thresholds?: Partial<Thresholds>, shape: Shape = USUAL_SHAPE): NullSummary {
  let kinds = 0;
  let kindsFlagged = 0;
  let trialsWithFalse = 0;
  let oneMakerFlags = 0;
  let fitCells = 0;
  let fitCellsFlagged = 0;
  let fitCellHints = 0;
  let fitAreas = 0;
  let fitAreasFlagged = 0;
  const byClass: Partial<Record<FindingClass, number>> = {};
  for (let i = 0; i < trials; i++) {
    const input = nullTrial(seed + 7919 * i, rate, shape);
    const { findings } = analyzeDraft(input, '1', thresholds);
    const flaggedKinds = new Set<string>();
    for (const f of findings) {
      if (!isFlagged(f)) continue;
      flaggedKinds.add(f.kind);
      byClass[f.class] = (byClass[f.class] ?? 0) + 1;
      if (f.count <= 1) oneMakerFlags += 1;
    }
    kinds += new Set(findings.map((f) => f.kind)).size;
    kindsFlagged += flaggedKinds.size;
    if (flaggedKinds.size > 0) trialsWithFalse += 1;
    const cells = fitRatingCells(input, '1', thresholds);
    fitCells += cells.length;
    fitCellsFlagged += cells.filter((c) => c.flagged).length;
    fitCellHints += cells.filter((c) => c.hint).length;
    const areas = fitRatingAreas(input, '1', thresholds);
    fitAreas += areas.length;
    fitAreasFlagged += areas.filter((a) => a.flag !== null).length;
  }
  return {
    rate,
    trials,
    kinds,
    kindsFlagged,
    kindShare: kinds > 0 ? kindsFlagged / kinds : 0,
    kindInterval: kinds > 0 ? wilsonInterval(kindsFlagged, kinds) : [0, 1],
    trialsWithFalse,
    trialShare: trialsWithFalse / trials,
    trialInterval: wilsonInterval(trialsWithFalse, trials),
    oneMakerFlags,
    fitCells,
    fitCellsFlagged,
    fitCellHints,
    fitAreas,
    fitAreasFlagged,
    byClass,
  };
}

export interface HitSummary {
  plant: PlantedClass;
  rate: number;
  trials: number;
  hits: number;
  share: number;
  interval: Interval;
  /** What the planted kind was called instead, when missed. */
  misses: Partial<Record<FindingClass | 'absent' | 'wrong-size', number>>;
  /** Noise kinds flagged in the planted trials. */
  noiseFlags: number;
  noiseKinds: number;
}

/** Hits over `trials` planted trials of one class at one base rate of the noise kinds. */
export function calibratePlanted(plant: PlantedClass, rate: number, trials: number, seed: number, thresholds?: Partial<Thresholds>, shape: Shape = USUAL_SHAPE): HitSummary {
  let hits = 0;
  let noiseFlags = 0;
  let noiseKinds = 0;
  const misses: HitSummary['misses'] = {};
  for (let i = 0; i < trials; i++) {
    const trial = plantedTrial(seed + 104729 * i, plant, rate, shape);
    const { findings } = analyzeDraft(trial.input, '1', thresholds);
    const f = findings.find((x) => x.kind === PLANTED_KIND && x.direction === trial.direction);
    const hit = f !== undefined && f.class === plant && (plant !== 'size-specific' || f.sizes.includes(trial.standout as string));
    if (hit) hits += 1;
    else {
      const why = !f ? 'absent' : f.class === plant ? 'wrong-size' : f.class;
      misses[why] = (misses[why] ?? 0) + 1;
    }
    const noise = findings.filter((x) => x.kind !== PLANTED_KIND);
    noiseKinds += new Set(noise.map((x) => x.kind)).size;
    noiseFlags += new Set(noise.filter(isFlagged).map((x) => x.kind)).size;
  }
  return { plant, rate, trials, hits, share: hits / trials, interval: wilsonInterval(hits, trials), misses, noiseFlags, noiseKinds };
}
