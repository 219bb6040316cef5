import type { Transaction } from 'sequelize';
import type { z } from 'zod';
import { Draft, DraftFile, Enrollment, FindingSnapshot, FindingTriage, PatternSize, Studio, Trial, User } from '../../db/models';
import { findingName } from '../analysis';
import type { Config } from '../config';
import { releaseChecklist, type ChecklistInput, type ChecklistItem } from '../domain/release';
import type { excuseSchema, releaseSchema, releaseSettingsSchema } from '../domain/schemas/release';
import { badRequest, conflict, notFound } from '../errors';
import { refreshFindings } from '../findings/findings.service';
import type { Mailer } from '../mail/mailer';
import { closingNoteMail, releaseThanksMail } from '../mail/release-templates';
import { cancelObsoleteReminders, optOutFor, send as sendMail } from '../outbox/outbox.service';
import { loadTrial, targetsOf } from '../trials/trials.service';
import { assignAndSendRewardCodes, rewardCodeCounts } from './reward-codes.service';

export type MailDeps = { config: Config; mailer: Mailer };
type TesterRow = Enrollment & { user?: User };

/** The findings of every draft with reports, each with the studio's triage of its kind and direction. */
async function findingsForChecklist(trial: Trial, fresh: boolean, transaction?: Transaction): Promise<ChecklistInput['findings']> {
  if (fresh) await refreshFindings(trial);
  const snapshots = await FindingSnapshot.findAll({ where: { trialId: trial.id }, transaction });
  const triage = await FindingTriage.findAll({ where: { trialId: trial.id }, transaction });
  const triageOf = (kind: string, direction: string) => {
    const t = triage.find((x) => x.kind === kind && x.direction === direction);
    return { state: t?.state ?? ('open' as const), fixedInDraft: t?.fixedInDraft ?? null };
  };
  return snapshots.flatMap((s) =>
    s.result.findings.map((f) => ({ name: findingName(f), class: f.class, draft: Number(s.draft), triage: triageOf(f.kind, f.direction) })),
  );
}

async function draftsOf(trial: Trial, transaction?: Transaction) {
  return Draft.findAll({ where: { patternId: trial.patternId }, include: [{ model: DraftFile, as: 'files' }], order: [['version', 'ASC']], transaction });
}

async function testersOf(trial: Trial, transaction?: Transaction): Promise<TesterRow[]> {
  return (await Enrollment.findAll({ where: { trialId: trial.id }, include: [{ model: User, as: 'user' }], order: [['createdAt', 'ASC']], transaction })) as TesterRow[];
}

/** Per wanted size: testers wanted, enrolled (still in, or finished) and finished. */
export async function coverageReached(trial: Trial, transaction?: Transaction) {
  const targets = targetsOf(trial);
  const enrollments = await Enrollment.findAll({ where: { trialId: trial.id }, transaction });
  return targets.sizes.map((s) => ({
    sizeId: s.id,
    size: s.label,
    target: s.target,
    enrolled: enrollments.filter((e) => e.sizeId === s.id && e.status !== 'dropped').length,
    finished: enrollments.filter((e) => e.sizeId === s.id && e.status === 'finished').length,
  }));
}

async function checklistOf(trial: Trial, fresh: boolean, transaction?: Transaction): Promise<ChecklistItem[]> {
  const [findings, drafts, coverage, testers] = await Promise.all([
    findingsForChecklist(trial, fresh, transaction),
    draftsOf(trial, transaction),
    coverageReached(trial, transaction),
    testersOf(trial, transaction),
  ]);
  const final = drafts.find((d) => d.id === trial.finalDraftId);
  return releaseChecklist({
    trialId: trial.id,
    patternId: trial.patternId,
    findings,
    draftVersions: drafts.filter((d) => (d.files ?? []).length > 0).map((d) => d.version),
    coverage,
    coverageGapNote: trial.coverageGapNote,
    testers: testers.map((e) => ({ name: e.user?.name ?? 'A tester', status: e.status, excused: Boolean(e.excusedAt) })),
    finalDraft: final ? { version: final.version, files: (final.files ?? []).length } : null,
  });
}

