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

/**
 * The order a trial's dates must keep, each no earlier than the one before it: applications
 * close, then testers are chosen, the drafts go out, the toile check-in is due, then the final
 * report, and the release comes last. A date left out is skipped.
 */
export const MILESTONE_ORDER: readonly MilestoneKind[] = MILESTONE_KINDS;

/**
 * Dates out of order, as per-field messages (`milestones.<kind>`) naming the date each one
 * must not come before; empty when the order holds. `describe` writes a date as the person
 * reads it (their time zone).
 */
export function milestoneOrderProblems(dates: Partial<Record<MilestoneKind, Date | string>>, describe: (at: Date) => string): Record<string, string> {
  const problems: Record<string, string> = {};
  let latest: { kind: MilestoneKind; at: Date } | null = null;
  for (const kind of MILESTONE_ORDER) {
    const value = dates[kind];
    if (value === undefined) continue;
    const at = new Date(value);
    if (latest && at.getTime() < latest.at.getTime()) {
      problems[`milestones.${kind}`] = `is before “${MILESTONE_LABELS[latest.kind]}” (${describe(latest.at)}): ${MILESTONE_LABELS[kind].toLowerCase()} must come on or after it`;
      continue;
    }
    latest = { kind, at };
  }
  return problems;
}
