// The findings' error rates on generated trials (server/analysis/calibration.ts), at a fixed seed
// and smaller counts than `npm run -s analyze:calibrate`: with nothing planted, how many kinds and
// how many trials show a finding that is not there, at base rates 5 %, 15 % and 30 %; with one
// problem planted, how often it gets its class.
import { calibrateNull, calibratePlanted, nullTrial, plantedTrial, type PlantedClass } from '../../../server/analysis/calibration';
import { analyzeDraft } from '../../../server/analysis';

const SEED = 20261202;

describe('nothing planted: false flags stay rare at every base rate', () => {
  it.each([0.05, 0.15, 0.3])('base rate %f: ≤ 5 % of kinds and ≤ 10 % of trials falsely flagged, never from one maker', (rate) => {
    const s = calibrateNull(rate, 150, SEED + Math.round(rate * 100));
    // Enough kinds for the share to mean something.
    expect(s.kinds).toBeGreaterThan(1200);
    expect(s.kindShare).toBeLessThanOrEqual(0.05);
    expect(s.trialShare).toBeLessThanOrEqual(0.1);
    expect(s.oneMakerFlags).toBe(0);
    // Fit ratings: no cell is confirmed by chance, and whole areas stay under 5 %.
    expect(s.fitCellsFlagged / s.fitCells).toBeLessThanOrEqual(0.01);
    expect(s.fitAreasFlagged / s.fitAreas).toBeLessThanOrEqual(0.05);
  });

  it('the generated trials span the usual shapes (5–20 sizes, 2–6 testers per size) and the base rate', () => {
    const shapes = Array.from({ length: 60 }, (_, i) => nullTrial(SEED + i, 0.3));
    const sizes = shapes.map((x) => x.sizes.length);
    expect(Math.min(...sizes)).toBe(5);
    expect(Math.max(...sizes)).toBe(20);
    const made = shapes.flatMap((x) => x.reports.map((r) => r.alterations.length));
    const mean = made.reduce((a, b) => a + b, 0) / made.length;
    expect(mean).toBeGreaterThan(2.7); // 10 kinds × 30 %
    expect(mean).toBeLessThan(3.3);
  });
});

describe('one problem planted: hit rates, over the three base rates of the other kinds', () => {
  const GOAL: [PlantedClass, number][] = [
    ['draft-wide', 0.9],
    ['grading', 0.9],
    ['personal-fit', 0.9],
    // An interior size with at least 3 testers.
    ['size-specific', 0.6],
  ];
  it.each(GOAL)('%s: hit rate ≥ %f', (plant, goal) => {
    const runs = [0.05, 0.15, 0.3].map((rate, i) => calibratePlanted(plant, rate, 100, SEED + 31 * (i + 1)));
    const hits = runs.reduce((s, r) => s + r.hits, 0);
    expect(hits / 300).toBeGreaterThanOrEqual(goal);
    // The nine noise kinds of the planted trials stay quiet too.
    const noise = runs.reduce((s, r) => s + r.noiseFlags, 0) / runs.reduce((s, r) => s + r.noiseKinds, 0);
    expect(noise).toBeLessThanOrEqual(0.05);
  });

  it('a size-specific plant names its size, away from the ends of the range', () => {
    const trial = plantedTrial(SEED, 'size-specific', 0.05);
    const index = trial.input.sizes.indexOf(trial.standout as string);
    expect(index).toBeGreaterThan(0);
    expect(index).toBeLessThan(trial.input.sizes.length - 1);
    expect(trial.input.reports.filter((r) => r.size === trial.standout).length).toBeGreaterThanOrEqual(3);
    const f = analyzeDraft(trial.input, '1').findings.find((x) => x.kind === 'planted' && x.direction === 'remove');
    expect(f?.class).toBe('size-specific');
    expect(f?.sizes).toEqual([trial.standout]);
  });
});
