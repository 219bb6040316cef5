// Plain names for the findings engine's classes and the studio's triage states, shared by the
// screens, the trial summary (PDF and CSV) and the release checklist so all of them say the same.
import type { FindingClass } from '../analysis/types';
import type { TRIAGE_STATES } from './schemas/findings';

export type TriageStateKey = (typeof TRIAGE_STATES)[number];

export const CLASS_LABELS: Record<FindingClass, string> = {
  'draft-wide': 'Whole draft',
  grading: 'Grading',
  'size-specific': 'One or a few sizes',
  'personal-fit': 'Personal fit',
  'too-few-reports': 'Too few to judge',
  none: 'No pattern problem',
};

export const TRIAGE_LABELS: Record<TriageStateKey, string> = {
  open: 'Open',
  'will-fix': 'Will fix',
  'personal-fit': 'Personal fit, no change',
  fixed: 'Fixed in a draft',
};

/** Classes the studio must decide about before a release: the pattern problems and personal fit. */
export const CLASSES_TO_TRIAGE: readonly FindingClass[] = ['draft-wide', 'grading', 'size-specific', 'personal-fit'];

/** "Fixed in draft 3", "Will fix", … */
export function triageWords(t: { state: TriageStateKey; fixedInDraft?: number | null }): string {
  return t.state === 'fixed' && t.fixedInDraft != null ? `Fixed in draft ${t.fixedInDraft}` : TRIAGE_LABELS[t.state];
}
