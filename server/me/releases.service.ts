import { Op } from 'sequelize';
import { Draft, DraftDownload, DraftFile, Enrollment, RewardCode, Studio, Trial, type User } from '../../db/models';
import { notFound, notYours } from '../errors';
import type { Storage } from '../storage/storage';
import { SIGNED_URL_SECONDS } from '../storage/storage';

/**
 * The released trials a person tested in: for a finisher the final draft's files and their reward
 * code, for everyone the release date. What My trials shows once a trial is out.
 */
export async function myReleases(user: User) {
  const enrollments = (await Enrollment.findAll({
    where: { userId: user.id },
    include: [{ model: Trial, as: 'trial', required: true, where: { releasedAt: { [Op.ne]: null } } }],
  })) as (Enrollment & { trial: Trial })[];
  if (enrollments.length === 0) return [];
  const studios = new Map((await Studio.findAll({ where: { id: [...new Set(enrollments.map((e) => e.trial.studioId))] } })).map((s) => [s.id, s.name]));
  const codes = await RewardCode.findAll({ where: { enrollmentId: enrollments.map((e) => e.id) } });
  return Promise.all(
    enrollments.map(async (e) => {
      const finished = e.status === 'finished';
      const final = finished && e.trial.finalDraftId ? await Draft.findByPk(e.trial.finalDraftId, { include: [{ model: DraftFile, as: 'files' }] }) : null;
      return {
        trialId: e.trial.id,
        trialTitle: e.trial.title,
        studioName: studios.get(e.trial.studioId) ?? '',
        releasedAt: e.trial.releasedAt,
        finished,
        finalDraft: final
          ? { version: final.version, changeNote: final.changeNote, files: (final.files ?? []).map((f) => ({ id: f.id, kind: f.kind, name: f.originalName, bytes: f.bytes })) }
          : null,
        rewardCode: codes.find((c) => c.enrollmentId === e.id)?.code ?? null,
      };
    }),
  );
}

/**
 * A short-lived link to a file of a released trial's final draft, for a tester who finished that
 * trial (the studio's staff use the drafts' own links). Logged like every download.
 */
export async function finalFileLink(fileId: string, user: User, storage: Storage) {
  const file = await DraftFile.findByPk(fileId);
  if (!file) throw notFound('file');
  const finisher = await Enrollment.count({
    where: { userId: user.id, status: 'finished' },
    include: [{ model: Trial, as: 'trial', required: true, where: { finalDraftId: file.draftId, releasedAt: { [Op.ne]: null } } }],
  });
  if (!finisher) throw notYours('file');
  await DraftDownload.create({ draftFileId: file.id, userId: user.id });
  return { url: await storage.signedUrl('drafts', file.objectKey, file.originalName), expiresInSeconds: SIGNED_URL_SECONDS };
}
