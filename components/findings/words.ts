// The words the findings screens use for the engine's codes: our own plain names.
import type { ComparisonStatus, Direction, FindingClass } from '@/server/analysis/types';
import { ALTERATION_KINDS } from '@/server/domain/alterations';
import { formatLength, type LengthUnit } from '@/server/domain/units';
import type { TriageState } from '@/hooks/use-findings';

export const CLASS_LABELS: Record<FindingClass, string> = {
  'draft-wide': 'Whole draft',
  grading: 'Grading',
  'size-specific': 'One or a few sizes',
  'personal-fit': 'Personal fit',
  'too-few-reports': 'Too few reports',
  none: 'No pattern problem',
};

/** One line on what each class means for the next draft. */
export const CLASS_HINTS: Record<FindingClass, string> = {
  'draft-wide': 'Many testers of every size made this change: look at the sample-size draft.',
  grading: 'The change grows or shrinks with the size: look at the grade rules.',
  'size-specific': 'One or a few sizes stand out from the rest.',
  'personal-fit': 'The amounts follow the testers’ own bodies, not the pattern.',
  'too-few-reports': 'Too few final reports to tell anything yet.',
  none: 'Nothing points at the pattern.',
};

/** Display order of the classes, the problems to act on first. */
export const CLASS_ORDER: readonly FindingClass[] = ['draft-wide', 'grading', 'size-specific', 'personal-fit', 'none', 'too-few-reports'];

/** Classes that point at the pattern and deserve attention. */
export function isPatternProblem(c: FindingClass): boolean {
  return c === 'draft-wide' || c === 'grading' || c === 'size-specific';
}

export const STATUS_LABELS: Record<ComparisonStatus, string> = {
  fixed: 'Fixed',
  'still-present': 'Still present',
  'not-enough-data': 'Not enough data',
};

export const TRIAGE_LABELS: Record<TriageState, string> = {
  open: 'Open',
  'will-fix': 'Will fix',
  'personal-fit': 'Personal fit, no change',
  fixed: 'Fixed in a draft',
};

const KIND_LABELS = new Map(ALTERATION_KINDS.map((k) => [k.key, k.label]));

/** "Leg length" for "leg-length"; a tester's own "other: …" text is kept as they wrote it. */
export function kindLabel(kind: string): string {
  const known = KIND_LABELS.get(kind);
  if (known) return known;
  if (kind.startsWith('other: ')) return `Other: ${kind.slice('other: '.length)}`;
  return kind;
}

export function directionLabel(direction: Direction): string {
  return direction === 'add' ? 'added' : 'taken out';
}

export function findingName(f: { kind: string; direction: Direction }): string {
  return `${kindLabel(f.kind)}, ${directionLabel(f.direction)}`;
}

export function findingKey(f: { kind: string; direction: Direction }): string {
  return `${f.kind}|${f.direction}`;
}

export function percent(x: number): string {
  return `${Math.round(x * 100)}%`;
}

export function intervalText(i: readonly [number, number]): string {
  return `${Math.round(i[0] * 100)}–${Math.round(i[1] * 100)}%`;
}

export function pText(p: number | null): string {
  if (p === null) return 'no test';
  if (p < 0.001) return 'p < 0.001';
  return `p = ${p.toFixed(3)}`;
}

export function testersText(n: number): string {
  return n === 1 ? '1 tester' : `${n} testers`;
}

/**
 * The engine words its reasons in millimetres (server/analysis/wording.ts, "−42.5 mm"); a reader
 * who works in inches or centimetres reads the amounts of a finding's reasons in their own unit.
 */
export function reasonInUnit(reason: string, unit: LengthUnit): string {
  return reason.replace(/(−|-)?(\d+(?:\.\d+)?) mm\b/g, (_all, sign: string | undefined, digits: string) => formatLength((sign ? -1 : 1) * Number(digits), unit));
}
