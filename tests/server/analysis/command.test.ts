// The command, run as a user would: through tsx in a child process, on the example files.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

const root = path.resolve(__dirname, '../../..');
const tsx = path.join(root, 'node_modules/.bin/tsx');
const script = path.join(root, 'scripts/analyze.ts');
const single = path.join(root, 'examples/analysis/trousers-trial.json');
const drafts = path.join(root, 'examples/analysis/trousers-trial-drafts.json');

function analyze(...args: string[]) {
  const r = spawnSync(tsx, [script, ...args], { cwd: root, encoding: 'utf8', timeout: 60_000 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(path.join(tmpdir(), 'basted-analyze-'));
});
afterAll(() => {
  rmSync(dir, { recursive: true, force: true });
});

describe('scripts/analyze.ts', () => {
  it('prints only JSON with the planted classes for the example file', () => {
    const r = analyze(single);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.draft).toBe('1');
    expect(out.testers).toBe(33);
    const cls = (kind: string, direction: string) =>
      out.findings.find((f: { kind: string; direction: string }) => f.kind === kind && f.direction === direction)?.class;
    expect(cls('back-crotch-scoop', 'add')).toBe('grading');
    expect(cls('rise-length', 'add')).toBe('draft-wide');
    expect(cls('waist', 'remove')).toBe('size-specific');
    expect(cls('leg-length', 'remove')).toBe('personal-fit');
    const waist = out.findings.find((f: { kind: string }) => f.kind === 'waist');
    expect(waist.sizes).toEqual(['12']);
    expect(waist.bySize).toHaveLength(11);
    expect(Object.keys(waist.bySize[0])).toEqual(
      expect.arrayContaining(['size', 'n', 'k', 'rate', 'wilson', 'meanMm', 'medianMm']),
    );
    for (const f of out.findings) {
      expect(Object.keys(f)).toEqual(
        expect.arrayContaining(['kind', 'direction', 'class', 'testers', 'count', 'rate', 'wilson', 'bySize', 'trend', 'amountSlope', 'bodyCorrelation', 'sizes', 'reasons']),
      );
      expect(f.reasons.length).toBeGreaterThan(0);
    }
    // Ratings: the short rise of draft 1 shows across the whole range; single cells are hints at most.
    const area = (name: string) => out.fitAreas.find((a: { area: string }) => a.area === name);
    expect(area('rise').flag).toBe('whole-range');
    expect(out.fitRatings.some((c: { hint: boolean }) => c.hint)).toBe(true);
    expect(out.unclearSteps[0]).toMatchObject({ step: '7', flagged: true });
  });

  it('shows too-few-reports for a draft with two reports', () => {
    const r = analyze(drafts, '--draft', '3');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.testers).toBe(2);
    expect(out.findings.map((f: { class: string }) => f.class)).toEqual(['too-few-reports']);
  });

  it('--compare gives a comparison with fixed, improved, personal fit and not-enough-data', () => {
    const r = analyze(drafts, '--compare', '1', '2');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.draft).toBe('1');
    const status = Object.fromEntries(
      out.comparison.map((c: { kind: string; direction: string; status: string }) => [`${c.kind}/${c.direction}`, c.status]),
    );
    expect(status['rise-length/add']).toBe('fixed');
    expect(status['back-crotch-scoop/add']).toBe('improved');
    expect(status['leg-length/remove']).toBe('personal-fit');
    expect(status['waist/remove']).toBe('not-enough-data');
    for (const c of out.comparison) expect(Object.keys(c)).toEqual(expect.arrayContaining(['kind', 'direction', 'from', 'to', 'status', 'p']));
  });

  it('--table prints a readable table instead of JSON', () => {
    const r = analyze(drafts, '--compare', '1', '2', '--table');
    expect(r.code).toBe(0);
    expect(() => JSON.parse(r.stdout)).toThrow();
    expect(r.stdout).toMatch(/^Draft 1: 33 testers/);
    expect(r.stdout).toMatch(/grading\s+back-crotch-scoop\s+add\s+\d+\/33/);
    expect(r.stdout).toContain('Draft comparison');
    expect(r.stdout).toMatch(/rise-length\s+add\s+draft-wide\s+1\s+2\s+\d+\/33\s+\d+\/22\s+\S+\s+-\d+% \(-\d+% to -\d+%\)\s+fixed/);
  });

  it('--changes adds the next-draft change table for every finding that points at the pattern', () => {
    const r = analyze(single, '--changes');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    type Row = { kind: string; size: string; amountMm: number | null; interval: [number, number] | null; basis: string };
    const rows = (kind: string): Row[] => out.changes.filter((c: Row) => c.kind === kind);
    const finding = (kind: string) => out.findings.find((f: { kind: string }) => f.kind === kind);
    // Draft-wide: the draft's median at every size, inside its order-statistic interval.
    const rise = rows('rise-length');
    expect(rise).toHaveLength(11);
    for (const row of rise) {
      expect(row).toMatchObject({ basis: 'median', amountMm: finding('rise-length').medianMm });
      expect(row.interval![0]).toBeLessThanOrEqual(row.amountMm!);
      expect(row.interval![1]).toBeGreaterThanOrEqual(row.amountMm!);
    }
    // Grading: the fitted line, growing with size; where it crosses zero, no change.
    const scoop = rows('back-crotch-scoop');
    expect(scoop.every((row) => row.basis === 'fitted')).toBe(true);
    const amounts = scoop.map((row) => row.amountMm as number);
    for (let i = 1; i < amounts.length; i++) expect(amounts[i]).toBeGreaterThanOrEqual(amounts[i - 1] as number);
    expect(amounts[0]).toBe(0);
    expect(amounts[10]).toBeGreaterThan(amounts[5] as number);
    expect(amounts[10]).toBeGreaterThan(15);
    // Size-specific: the standout size's own median, nothing elsewhere.
    const waist = rows('waist');
    expect(waist.filter((row) => row.amountMm !== null).map((row) => row.size)).toEqual(['12']);
    // Personal fit is no pattern change and is not listed.
    expect(rows('leg-length')).toEqual([]);
  });

  it('--changes follows the "willFix" list of the file, and --unit in writes it in inches to 1/16', () => {
    const data = JSON.parse(readFileSync(single, 'utf8'));
    data.willFix = [{ kind: 'waist', direction: 'remove' }];
    const file = path.join(dir, 'will-fix.json');
    writeFileSync(file, JSON.stringify(data));
    const json = JSON.parse(analyze(file, '--changes').stdout);
    expect([...new Set(json.changes.map((c: { kind: string }) => c.kind))]).toEqual(['waist']);
    const r = analyze(file, '--changes', '--unit', 'in', '--table');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('Suggested changes for the next draft, per size');
    expect(r.stdout).toMatch(/Waist larger or smaller, taken out\s+12\s+−1 1\/4 in\s+−1 5\/8 in to −1 1\/8 in\s+size-median/);
    expect(r.stdout).not.toContain(' mm');
  });

  it('a malformed file exits 2 naming report index and field', () => {
    const data = JSON.parse(readFileSync(single, 'utf8'));
    data.reports[3].alterations[0].amountMm = 'about an inch';
    const file = path.join(dir, 'bad.json');
    writeFileSync(file, JSON.stringify(data));
    const r = analyze(file);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain('reports[3].alterations[0].amountMm: expected a number');
  });

  it('invalid JSON, a missing file, an unknown draft and a bad option all exit 2 with a message', () => {
    const broken = path.join(dir, 'broken.json');
    writeFileSync(broken, '{"sizes": [');
    const cases = [
      { args: [broken], message: /not valid JSON/ },
      { args: [path.join(dir, 'nope.json')], message: /nope\.json: no such file/ },
      { args: [single, '--draft', '7'], message: /draft "7" has no reports/ },
      { args: [single, '--bogus'], message: /unknown option --bogus/ },
      { args: [], message: /no input file given/ },
    ];
    for (const c of cases) {
      const r = analyze(...c.args);
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr).toMatch(c.message);
    }
  });
});
