// `npm run -s analyze:calibrate [-- --trials N --seed S]`
// How often the findings flag a problem that is not there, and find one that is, on generated
// trials (server/analysis/calibration.ts): null trials at base rates 5 %, 15 % and 30 %, and trials
// with one planted problem of each class. Prints a table; exits 1 when a goal is missed.
import { calibrateNull, calibratePlanted, type PlantedClass } from '../server/analysis/calibration';

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(name);
  if (i < 0) return fallback;
  const v = Number(process.argv[i + 1]);
  if (!Number.isInteger(v) || v <= 0) {
    process.stderr.write(`${name} needs a whole number above 0\n`);
    process.exit(2);
  }
  return v;
}

const trials = arg('--trials', 200);
const seed = arg('--seed', 20261202);
const RATES = [0.05, 0.15, 0.3];
const pc = (x: number, d = 1) => `${(x * 100).toFixed(d)}%`;
const iv = (i: [number, number]) => `${pc(i[0])}–${pc(i[1])}`;

function table(headers: string[], rows: string[][]): string {
  const widths = headers.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const line = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i] ?? 0)).join('  ').trimEnd();
  return [line(headers), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n');
}

const started = Date.now();
let missed = 0;
const out: string[] = [];
out.push(`Calibration of the findings: ${trials} generated trials per row, seed ${seed}.`);
out.push('Trials: 5–20 sizes, 2–6 testers per size, 10 alteration kinds at the base rate, random directions,');
out.push('amounts and body differences unrelated to size. Goals: kinds falsely flagged ≤ 5 %; trials with a false');
out.push('finding 1 in 10 or fewer; hits ≥ 90 % (draft-wide, grading, personal fit), ≥ 60 % (size-specific).');
out.push('');
out.push('Nothing planted');
const nullRows = RATES.map((rate, i) => {
  const s = calibrateNull(rate, trials, seed + i);
  if (s.kindShare > 0.05 || s.oneMakerFlags > 0) missed += 1;
  return [
    pc(rate, 0),
    String(s.kinds),
    `${s.kindsFlagged} (${pc(s.kindShare, 2)})`,
    iv(s.kindInterval),
    `${s.trialsWithFalse} (${pc(s.trialShare)})`,
    iv(s.trialInterval),
    String(s.oneMakerFlags),
    `${s.fitCellsFlagged} of ${s.fitCells} (${s.fitCellHints} hints)`,
    `${s.fitAreasFlagged} of ${s.fitAreas}`,
  ];
});
out.push(table(['base rate', 'kinds', 'kinds flagged', '95% interval', 'trials with a false finding', '95% interval', 'one-maker flags', 'fit cells flagged', 'fit areas flagged'], nullRows));
out.push('');
out.push('One problem planted (hit: the planted alteration gets the planted class; size-specific also names the size)');
const GOAL: Record<PlantedClass, number> = { 'draft-wide': 0.9, grading: 0.9, 'personal-fit': 0.9, 'size-specific': 0.6 };
const hitRows: string[][] = [];
for (const plant of ['draft-wide', 'grading', 'personal-fit', 'size-specific'] as const) {
  RATES.forEach((rate, i) => {
    const h = calibratePlanted(plant, rate, trials, seed + 1000 * (i + 1));
    if (h.share < GOAL[plant]) missed += 1;
    const misses = Object.entries(h.misses).map(([k, v]) => `${k} ${v}`).join(', ');
    hitRows.push([plant, pc(rate, 0), `${h.hits} of ${h.trials} (${pc(h.share)})`, iv(h.interval), pc(GOAL[plant], 0), misses || '—', `${h.noiseFlags} of ${h.noiseKinds}`]);
  });
}
out.push(table(['planted', 'noise rate', 'hits', '95% interval', 'goal', 'missed as', 'noise kinds flagged'], hitRows));
out.push('');
out.push(missed === 0 ? `Every goal met (${((Date.now() - started) / 1000).toFixed(1)} s).` : `${missed} goal(s) missed.`);
process.stdout.write(`${out.join('\n')}\n`);
process.exit(missed === 0 ? 0 : 1);
