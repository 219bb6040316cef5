/**
 * Rules of a pattern's stated fabric needs that both the editor and the API apply.
 *
 * Pure on purpose: no Node imports (the fabric-needs editor checks as the designer types).
 */
import { formatFabricNeed, formatLength, type FabricUnit, type LengthUnit } from './units';

export type NeedCell = {
  /** The size, as one key per size (its id once resolved). */
  sizeKey: string;
  /** For the message: how the size is called. */
  sizeLabel: string;
  widthMm: number;
  napped: boolean;
  lengthMm: number;
};

export type NeedProblem = {
  /** Index of the one-way (napped) need in the list given. */
  index: number;
  /** Index of the plain need it is below. */
  plainIndex: number;
  /** Names size, width and layout: for a list of problems or an API refusal. */
  message: string;
  /** Without the size and width: for the cell itself, whose label names them. */
  cellMessage: string;
};

const round1 = (mm: number) => Math.round(mm * 10) / 10;

/** Widths are compared to the whole millimetre, as they are keyed when saved. */
const widthKey = (cell: NeedCell) => `${cell.sizeKey}|${Math.round(cell.widthMm)}`;

/**
 * A one-way (napped) need below the plain need for the same size and width. A one-way layout is
 * one of the layouts the plain need may use, with every piece the same way up, so it can never
 * take less fabric than the best free layout: such a pair is a typing mistake (often the two
 * columns swapped; tests/reference/SOURCES.md §5.3). Returns one problem per napped cell,
 * worded in the reader's units.
 */
export function nappedBelowPlain(cells: readonly NeedCell[], units: { lengthUnit: LengthUnit; fabricUnit: FabricUnit }): NeedProblem[] {
  const plain = new Map<string, number>();
  cells.forEach((c, i) => {
    if (!c.napped) plain.set(widthKey(c), i);
  });
  const problems: NeedProblem[] = [];
  cells.forEach((c, i) => {
    if (!c.napped) return;
    const plainIndex = plain.get(widthKey(c));
    if (plainIndex === undefined) return;
    const p = cells[plainIndex];
    if (c.lengthMm >= p.lengthMm) return;
    let napped = formatFabricNeed(c.lengthMm, units.fabricUnit);
    let free = formatFabricNeed(p.lengthMm, units.fabricUnit);
    // Both may round up to the same step: then the exact lengths show the difference.
    if (napped === free) {
      napped = `${napped} (${round1(c.lengthMm)} mm)`;
      free = `${free} (${round1(p.lengthMm)} mm)`;
    }
    problems.push({
      index: i,
      plainIndex,
      message:
        `Size ${c.sizeLabel}, ${formatLength(c.widthMm, units.lengthUnit)} wide, one way: ${napped} is less than the ${free} ` +
        'stated without a one-way layout; a one-way layout never takes less fabric (are the two columns swapped?)',
      cellMessage: `is below the ${free} stated without a one-way layout`,
    });
  });
  return problems;
}
