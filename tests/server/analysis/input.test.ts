// The file format: valid files parse to the engine's input, malformed ones get messages that
// name the report index and field.
import { formatPath, parseAnalysisInput } from '../../../server/analysis';

const valid = () => ({
  sizes: ['0', '2', '4'],
  reports: [
    { tester: 't1', size: '0', alterations: [{ kind: 'leg-length', amountMm: -25.4 }], bodyDeltaMm: { 'leg-length': -40 } },
    { tester: 't2', size: '2', draft: '2', alterations: [] },
    { tester: 't3', size: 4, alterations: [], fit: { waist: -1 }, fabric: { widthMm: 1500, usedMm: 1800 }, unclearSteps: [3, '7a'] },
  ],
  fabricNeeds: [{ size: '4', widthMm: 1500, needMm: 1900 }],
});

function errorsOf(data: unknown): string[] {
  const r = parseAnalysisInput(data);
  if (r.ok) throw new Error('expected the file to be rejected');
  return r.errors;
}

describe('parseAnalysisInput', () => {
  it('accepts a valid file, defaults the draft to "1" and normalises labels to strings', () => {
    const r = parseAnalysisInput(valid());
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.input.reports.map((x) => x.draft)).toEqual(['1', '2', '1']);
    expect(r.input.reports[2]?.size).toBe('4');
    expect(r.input.reports[2]?.unclearSteps).toEqual(['3', '7a']);
    expect(r.input.reports[2]?.fabric).toEqual({ widthMm: 1500, usedMm: 1800, napped: false });
    expect(r.input.fabricNeeds?.[0]?.napped).toBe(false);
  });

  it('names report index and field for a wrong type', () => {
    const data = valid();
    (data.reports[0]!.alterations[0] as { amountMm: unknown }).amountMm = '1 in';
    expect(errorsOf(data)).toEqual(['reports[0].alterations[0].amountMm: expected a number']);
  });

  it('reports a missing field as required, deep inside the file', () => {
    const data = valid() as { reports: Record<string, unknown>[] };
    delete data.reports[1]!.tester;
    expect(errorsOf(data)).toContain('reports[1].tester: is required');
  });

  it('rejects a zero amount, since its direction would be unknown', () => {
    const data = valid();
    data.reports[0]!.alterations[0]!.amountMm = 0;
    expect(errorsOf(data)[0]).toMatch(/^reports\[0\]\.alterations\[0\]\.amountMm: must not be 0/);
  });

  it('names a misspelt field as unknown', () => {
    const data = valid() as { reports: Record<string, unknown>[] };
    data.reports[2]!.bodyDelta = { waist: 3 };
    expect(errorsOf(data)).toEqual(['reports[2].bodyDelta: unknown field (check the spelling)']);
  });

  it('checks sizes against the size list and duplicate reports of one tester in one draft', () => {
    const data = valid();
    data.reports[1]!.size = '13';
    data.reports.push({ tester: 't1', size: '2', alterations: [] } as never);
    const errors = errorsOf(data);
    expect(errors).toContain('reports[1].size: "13" is not one of the sizes (0, 2, 4)');
    expect(errors).toContain('reports[3].tester: tester "t1" already has a report for draft 1 (reports[0])');
  });

  it('quotes record keys that are not plain names, and range-checks fit ratings', () => {
    const data = valid() as { reports: Record<string, unknown>[] };
    data.reports[2]!.fit = { 'upper-arm': 3 };
    data.reports[0]!.bodyDeltaMm = { 'leg-length': 'short' };
    const errors = errorsOf(data);
    expect(errors).toContain('reports[2].fit["upper-arm"]: must be between −2 and +2');
    expect(errors).toContain('reports[0].bodyDeltaMm["leg-length"]: expected a number');
  });

  it('explains a file that is not an object, or lacks the lists', () => {
    expect(errorsOf([1, 2])).toEqual(['(file): expected an object with "sizes" and "reports"']);
    expect(errorsOf({ sizes: ['0'] })).toEqual(['reports: is required']);
    expect(errorsOf({ sizes: [], reports: [] })).toEqual(['sizes: needs at least one size', 'reports: needs at least one report']);
  });

  it('formats paths the way the messages promise', () => {
    expect(formatPath(['reports', 3, 'alterations', 0, 'amountMm'])).toBe('reports[3].alterations[0].amountMm');
    expect(formatPath([])).toBe('(file)');
  });
});
