// Seeded generator of invented fit-trial data with planted problems, shared by the tests and used
// once to write the example files in examples/analysis/. Invented testers ("t1", …) only.
import type { AnalysisInput, TesterReport } from '../../../server/analysis';
import { eighths, mulberry32, normal } from '../../../server/analysis/calibration';

export { mulberry32 };

export const SIZES = ['0', '2', '4', '6', '8', '10', '12', '14', '16', '18', '20'];

export type Plant = 'grading' | 'draft-wide' | 'size-specific' | 'personal-fit' | 'too-few-reports';

/** The kind + direction each plant puts into the data, and the class it must get. */
export const PLANTED: Record<Plant, { kind: string; direction: 'add' | 'remove' }> = {
  grading: { kind: 'back-crotch-scoop', direction: 'add' },
  'draft-wide': { kind: 'rise-length', direction: 'add' },
  'size-specific': { kind: 'waist', direction: 'remove' },
  'personal-fit': { kind: 'leg-length', direction: 'remove' },
  'too-few-reports': { kind: 'hem-length', direction: 'remove' },
};

export const SPECIFIC_SIZE = '12';

interface Tester {
  id: string;
  size: string;
  index: number;
}

function roster(perSize: number, draft: string, startAt = 1): Tester[] {
  const out: Tester[] = [];
  let n = startAt;
  SIZES.forEach((size, index) => {
    for (let j = 0; j < perSize; j++) out.push({ id: `t${n++}`, size, index });
  });
  void draft;
  return out;
}

/** Adds the planted alteration of `plant` to one tester's report. */
function plantInto(plant: Plant, rng: () => number, t: Tester, report: TesterReport, strength = 1): void {
  const add = (kind: string, amountMm: number) => report.alterations.push({ kind, amountMm: eighths(amountMm) });
  switch (plant) {
    case 'grading': {
      // The back crotch curve needs more scooping the larger the size: nobody up to size 6, then
      // a rising share and a rising amount (about 2.5 mm more per size step).
      const steps = t.index - 3;
      if (steps > 0 && rng() < Math.min(1, steps / 5) * strength) add('back-crotch-scoop', 3 + 2.5 * steps + normal(rng, 0, 2));
      break;
    }
    case 'draft-wide':
      // The rise is short in every size: about four in five testers add about 20 mm.
      if (rng() < 0.8 * strength) add('rise-length', normal(rng, 20, 4));
      break;
    case 'size-specific':
      // One size's waist is too large: every tester of that size takes it in.
      if (t.size === SPECIFIC_SIZE && rng() < strength) add('waist', -normal(rng, 30, 6));
      break;
    case 'personal-fit': {
      // Testers shorten or lengthen the leg by their own inseam difference from the chart.
      const delta = report.bodyDeltaMm?.['leg-length'] ?? 0;
      if (delta < -15) add('leg-length', Math.min(-3, delta + normal(rng, 0, 6)));
      else if (delta > 15) add('leg-length', Math.max(3, delta + normal(rng, 0, 6)));
      break;
    }
    case 'too-few-reports':
      add('hem-length', -normal(rng, 25, 5));
      break;
  }
}

export interface GenerateOptions {
  seed: number;
  plants: Plant[];
  /** Testers per size (default 3). */
  perSize?: number;
  draft?: string;
  /** Background noise: this many extra kinds, each made by a tester with probability noiseRate. */
  noiseKinds?: number;
  noiseRate?: number;
  /** First tester number, so several drafts can use distinct testers. */
  startAt?: number;
  /** Multiplies the planted rates (0 removes the plant, e.g. "fixed in the next draft"). */
  strength?: Partial<Record<Plant, number>>;
}

