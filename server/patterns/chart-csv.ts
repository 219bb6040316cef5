import Papa from 'papaparse';
import { toCsv, unescapeCell } from '../csv';
import { formatLength, parseLength, type LengthUnit } from '../domain/units';

/**
 * A size chart as a spreadsheet: one row per size in order, a `Size` column, then one column per
 * body measurement and per finished measurement, each header carrying its unit:
 *
 *   Size,Bust (in),Waist (in),Hip (in),Finished hip (in)
 *   10,36,28,38,40 1/2
 *
 * Cells take every length form Basted accepts (1 3/8, 1-3/8, 97.5 cm …); a bare number is in the
 * header's unit. Import reports every problem by row and column and returns no chart at all when
 * there is any, so a bad file never changes what is saved.
 */
export type CsvColumn = { key: string; label: string; kind: 'body' | 'finished' };
export type CsvChart = {
  bodyColumns: string[];
  finishedColumns: string[];
  sizes: { label: string; bodyMm: Record<string, number>; finishedMm: Record<string, number> }[];
};
export type CsvProblem = { row: number; column: string; message: string };

const UNIT_IN_HEADER = /\(\s*(in|inch|inches|cm|mm)\s*\)\s*$/i;
const FINISHED_PREFIX = /^finished\s+/i;
const norm = (s: string) => s.trim().toLowerCase().replace(/[\s_-]+/g, ' ');

function headerUnit(header: string, fallback: LengthUnit): LengthUnit | 'mm' {
  const m = header.match(UNIT_IN_HEADER);
  if (!m) return fallback;
  const u = m[1].toLowerCase();
  return u === 'mm' ? 'mm' : u.startsWith('in') ? 'in' : 'cm';
}

export function chartToCsv(chart: CsvChart, catalog: CsvColumn[], unit: LengthUnit): string {
  const label = (kind: 'body' | 'finished', key: string) => {
    const col = catalog.find((c) => c.kind === kind && c.key === key);
    const name = col?.label ?? key;
    return `${kind === 'finished' ? `Finished ${name.toLowerCase()}` : name} (${unit})`;
  };
  const fields = ['Size', ...chart.bodyColumns.map((k) => label('body', k)), ...chart.finishedColumns.map((k) => label('finished', k))];
  // Plain numbers in the header's unit, so a spreadsheet can compute with them; 1/8 in is
  // 0.125 exactly, and 0.1 cm is 1 mm, so nothing is lost within Basted's display steps.
  const cell = (mm: number | undefined) =>
    mm === undefined ? '' : unit === 'in' ? String(Math.round((mm / 25.4) * 1000) / 1000) : formatLength(mm, 'cm').replace(/\s*cm$/, '');
  const data = chart.sizes.map((s) => [
    s.label,
    ...chart.bodyColumns.map((k) => cell(s.bodyMm[k])),
    ...chart.finishedColumns.map((k) => cell(s.finishedMm[k])),
  ]);
  return toCsv({ fields, data });
}

export function csvToChart(
  text: string,
  catalog: CsvColumn[],
  fallbackUnit: LengthUnit,
): { ok: true; chart: CsvChart } | { ok: false; problems: CsvProblem[] } {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy' });
  const problems: CsvProblem[] = parsed.errors.map((e) => ({
    row: (e.row ?? 0) + 1,
    column: '',
    message: `the file could not be read as CSV: ${e.message}`,
  }));
  const [header, ...rows] = parsed.data;
  if (!header || header.length === 0) return { ok: false, problems: [{ row: 1, column: '', message: 'the file is empty' }] };
  if (norm(header[0] ?? '') !== 'size') {
    problems.push({ row: 1, column: header[0] ?? '', message: 'the first column must be "Size"' });
  }

  type Mapped = { header: string; kind: 'body' | 'finished'; key: string; unit: LengthUnit | 'mm' } | null;
  const mapped: Mapped[] = header.slice(1).map((raw) => {
    const finished = FINISHED_PREFIX.test(raw.trim());
    const name = norm(raw.replace(UNIT_IN_HEADER, '').replace(FINISHED_PREFIX, ''));
    const kind = finished ? 'finished' : 'body';
    const col = catalog.find((c) => c.kind === kind && (norm(c.key) === name || norm(c.label) === name));
    if (!col) {
      const known = catalog.filter((c) => c.kind === kind).map((c) => c.label).join(', ');
      problems.push({ row: 1, column: raw, message: `not a ${finished ? 'finished ' : ''}measurement Basted knows; use one of: ${known}` });
      return null;
    }
    return { header: raw, kind, key: col.key, unit: headerUnit(raw, fallbackUnit) };
  });
  const seen = new Set<string>();
  for (const m of mapped) {
    if (!m) continue;
    const id = `${m.kind}:${m.key}`;
    if (seen.has(id)) problems.push({ row: 1, column: m.header, message: 'this column appears twice' });
    seen.add(id);
  }

  const sizes: CsvChart['sizes'] = [];
  const labels = new Set<string>();
  rows.forEach((cells, i) => {
    const row = i + 2; // the header is row 1, as a spreadsheet numbers them
    const label = unescapeCell((cells[0] ?? '').trim());
    if (!label) problems.push({ row, column: header[0] ?? 'Size', message: 'the size label is empty' });
    else if (label.length > 20) problems.push({ row, column: header[0] ?? 'Size', message: 'a size label has at most 20 characters' });
    else if (labels.has(label.toLowerCase())) problems.push({ row, column: header[0] ?? 'Size', message: `size "${label}" appears twice` });
    labels.add(label.toLowerCase());
    if (cells.length > header.length) problems.push({ row, column: '', message: `the row has ${cells.length} cells but the header has ${header.length}` });

    const size = { label, bodyMm: {} as Record<string, number>, finishedMm: {} as Record<string, number> };
    mapped.forEach((m, c) => {
      const value = (cells[c + 1] ?? '').trim();
      if (!m || value === '') return;
      const result = m.unit === 'mm' ? parseLength(`${value} mm`, 'cm') : parseLength(value, m.unit);
      if (!result.ok) problems.push({ row, column: m.header, message: result.message });
      else (m.kind === 'body' ? size.bodyMm : size.finishedMm)[m.key] = result.mm;
    });
    sizes.push(size);
  });
  if (rows.length === 0) problems.push({ row: 2, column: '', message: 'the file has a header but no sizes' });
  if (problems.length) return { ok: false, problems };

  const present = mapped.filter((m): m is NonNullable<Mapped> => m !== null);
  return {
    ok: true,
    chart: {
      bodyColumns: present.filter((m) => m.kind === 'body').map((m) => m.key),
      finishedColumns: present.filter((m) => m.kind === 'finished').map((m) => m.key),
      sizes,
    },
  };
}
