// The release checklist of a trial, computed from its data: pure, shared by the API (which enforces
// it) and the app (which shows it). Each item says whether it holds, why not, and where to fix it.
import type { FindingClass } from '../analysis/types';
import { CLASS_LABELS, CLASSES_TO_TRIAGE, type TriageStateKey } from './finding-words';

export const CHECKLIST_KEYS = ['findings-triaged', 'will-fix-drafted', 'coverage', 'testers-done', 'final-draft'] as const;
export type ChecklistKey = (typeof CHECKLIST_KEYS)[number];

/** Where in the app an item is fixed. */
export type FixLink =
  | { screen: 'findings'; trialId: string }
  | { screen: 'pattern'; patternId: string }
  | { screen: 'trial'; trialId: string }
  | { screen: 'release'; trialId: string };

export type ChecklistItem = {
  key: ChecklistKey;
  title: string;
  ok: boolean;
  /** What holds, or what is still open, in words. */
  detail: string;
  /** The open parts one by one (empty when the item holds). */
  open: string[];
  fix: { label: string; link: FixLink };
};

export type ChecklistInput = {
  trialId: string;
  patternId: string;
  /** Every finding of every draft with reports, by kind and direction, with the studio's triage. */
  findings: { name: string; class: FindingClass; draft: number; triage: { state: TriageStateKey; fixedInDraft: number | null } }[];
  /** Versions of the pattern's drafts that have files. */
  draftVersions: number[];
  /** Per wanted size: the testers wanted and the testers who finished. */
  coverage: { size: string; target: number; finished: number }[];
  coverageGapNote: string | null;
  testers: { name: string; status: 'active' | 'finished' | 'dropped'; excused: boolean }[];
  finalDraft: { version: number; files: number } | null;
};

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** The items in the order a designer works through them. */
export function releaseChecklist(input: ChecklistInput): ChecklistItem[] {
  // One decision per kind and direction; a finding counts where the engine flagged it in any draft.
  const byName = new Map<string, { name: string; classes: Set<FindingClass>; lastDraft: number; triage: ChecklistInput['findings'][number]['triage'] }>();
  for (const f of input.findings) {
    if (!CLASSES_TO_TRIAGE.includes(f.class)) continue;
    const held = byName.get(f.name) ?? { name: f.name, classes: new Set<FindingClass>(), lastDraft: f.draft, triage: f.triage };
    held.classes.add(f.class);
    held.lastDraft = Math.max(held.lastDraft, f.draft);
    byName.set(f.name, held);
  }
  const flagged = [...byName.values()];
  const untriaged = flagged.filter((f) => f.triage.state === 'open');
  const latestDraft = Math.max(0, ...input.draftVersions);
  const undrafted = flagged.filter((f) => f.triage.state === 'will-fix' && latestDraft <= f.lastDraft);
  const gaps = input.coverage.filter((c) => c.finished < c.target);
  const gapNote = input.coverageGapNote?.trim() ?? '';
  const owing = input.testers.filter((t) => t.status === 'active' && !t.excused);

  return [
    {
      key: 'findings-triaged',
      title: 'Every finding has a decision',
      ok: untriaged.length === 0,
      detail:
        flagged.length === 0
          ? 'No finding needs a decision.'
          : untriaged.length === 0
            ? flagged.length === 1
              ? 'The one finding that points at the pattern or at personal fit is triaged.'
              : `All ${flagged.length} findings that point at the pattern or at personal fit are triaged.`
            : `${plural(untriaged.length, 'finding')} still open.`,
      open: untriaged.map((f) => `${f.name} (${[...f.classes].map((c) => CLASS_LABELS[c].toLowerCase()).join(', ')}): still open`),
      fix: { label: 'Triage the findings', link: { screen: 'findings', trialId: input.trialId } },
    },
    {
      key: 'will-fix-drafted',
      title: 'Every “will fix” has a later draft',
      ok: undrafted.length === 0,
      detail:
        undrafted.length === 0
          ? 'Each finding the studio will fix has a draft newer than the one it was found in.'
          : `${plural(undrafted.length, 'finding')} marked “will fix” with no newer draft uploaded.`,
      open: undrafted.map((f) => `${f.name}: found in draft ${f.lastDraft}, no draft after it yet`),
      fix: { label: 'Upload a draft', link: { screen: 'pattern', patternId: input.patternId } },
    },
    {
      key: 'coverage',
      title: 'Coverage met, or the gap accepted',
      ok: gaps.length === 0 || gapNote.length > 0,
      detail:
        gaps.length === 0
          ? 'Every size has as many finished testers as wanted.'
          : gapNote
            ? `Gap accepted: ${gapNote}`
            : `${plural(gaps.length, 'size')} short of finished testers; accept the gap with a note or fill it.`,
      open: gapNote ? [] : gaps.map((g) => `Size ${g.size}: ${g.finished} of ${g.target} finished`),
      fix: { label: gaps.length && !gapNote ? 'Accept the gap with a note' : 'See the coverage', link: { screen: 'release', trialId: input.trialId } },
    },
    {
      key: 'testers-done',
      title: 'Every tester finished or excused',
      ok: owing.length === 0,
      detail: owing.length === 0 ? 'No tester still owes a final report.' : `${plural(owing.length, 'tester')} neither finished nor excused.`,
      open: owing.map((t) => `${t.name}: no final report`),
      fix: { label: 'Excuse testers who stopped', link: { screen: 'release', trialId: input.trialId } },
    },
    {
      key: 'final-draft',
      title: 'The final draft is uploaded and chosen',
      ok: Boolean(input.finalDraft && input.finalDraft.files > 0),
      detail: input.finalDraft
        ? input.finalDraft.files > 0
          ? `Draft ${input.finalDraft.version} is the final draft (${plural(input.finalDraft.files, 'file')}).`
          : `Draft ${input.finalDraft.version} has no files.`
        : latestDraft
          ? `Choose the final draft (the newest is draft ${latestDraft}).`
          : 'No draft uploaded yet.',
      open: input.finalDraft && input.finalDraft.files > 0 ? [] : ['No final draft chosen'],
      fix: latestDraft
        ? { label: 'Choose the final draft', link: { screen: 'release', trialId: input.trialId } }
        : { label: 'Upload the final draft', link: { screen: 'pattern', patternId: input.patternId } },
    },
  ];
}

/** The keys of the items that do not hold. */
export function openItems(items: ChecklistItem[]): ChecklistKey[] {
  return items.filter((i) => !i.ok).map((i) => i.key);
}
