import { randomUUID } from 'node:crypto';
import { Op } from 'sequelize';
import { Draft, DraftDownload, DraftFile, Enrollment, Membership, Pattern, Studio, Trial, User } from '../../db/models';
import type { Config } from '../config';
import type { DraftFileKind } from '../domain/drafts';
import { can } from '../domain/policy';
import { badRequest, notFound, notYours } from '../errors';
import { checkDraftFile } from '../files/content-check';
import { unstorableParts } from '../middleware/storable-input';
import type { Mailer } from '../mail/mailer';
import { newDraftMail } from '../mail/templates';
import { optOutFor, send as sendMail } from '../outbox/outbox.service';
import type { Storage } from '../storage/storage';

export type UploadedFile = { kind: DraftFileKind; originalName: string; buffer: Buffer };

/**
 * A new draft version: every file checked by its content first, then stored under an opaque key,
 * then the rows written. If the store fails nothing is kept; if the rows fail, the stored objects
 * are removed again. Enrolled testers of the pattern's running trials are told by e-mail.
 */
export async function createDraft(
  args: { studioId: string; patternId: string; changeNote: string; files: UploadedFile[]; user: User },
  deps: { config: Config; storage: Storage; mailer: Mailer },
) {
  const pattern = await Pattern.findOne({ where: { id: args.patternId, studioId: args.studioId } });
  if (!pattern) throw notFound('pattern');
  if (args.files.length === 0) throw badRequest('Add at least one PDF file to the draft.', { files: 'no file was sent' });
  // The name is kept and shown: it must be text the database can hold.
  const badNames = Object.fromEntries(args.files.flatMap((f) => Object.values(unstorableParts(f.originalName)).map((problem) => [f.kind, `the file name ${problem}`])));
  if (Object.keys(badNames).length) throw badRequest('Rename the file and send it again.', badNames);
  for (const file of args.files) await checkDraftFile(file.buffer, file.originalName);

  const stored: string[] = [];
  try {
    const keyed: (UploadedFile & { key: string })[] = [];
    for (const file of args.files) {
      const key = `drafts/${randomUUID()}.pdf`;
      await deps.storage.put('drafts', key, file.buffer, 'application/pdf');
      stored.push(key);
      keyed.push({ ...file, key });
    }
    const draft = await Draft.sequelize!.transaction(async (transaction) => {
      // The pattern row is locked so two uploads at once get consecutive version numbers.
      await Pattern.findByPk(pattern.id, { lock: transaction.LOCK.UPDATE, transaction });
      const last = (await Draft.max('version', { where: { patternId: pattern.id }, transaction })) as number | null;
      const created = await Draft.create({ patternId: pattern.id, version: (last ?? 0) + 1, changeNote: args.changeNote, createdById: args.user.id }, { transaction });
      for (const f of keyed) {
        await DraftFile.create({ draftId: created.id, kind: f.kind, originalName: f.originalName.slice(0, 200), objectKey: f.key, bytes: f.buffer.length }, { transaction });
      }
      return created;
    });
    await tellTesters(pattern, draft, deps);
    return loadDraft(draft.id);
  } catch (error) {
    await Promise.allSettled(stored.map((key) => deps.storage.remove('drafts', key)));
    throw error;
  }
}

async function tellTesters(pattern: Pattern, draft: Draft, deps: { config: Config; mailer: Mailer }) {
  const trials = await Trial.findAll({ where: { patternId: pattern.id, state: { [Op.in]: ['open', 'running'] } } });
  const studio = await Studio.findByPk(pattern.studioId);
  for (const trial of trials) {
    const enrolled = await Enrollment.findAll({ where: { trialId: trial.id, status: 'active' }, include: [{ model: User, as: 'user' }] });
    for (const e of enrolled) {
      const user = (e as Enrollment & { user?: User }).user;
      // A tester who turned trial news off gets a skipped row in the outbox, not a message.
      if (!user) continue;
      try {
        await sendMail(deps, {
          key: `new-draft:${draft.id}:${trial.id}:${user.id}`,
          to: { id: user.id, email: user.email },
          template: 'new-draft',
          category: 'trial-news',
          studioId: trial.studioId,
          trialId: trial.id,
          enrollmentId: e.id,
          content: newDraftMail({
            name: user.name,
            trialTitle: trial.title,
            studioName: studio?.name ?? '',
            link: `${deps.config.publicUrl}/my-trials`,
            version: draft.version,
            changeNote: draft.changeNote,
            optOut: optOutFor(deps.config, user.id, 'trial-news'),
          }),
        });
      } catch (error) {
        console.error(`[mail] new-draft mail to ${user.email} not recorded:`, error);
      }
    }
  }
}

export async function loadDraft(draftId: string) {
  return (await Draft.findByPk(draftId, { include: [{ model: DraftFile, as: 'files' }], order: [[{ model: DraftFile, as: 'files' }, 'kind', 'ASC']] }))!;
}

/** The draft history of one of the studio's own patterns; another studio's pattern is not found. */
export async function listDrafts(studioId: string, patternId: string) {
  const pattern = await Pattern.findOne({ where: { id: patternId, studioId } });
  if (!pattern) throw notFound('pattern');
  return Draft.findAll({
    where: { patternId: pattern.id },
    include: [{ model: DraftFile, as: 'files', include: [{ model: DraftDownload, as: 'downloads', include: [{ model: User, as: 'user' }] }] }],
    order: [['version', 'DESC']],
  });
}

/** Enrolments whose tester may open the draft files: testing now, or finished. */
const KEEPS_FILES = ['active', 'finished'];

/**
 * A short-lived link to one file, only after the access check: the studio's staff, or a tester
 * enrolled in a trial of that pattern, still testing or finished (a finished tester keeps the
 * files they sewed from; one who left does not). Every link handed out is logged.
 */
export async function downloadLink(fileId: string, user: User, storage: Storage) {
  const file = await DraftFile.findByPk(fileId, { include: [{ model: Draft, as: 'draft', include: [{ model: Pattern, as: 'pattern' }] }] });
  const pattern = file?.draft?.pattern;
  if (!file || !pattern) throw notFound('file');
  const membership = await Membership.findOne({ where: { studioId: pattern.studioId, userId: user.id } });
  const staff = can(membership?.role, 'patterns.read');
  const enrolled =
    !staff &&
    (await Enrollment.count({
      where: { userId: user.id, status: { [Op.in]: KEEPS_FILES } },
      include: [{ model: Trial, as: 'trial', where: { patternId: pattern.id }, required: true }],
    })) > 0;
  // Refused before any link is made or any download logged.
  if (!staff && !enrolled) throw notYours('file');
  await DraftDownload.create({ draftFileId: file.id, userId: user.id });
  return { url: await storage.signedUrl('drafts', file.objectKey, file.originalName), expiresInSeconds: 300 };
}

/** The drafts of a trial's pattern for an enrolled tester (or its staff). */
export async function draftsForTrial(trialId: string, user: User) {
  const trial = await Trial.findByPk(trialId);
  if (!trial) throw notFound('trial');
  const membership = await Membership.findOne({ where: { studioId: trial.studioId, userId: user.id } });
  const enrolled = await Enrollment.count({ where: { trialId, userId: user.id, status: { [Op.in]: KEEPS_FILES } } });
  if (!enrolled && !can(membership?.role, 'patterns.read')) throw notYours('trial');
  return Draft.findAll({ where: { patternId: trial.patternId }, include: [{ model: DraftFile, as: 'files' }], order: [['version', 'DESC']] });
}
