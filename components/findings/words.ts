// The words the findings screens use for the engine's codes: our own plain names. Kinds are named
// by the engine's wording (server/analysis/wording.ts), so a reason and a heading read the same.
import type { ComparisonStatus, Direction, FindingClass } from '@/server/analysis/types';
import { formatLength, type LengthUnit } from '@/server/domain/units';

export { directionLabel, findingName, kindLabel } from '@/server/analysis/wording';
export { CLASS_LABELS, TRIAGE_LABELS } from '@/server/domain/finding-words';

/** One line on what each class means for the next draft. */
export const CLASS_HINTS: Record<FindingClass, string> = {
  'draft-wide': 'Many testers of every size made this change: look at the sample-size draft.',
  grading: 'The change grows or shrinks with the size: look at the grade rules.',
  'size-specific': 'One or a few sizes stand out from the rest.',
  'personal-fit': 'The amounts follow the testers’ own bodies, not the pattern.',
  'too-few-reports': 'Too few testers reported on this draft, or too few made this change, to tell anything yet.',
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
  improved: 'Improved, not confirmed',
  'still-present': 'Still present',
  'not-enough-data': 'Not enough data',
  'personal-fit': 'Personal fit, nothing to fix',
};


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

/** A length in the reader's unit; under an inch, to 1/16 in, where an eighth is too coarse to act on. */
export function lengthText(mm: number, unit: LengthUnit): string {
  return formatLength(mm, unit, { sixteenths: Math.abs(mm) < 25.4 }).replace(/^-/, '−');
}
