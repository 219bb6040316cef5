import Papa from 'papaparse';

/**
 * A cell that starts with one of these is read as a formula by spreadsheet programs (OWASP,
 * "CSV Injection": = + - @ tab and carriage return). Without the `s` flag papaparse's own default
 * pattern misses a cell with a line break in it, so only the first character is tested here.
 */
const FORMULA_START = /^[=+\-@\t\r]/;

/**
 * CSV for a spreadsheet: CRLF lines, and every text cell that a spreadsheet would run as a formula
 * prefixed with an apostrophe, which makes it plain text there. Numbers stay numbers (a negative
 * amount is not text that anyone typed).
 */
export function toCsv(input: Parameters<typeof Papa.unparse>[0]): string {
  return Papa.unparse(input, { newline: '\r\n', escapeFormulae: FORMULA_START });
}

/** Undoes toCsv's apostrophe on a cell read back from a file Basted wrote. */
export function unescapeCell(cell: string): string {
  return cell.startsWith("'") && FORMULA_START.test(cell.slice(1)) ? cell.slice(1) : cell;
}