/** Everything the release screen shows: the checklist, the choices it needs, and what a release did. */
export async function releaseStatus(studioId: string, trialId: string) {
  const trial = await loadTrial(studioId, trialId);
  const [checklist, drafts, coverage, testers, codes] = await Promise.all([
    checklistOf(trial, true),
    draftsOf(trial),
    coverageReached(trial),
    testersOf(trial),
    rewardCodeCounts(trial),
  ]);
  const labels = new Map((trial.pattern?.sizes ?? []).map((s) => [s.id, s.label]));
  const releasedBy = trial.releasedById ? await User.findByPk(trial.releasedById) : null;
  return {
    trial: { id: trial.id, title: trial.title, state: trial.state, patternId: trial.patternId, patternName: trial.pattern?.name ?? '' },
    released: trial.releasedAt ? { at: trial.releasedAt, by: releasedBy?.deletedAt ? null : (releasedBy?.name ?? null), openItems: trial.releaseOpenItems ?? [] } : null,
    checklist,
    ready: checklist.every((i) => i.ok),
    finalDraftId: trial.finalDraftId,
    coverageGapNote: trial.coverageGapNote,
    drafts: drafts.map((d) => ({ id: d.id, version: d.version, changeNote: d.changeNote, createdAt: d.createdAt, files: (d.files ?? []).length })),
    coverage,
    testers: testers.map((e) => ({
      enrollmentId: e.id,
      name: e.user?.name ?? 'A tester',
      size: labels.get(e.sizeId) ?? '?',
      status: e.status,
      excused: Boolean(e.excusedAt),
      excuseNote: e.excuseNote,
    })),
    rewardCodes: codes,
  };
}

export async function updateReleaseSettings(studioId: string, trialId: string, input: z.output<typeof releaseSettingsSchema>) {
  const trial = await loadTrial(studioId, trialId);
  if (input.finalDraftId) {
    const draft = await Draft.findOne({ where: { id: input.finalDraftId, patternId: trial.patternId }, include: [{ model: DraftFile, as: 'files' }] });
    if (!draft) throw badRequest('Choose one of this pattern’s drafts.', { finalDraftId: 'is not a draft of this pattern' });
    if (!(draft.files ?? []).length) throw badRequest('That draft has no files to send.', { finalDraftId: 'has no files' });
  }
  if (trial.releasedAt && input.finalDraftId !== undefined && input.finalDraftId !== trial.finalDraftId) {
    throw conflict('The trial is released: its final draft was sent and stays as it is.', { finalDraftId: 'the trial is released' });
  }
  await trial.update({
    ...(input.finalDraftId !== undefined ? { finalDraftId: input.finalDraftId } : {}),
    ...(input.coverageGapNote !== undefined ? { coverageGapNote: input.coverageGapNote || null } : {}),
  });
  return releaseStatus(studioId, trialId);
}

/** Lets a tester off finishing (or takes that back): an excused tester counts as done for the release. */
export async function excuseTester(studioId: string, trialId: string, enrollmentId: string, input: z.output<typeof excuseSchema>) {
  await loadTrial(studioId, trialId);
  const enrollment = await Enrollment.findOne({ where: { id: enrollmentId, trialId } });
  if (!enrollment) throw notFound('enrollment');
  await enrollment.update({ excusedAt: input.excused ? new Date() : null, excuseNote: input.excused ? input.note : null });
  // An excused tester owes nothing: their queued reminders go.
  await cancelObsoleteReminders({ enrollmentId });
  return { enrollmentId, excused: Boolean(enrollment.excusedAt), excuseNote: enrollment.excuseNote };
}

/**
 * Marks the trial released when its checklist holds, or when every item that does not is named
 * in `confirmOpenItems` (they are kept with the release as they read then). A trial is released
 * once: a second attempt is refused and sends nothing. Afterwards finishers get their thanks and
 * the final files, reward codes go out, and the others get a closing note.
 */
