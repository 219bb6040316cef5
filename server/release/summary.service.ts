import { toCsv } from '../csv';
import { Draft, DraftFile, Enrollment, FindingSnapshot, FindingTriage, Milestone, Photo, Report, Studio, User } from '../../db/models';
import { findingName, readerFor } from '../analysis';
import type { ChangeRow } from '../analysis/types';
import { CLASS_LABELS, CLASSES_TO_TRIAGE, triageWords } from '../domain/finding-words';
import { MILESTONE_LABELS, TESTER_MILESTONES } from '../domain/trials';
import { findingsFor, refreshFindings, type ReaderUnits } from '../findings/findings.service';
import type { Storage } from '../storage/storage';
import { loadTrial, orderedMilestones } from '../trials/trials.service';
import { coverageReached } from './release.service';

const STAGE_LABELS = { 'check-in': 'Toile check-in', final: 'Final report' } as const;
const VIEW_ORDER = ['front', 'side', 'back', 'detail'] as const;

/**
 * One page of a trial for the studio and for sharing: the coverage reached, the reports in per
 * stage, the findings of every draft with their triage and the next-draft change table, the draft
 * history, and the photos testers allowed the studio to share. Lengths in the reader's units.
 */
export async function trialSummary(studioId: string, trialId: string, units: ReaderUnits, storage?: Storage) {
  const trial = await loadTrial(studioId, trialId);
  const studio = (await Studio.findByPk(trial.studioId))!;
  const reader = readerFor(units.lengthUnit, units.fabricUnit);
  const sizeLabel = new Map((trial.pattern?.sizes ?? []).map((s) => [s.id, s.label]));
  const sizeOrder = new Map((trial.pattern?.sizes ?? []).map((s) => [s.id, s.position]));

  const coverage = await coverageReached(trial);
  const enrollments = await Enrollment.findAll({ where: { trialId: trial.id }, include: [{ model: Report, as: 'reports' }] });
  const milestones = await Milestone.findAll({ where: { trialId: trial.id } });
  const stages = (['check-in', 'final'] as const).map((stage) => {
    const kind = TESTER_MILESTONES[stage === 'check-in' ? 0 : 1];
    const trialDue = milestones.find((m) => m.kind === kind)?.dueAt ?? null;
    let submitted = 0;
    let onTime = 0;
    for (const e of enrollments) {
      const r = ((e as Enrollment & { reports?: Report[] }).reports ?? []).find((x) => x.stage === stage && x.submittedAt);
      if (!r) continue;
      submitted += 1;
      const due = e.dueOverrides[kind] ? new Date(e.dueOverrides[kind]) : trialDue;
      if (!due || r.submittedAt! <= due) onTime += 1;
    }
    const expected = enrollments.filter((e) => e.status !== 'dropped' || ((e as Enrollment & { reports?: Report[] }).reports ?? []).some((x) => x.stage === stage && x.submittedAt)).length;
    return { stage, label: STAGE_LABELS[stage], submitted, onTime, late: submitted - onTime, expected, dueLabel: MILESTONE_LABELS[kind] };
  });

  // Findings of every draft that has reports, each with its triage; the change table of the latest.
  await refreshFindings(trial);
  const snapshots = await FindingSnapshot.findAll({ where: { trialId: trial.id } });
  const triage = await FindingTriage.findAll({ where: { trialId: trial.id } });
  const triageOf = (kind: string, direction: string) => {
    const t = triage.find((x) => x.kind === kind && x.direction === direction);
    return { state: t?.state ?? ('open' as const), fixedInDraft: t?.fixedInDraft ?? null };
  };
  const drafts = snapshots
    .map((s) => ({
      draft: s.draft,
      testers: s.testers,
      findings: s.result.findings
        .filter((f) => CLASSES_TO_TRIAGE.includes(f.class))
        .map((f) => {
          const t = triageOf(f.kind, f.direction);
          return {
            name: findingName(f),
            kind: f.kind,
            direction: f.direction,
            class: f.class,
            classLabel: CLASS_LABELS[f.class],
            count: f.count,
            testers: f.testers,
            rate: f.rate,
            sizes: f.sizes,
            triage: t,
            triageLabel: triageWords(t),
          };
        }),
      others: s.result.findings.filter((f) => !CLASSES_TO_TRIAGE.includes(f.class)).length,
    }))
    .sort((a, b) => Number(a.draft) - Number(b.draft));
  const latest = drafts.length ? await findingsFor(trial, {}, units) : null;
  const changes = ((latest?.result?.changes ?? []) as ChangeRow[]).map((c) => ({
    finding: findingName(c),
    class: CLASS_LABELS[c.class],
    size: c.size,
    // As the change table on screen says it: nothing to change is "no change", not "0 in".
    change: c.amountMm === null || c.amountMm === 0 ? 'no change' : reader.fine(c.amountMm),
    changeMm: c.amountMm === null ? null : Math.round(c.amountMm * 10) / 10,
    // An interval whose ends read the same in the reader's unit says nothing more than the change.
    range: c.interval && reader.fine(c.interval[0]) !== reader.fine(c.interval[1]) ? `${reader.fine(c.interval[0])} to ${reader.fine(c.interval[1])}` : null,
    basis: c.basis,
    note: c.note,
  }));

  const draftRows = await Draft.findAll({ where: { patternId: trial.patternId }, include: [{ model: DraftFile, as: 'files' }], order: [['version', 'ASC']] });

  const photos = await Photo.findAll({
    where: { consent: 'may-share' },
    include: [{ model: Enrollment, as: 'enrollment', required: true, where: { trialId: trial.id }, include: [{ model: User, as: 'user', attributes: ['id', 'name', 'deletedAt'] }] }],
  });
  const photoRows = photos
    .map((p) => {
      const e = (p as Photo & { enrollment: Enrollment }).enrollment;
      return { photo: p, size: sizeLabel.get(e.sizeId) ?? '?', order: sizeOrder.get(e.sizeId) ?? 999 };
    })
    .sort((a, b) => a.order - b.order || VIEW_ORDER.indexOf(a.photo.view) - VIEW_ORDER.indexOf(b.photo.view) || a.photo.createdAt.getTime() - b.photo.createdAt.getTime());

  return {
    trial: {
      id: trial.id,
      title: trial.title,
      slug: trial.slug,
      state: trial.state,
      releasedAt: trial.releasedAt,
      studioName: studio.name,
      pattern: { id: trial.patternId, name: trial.pattern?.name ?? '' },
      milestones: orderedMilestones(trial).map((m) => ({ kind: m.kind, label: MILESTONE_LABELS[m.kind], dueAt: m.dueAt })),
      photosRemovedAt: trial.photosRemovedAt,
    },
    coverage: {
      sizes: coverage,
      target: coverage.reduce((n, c) => n + c.target, 0),
      enrolled: coverage.reduce((n, c) => n + c.enrolled, 0),
      finished: coverage.reduce((n, c) => n + Math.min(c.finished, c.target), 0),
      gapNote: trial.coverageGapNote,
    },
    reports: { enrolled: enrollments.length, stages },
    findings: { drafts, latestDraft: latest?.result?.draft ?? null, changes },
    drafts: draftRows.map((d) => ({
      id: d.id,
      version: d.version,
      changeNote: d.changeNote,
      createdAt: d.createdAt,
      final: d.id === trial.finalDraftId,
      files: (d.files ?? []).map((f) => ({ kind: f.kind, name: f.originalName, bytes: f.bytes })),
    })),
    photos: await Promise.all(
      photoRows.map(async ({ photo, size }) => ({
        id: photo.id,
        size,
        stage: photo.stage,
        view: photo.view,
        width: photo.width,
        height: photo.height,
        thumbKey: photo.thumbKey,
        // Signed after the access check, for a few minutes; never stored.
        thumbUrl: storage ? await storage.signedUrl('photos', photo.thumbKey, `${photo.view}-${photo.id.slice(0, 8)}.jpg`) : null,
      })),
    ),
  };
}