/** Reports of one draft with the given plants and background noise. */
export function generateReports(o: GenerateOptions): TesterReport[] {
  const rng = mulberry32(o.seed);
  const draft = o.draft ?? '1';
  const tooFew = o.plants.includes('too-few-reports');
  const testers = tooFew ? roster(1, draft, o.startAt).slice(4, 6) : roster(o.perSize ?? 3, draft, o.startAt);
  const noiseKinds = o.noiseKinds ?? 0;
  const noiseRate = o.noiseRate ?? 0.05;
  return testers.map((t) => {
    const report: TesterReport = {
      tester: t.id,
      size: t.size,
      draft,
      alterations: [],
      // Inseam difference from the chart (body minus chart), independent of size.
      bodyDeltaMm: { 'leg-length': Math.round(normal(rng, 0, 35)) },
    };
    for (const plant of o.plants) plantInto(plant, rng, t, report, o.strength?.[plant] ?? 1);
    for (let k = 1; k <= noiseKinds; k++) {
      if (rng() < noiseRate) {
        const sign = rng() < 0.5 ? -1 : 1;
        report.alterations.push({ kind: `other-${String(k).padStart(2, '0')}`, amountMm: eighths(sign * Math.abs(normal(rng, 12, 5))) });
      }
    }
    return report;
  });
}

export function generateDataset(o: GenerateOptions): AnalysisInput {
  return { sizes: [...SIZES], reports: generateReports(o) };
}

/**
 * The example trial written to examples/analysis/trousers-trial.json: draft 1 carries one planted
 * problem of each flagged class, draft 2 fixes the short rise, draft 3 has only two reports so far.
 * Fit ratings, fabric use and unclear instruction steps are added so every output section shows.
 */
export function exampleTrial(seed = 2024): AnalysisInput {
  const all: Plant[] = ['grading', 'draft-wide', 'size-specific', 'personal-fit'];
  const draft1 = generateReports({ seed, plants: all, perSize: 3, draft: '1', noiseKinds: 2, noiseRate: 0.06 });
  const draft2 = generateReports({
    seed: seed + 1, plants: all, perSize: 2, draft: '2', noiseKinds: 2, noiseRate: 0.06, startAt: 101,
    strength: { 'draft-wide': 0 },
  });
  const draft3 = generateReports({ seed: seed + 2, plants: ['too-few-reports'], draft: '3', startAt: 201 });
  const rng = mulberry32(seed + 3);
  const rating = (m: number) => Math.max(-2, Math.min(2, Math.round(normal(rng, m, 0.45))));
  const steps = ['3', '7', '12'];
  const stepRate: Record<string, number> = { '3': 0.02, '7': 0.2, '12': 0.02 };
  const sizeIndex = new Map(SIZES.map((s, i) => [s, i] as const));
  const needFor = (size: string, widthMm: number, napped: boolean) => {
    const i = sizeIndex.get(size) ?? 0;
    const base = widthMm < 1300 ? 2300 + 60 * i : 1700 + 40 * i;
    return Math.round((napped ? base * 1.15 : base) / 50) * 50;
  };
  for (const r of [...draft1, ...draft2]) {
    const i = sizeIndex.get(r.size) ?? 0;
    const riseShort = r.draft === '1' ? -1.4 : 0;
    r.fit = {
      rise: rating(riseShort),
      seat: rating(i >= 7 ? -1.2 : 0),
      waist: rating(r.size === SPECIFIC_SIZE ? 1.5 : 0),
    };
    const widthMm = rng() < 0.5 ? 1150 : 1500;
    const napped = widthMm === 1500 && rng() < 0.3;
    const need = needFor(r.size, widthMm, napped);
    // The large sizes on narrow fabric run short: the stated layout does not fit them.
    const factor = widthMm === 1150 && i >= 9 ? normal(rng, 1.08, 0.02) : normal(rng, 0.93, 0.02);
    r.fabric = { widthMm: widthMm === 1500 && rng() < 0.4 ? 1470 : widthMm, usedMm: Math.round((need * factor) / 10) * 10, napped };
    const unclear = steps.filter((s) => rng() < (stepRate[s] ?? 0));
    if (unclear.length > 0) r.unclearSteps = unclear;
  }
  const fabricNeeds = SIZES.flatMap((size) => [
    { size, widthMm: 1150, needMm: needFor(size, 1150, false), napped: false },
    { size, widthMm: 1500, needMm: needFor(size, 1500, false), napped: false },
    { size, widthMm: 1500, needMm: needFor(size, 1500, true), napped: true },
  ]);
  return { sizes: [...SIZES], reports: [...draft1, ...draft2, ...draft3], fabricNeeds };
}