export async function releaseTrial(studioId: string, trialId: string, user: User, input: z.output<typeof releaseSchema>, deps: MailDeps) {
  const before = await loadTrial(studioId, trialId);
  if (before.releasedAt) throw conflict('This trial is released already; nothing was sent again.', { trial: 'released already' });
  // Brings the stored findings up to date outside the lock (their rows refer to the trial row).
  await refreshFindings(before);
  await Trial.sequelize!.transaction(async (transaction) => {
    const trial = await Trial.findOne({ where: { id: trialId, studioId }, lock: transaction.LOCK.NO_KEY_UPDATE, transaction });
    if (!trial) throw notFound('trial');
    if (trial.releasedAt) throw conflict('This trial is released already; nothing was sent again.', { trial: 'released already' });
    const full = await loadTrial(studioId, trialId, transaction);
    const items = await checklistOf(full, false, transaction);
    const open = items.filter((i) => !i.ok);
    const unconfirmed = open.filter((i) => !input.confirmOpenItems.includes(i.key));
    if (unconfirmed.length) {
      throw conflict(
        'The checklist has open items. Fix them, or confirm each one to release anyway.',
        Object.fromEntries(unconfirmed.map((i) => [`confirmOpenItems.${i.key}`, `${i.title}: ${i.detail}`])),
      );
    }
    await trial.update(
      { releasedAt: new Date(), releasedById: user.id, state: 'closed', releaseOpenItems: open.map((i) => ({ key: i.key, title: i.title, detail: i.detail })) },
      { transaction },
    );
  });
  await cancelObsoleteReminders({ trialId });
  const mail = await sendReleaseMail(await loadTrial(studioId, trialId), deps);
  return { ...(await releaseStatus(studioId, trialId)), mail };
}

/**
 * The mail of a release, each message under its own key (trial and enrolment), so running this
 * again sends nothing twice. People who deleted their account get nothing.
 */
export async function sendReleaseMail(trial: Trial, deps: MailDeps) {
  if (!trial.releasedAt) return { thanks: 0, closing: 0, codes: { assigned: 0, sent: 0, missing: 0 } };
  const studio = (await Studio.findByPk(trial.studioId))!;
  const final = trial.finalDraftId ? await Draft.findByPk(trial.finalDraftId, { include: [{ model: DraftFile, as: 'files' }] }) : null;
  const link = `${deps.config.publicUrl}/my-trials`;
  let thanks = 0;
  let closing = 0;
  for (const e of await testersOf(trial)) {
    const user = e.user;
    if (!user || user.deletedAt) continue;
    const finished = e.status === 'finished';
    const base = { name: user.name, trialTitle: trial.title, studioName: studio.name, link, optOut: optOutFor(deps.config, user.id, 'trial-news') };
    try {
      const row = await sendMail(deps, {
        key: `${finished ? 'release-thanks' : 'release-closing'}:${trial.id}:${e.id}`,
        to: { id: user.id, email: user.email },
        template: finished ? 'release-thanks' : 'release-closing',
        category: 'trial-news',
        studioId: trial.studioId,
        trialId: trial.id,
        enrollmentId: e.id,
        content: finished
          ? releaseThanksMail({ ...base, finalVersion: final?.version ?? 0, fileCount: (final?.files ?? []).length })
          : closingNoteMail(base),
      });
      if (row) {
        if (finished) thanks += 1;
        else closing += 1;
      }
    } catch (error) {
      console.error(`[mail] release mail to ${user.email} not recorded:`, error);
    }
  }
  const codes = await assignAndSendRewardCodes(trial, deps);
  return { thanks, closing, codes };
}

/** Sizes of the pattern by id, for the labels of lists. */
export async function sizeLabels(patternId: string) {
  return new Map((await PatternSize.findAll({ where: { patternId } })).map((s) => [s.id, s.label]));
}
