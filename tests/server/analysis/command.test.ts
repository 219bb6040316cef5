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
    expect(out.fitRatings.some((c: { flagged: boolean }) => c.flagged)).toBe(true);
    expect(out.unclearSteps[0]).toMatchObject({ step: '7', flagged: true });
  });

  it('shows too-few-reports for a draft with two reports', () => {
    const r = analyze(drafts, '--draft', '3');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.testers).toBe(2);
    expect(out.findings.map((f: { class: string }) => f.class)).toEqual(['too-few-reports']);
  });

  it('--compare gives a comparison with fixed, still-present and not-enough-data', () => {
    const r = analyze(drafts, '--compare', '1', '2');
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.draft).toBe('1');
    const status = Object.fromEntries(
      out.comparison.map((c: { kind: string; direction: string; status: string }) => [`${c.kind}/${c.direction}`, c.status]),
    );
    expect(status['rise-length/add']).toBe('fixed');
    expect(status['back-crotch-scoop/add']).toBe('still-present');
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
    expect(r.stdout).toMatch(/rise-length\s+add\s+draft-wide\s+1\s+2\s+\d+\/33\s+\d+\/22\s+\S+\s+fixed/);
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