export type TrialSummary = Awaited<ReturnType<typeof trialSummary>>;

export const SUMMARY_TABLES = ['coverage', 'reports', 'findings', 'changes', 'drafts'] as const;
export type SummaryTable = (typeof SUMMARY_TABLES)[number];

/**
 * One table of the summary as CSV. Staff and testers typed some of these words (change notes,
 * "other" alterations), so no cell may start a spreadsheet formula.
 */
export function summaryCsv(summary: TrialSummary, table: SummaryTable): string {
  const unparse = (fields: string[], rows: (string | number | null)[][]) =>
    toCsv({ fields, data: rows.map((r) => r.map((c) => (c === null ? '' : c))) });
  switch (table) {
    case 'coverage':
      return unparse(
        ['size', 'testers_wanted', 'testers_enrolled', 'testers_finished'],
        summary.coverage.sizes.map((c) => [c.size, c.target, c.enrolled, c.finished]),
      );
    case 'reports':
      return unparse(
        ['stage', 'testers_expected', 'reports_in', 'on_time', 'late'],
        summary.reports.stages.map((s) => [s.label, s.expected, s.submitted, s.onTime, s.late]),
      );
    case 'findings':
      return unparse(
        ['draft', 'finding', 'class', 'testers_who_made_it', 'testers_on_draft', 'sizes', 'triage'],
        summary.findings.drafts.flatMap((d) => d.findings.map((f) => [d.draft, f.name, f.classLabel, f.count, f.testers, f.sizes.join(' '), f.triageLabel])),
      );
    case 'changes':
      return unparse(
        ['draft', 'finding', 'class', 'size', 'change', 'change_mm', 'range', 'basis', 'note'],
        summary.findings.changes.map((c) => [summary.findings.latestDraft, c.finding, c.class, c.size, c.change, c.changeMm, c.range, c.basis, c.note]),
      );
    case 'drafts':
      return unparse(
        ['version', 'uploaded', 'final', 'files', 'change_note'],
        summary.drafts.map((d) => [d.version, d.createdAt.toISOString().slice(0, 10), d.final ? 'yes' : 'no', d.files.map((f) => f.name).join('; '), d.changeNote]),
      );
  }
}
