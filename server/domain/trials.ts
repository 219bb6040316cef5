/** A trial's milestones in the order they happen, with the words the app and mail use. */
export const MILESTONE_KINDS = ['applications-close', 'selection', 'drafts-out', 'toile-check-in', 'final-report', 'release'] as const;
export type MilestoneKind = (typeof MILESTONE_KINDS)[number];

export const MILESTONE_LABELS: Record<MilestoneKind, string> = {
  'applications-close': 'Applications close',
  selection: 'Testers chosen',
  'drafts-out': 'Draft files out',
  'toile-check-in': 'Toile check-in due',
  'final-report': 'Final report due',
  release: 'Release target',
};

/** Milestones that ask something of each enrolled tester (and so get per-tester due dates). */
export const TESTER_MILESTONES: readonly MilestoneKind[] = ['toile-check-in', 'final-report'];

export const TESTER_EXPECTATIONS: Partial<Record<MilestoneKind, string>> = {
  'toile-check-in': 'Sew a toile of your size and send the check-in: fit per body area, alterations, photos.',
  'final-report': 'Sew the finished garment and send the final report with photos and fabric used.',
};

export const TRIAL_STATES = ['draft', 'open', 'running', 'closed'] as const;
export type TrialStateKey = (typeof TRIAL_STATES)[number];
export const TRIAL_STATE_LABELS: Record<TrialStateKey, string> = {
  draft: 'Draft (not public)',
  open: 'Call open',
  running: 'Running',
  closed: 'Closed',
};
