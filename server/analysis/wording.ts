// Words and numbers of the plain-language reasons. Reasons are read by designers and graders, so
// numbers are rounded to what a person can take in (the exact values sit beside them in JSON),
// alterations are named as the app names them, and lengths are written as tokens that a Reader
// turns into the reader's own unit when the reasons are shown (renderReasons).
import { ALTERATION_KINDS } from '../domain/alterations';
import { formatFabricLength, formatFabricNeed, formatLength, type FabricUnit, type LengthUnit } from '../domain/units';
import type { Direction } from './types';

export function pct(x: number): string {
  return `${Math.round(x * 100)}%`;
}

export function pValue(p: number): string {
  if (p < 0.0001) return 'p < 0.0001';
  return `p = ${p < 0.001 ? p.toPrecision(2) : p.toFixed(4).replace(/0+$/, '').replace(/\.$/, '')}`;
}

export function num(x: number, digits = 2): string {
  return x.toFixed(digits).replace('-', '−');
}

export function testersWord(n: number): string {
  return n === 1 ? '1 tester' : `${n} testers`;
}

export function sizesList(sizes: readonly string[]): string {
  const quoted = sizes.map((s) => `size ${s}`);
  if (quoted.length <= 1) return quoted.join('');
  return `${quoted.slice(0, -1).join(', ')} and ${quoted[quoted.length - 1]}`;
}

export function directionVerb(direction: Direction): string {
  return direction === 'add' ? 'added' : 'took out';
}

const KIND_LABELS = new Map(ALTERATION_KINDS.map((k) => [k.key, k.label]));

/** The app's name of a kind ("Back crotch length"); a tester's own "other: …" words are kept as typed. */
export function kindLabel(kind: string): string {
  const known = KIND_LABELS.get(kind);
  if (known) return known;
  // Token brackets in a tester's own words must not turn into lengths.
  const clean = kind.replace(/[⟦⟧]/g, '');
  if (clean.startsWith('other: ')) return `Other: ${clean.slice('other: '.length)}`;
  return clean;
}

export function directionLabel(direction: Direction): string {
  return direction === 'add' ? 'added' : 'taken out';
}

/** "Back crotch length, added": how the findings screen names a kind + direction. */
export function findingName(f: { kind: string; direction: Direction }): string {
  return `${kindLabel(f.kind)}, ${directionLabel(f.direction)}`;
}

/** The same inside a sentence: “back crotch length, added”. */
export function describeKind(kind: string, direction: Direction): string {
  const name = findingName({ kind, direction });
  const lower = KIND_LABELS.has(kind) ? name.charAt(0).toLowerCase() + name.slice(1) : name;
  return `“${lower}”`;
}

// ---------------------------------------------------------------------------------------------
// Lengths as tokens

/** A body or alteration length in mm (signed), written as a token for the reader's unit. */
export function len(mm: number): string {
  return `⟦len:${round3(mm)}⟧`;
}
/** The same, to 1/16 in for readers in inches: small amounts and the ends of narrow bands. */
export function fine(mm: number): string {
  return `⟦fine:${round3(mm)}⟧`;
}
/** A length of fabric used. */
export function fabric(mm: number): string {
  return `⟦fabric:${round3(mm)}⟧`;
}
/** A stated fabric need (shown rounded up). */
export function need(mm: number): string {
  return `⟦need:${round3(mm)}⟧`;
}
/** A fabric width. */
export function width(mm: number): string {
  return `⟦width:${round3(mm)}⟧`;
}

function round3(x: number): string {
  return String(Math.round(x * 1000) / 1000);
}

/** How one person reads lengths. */
export interface Reader {
  length(mm: number): string;
  fine(mm: number): string;
  fabric(mm: number): string;
  need(mm: number): string;
  width(mm: number): string;
}

function mmText(x: number): string {
  const text = x.toFixed(1).replace(/\.0$/, '');
  return `${text === '-0' ? '0' : text} mm`.replace('-', '−');
}

/** The engine's own unit: millimetres, the stored unit (the command line and the JSON reasons). */
export const MM_READER: Reader = {
  length: mmText,
  fine: mmText,
  fabric: mmText,
  need: mmText,
  width: mmText,
};

/** A reader in inches and yards, or centimetres and metres, as the person chose in their profile. */
export function readerFor(lengthUnit: LengthUnit, fabricUnit: FabricUnit): Reader {
  const minus = (s: string) => s.replace(/^-/, '−');
  return {
    length: (mm) => minus(formatLength(mm, lengthUnit)),
    fine: (mm) => minus(formatLength(mm, lengthUnit, { sixteenths: true })),
    fabric: (mm) => formatFabricLength(mm, fabricUnit),
    need: (mm) => formatFabricNeed(mm, fabricUnit),
    // Fabric is sold by width in whole centimetres or inches.
    width: (mm) => (lengthUnit === 'in' ? `${Math.round(mm / 25.4)} in` : `${Math.round(mm / 10)} cm`),
  };
}

const TOKEN = /⟦(len|fine|fabric|need|width):(-?\d+(?:\.\d+)?)⟧/g;

/** Writes every length token of a reason in the reader's units. */
export function renderReason(text: string, reader: Reader = MM_READER): string {
  return text.replace(TOKEN, (_all, kind: string, value: string) => {
    const mm = Number(value);
    switch (kind) {
      case 'len':
        return reader.length(mm);
      case 'fine':
        return reader.fine(mm);
      case 'fabric':
        return reader.fabric(mm);
      case 'need':
        return reader.need(mm);
      default:
        return reader.width(mm);
    }
  });
}

export function renderReasons(reasons: readonly string[], reader: Reader = MM_READER): string[] {
  return reasons.map((r) => renderReason(r, reader));
}
