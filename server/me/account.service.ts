import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { Op } from 'sequelize';
import {
  AnnouncementRecipient,
  Application,
  CalendarFeed,
  DraftDownload,
  Enrollment,
  Invitation,
  Membership,
  OutboxMessage,
  PasswordReset,
  Photo,
  PoolInvitation,
  Report,
  Studio,
  TesterProfile,
  Trial,
  User,
} from '../../db/models';
import type { z } from 'zod';
import type { deleteAccountSchema } from '../domain/schemas/release';
import { badRequest, conflict, unavailable } from '../errors';
import { refreshFindingsQuietly } from '../findings/findings.service';
import type { Storage } from '../storage/storage';

/** The name a deleted account's reports carry in a studio's lists from then on. */
export const FORMER_TESTER = 'Former tester';

export const DELETION_NOTICE =
  'Your account, your body measurements and your photos are deleted. Reports you already sent stay in the studios’ findings without your name, e-mail or measurements, so the counts the designers worked from do not change.';

/**
 * Deletes a person's account: their photos (stored objects and rows), body measurements (the
 * profile and the copies in their applications), sign-in, memberships, calendar feed and every
 * other row that names them. Reports already sent stay, because studios' findings count them:
 * they keep pointing at an anonymous account row ("Former tester"), never at the person.
 *
 * Every table that refers to a person is handled here, in one place, so a new table that names
 * people adds its line here. A studio's only owner must hand it over or delete it first.
 */
export async function deleteAccount(user: User, input: z.output<typeof deleteAccountSchema>, storage: Storage) {
  const withHash = await User.scope('withPassword').findByPk(user.id);
  if (!withHash || !(await bcrypt.compare(input.password, withHash.passwordHash))) {
    throw badRequest('That is not your password; nothing was deleted.', { password: 'is not your password' });
  }
  const owned = await Membership.findAll({ where: { userId: user.id, role: 'owner' }, include: [{ model: Studio, as: 'studio' }] });
  for (const m of owned) {
    const owners = await Membership.count({ where: { studioId: m.studioId, role: 'owner' } });
    if (owners === 1) {
      throw conflict(`You are the only owner of ${m.studio?.name ?? 'a studio'}: make someone else its owner, or delete the studio, before deleting your account.`, {
        account: 'only owner of a studio',
      });
    }
  }

  const enrollments = await Enrollment.findAll({ where: { userId: user.id } });
  const enrollmentIds = enrollments.map((e) => e.id);
  const photos = await Photo.findAll({ where: { enrollmentId: { [Op.in]: enrollmentIds } } });
  // Photos first: if the store cannot remove them, nothing else changes and the person can try again.
  try {
    for (const p of photos) {
      await storage.remove('photos', p.fullKey);
      await storage.remove('photos', p.thumbKey);
    }
  } catch (error) {
    console.error('[account] photo removal failed:', error);
    throw unavailable('Your photos could not be removed just now, so nothing was deleted. Please try again in a few minutes.');
  }

  const reportTrials = await Report.findAll({ where: { enrollmentId: { [Op.in]: enrollmentIds }, submittedAt: { [Op.ne]: null } }, attributes: ['enrollmentId'] });
  const anonymousEmail = `deleted-${user.id}@deleted.basted.invalid`;
  await User.sequelize!.transaction(async (transaction) => {
    await Photo.destroy({ where: { enrollmentId: { [Op.in]: enrollmentIds } }, transaction });
    await TesterProfile.destroy({ where: { userId: user.id }, transaction });
    await PasswordReset.destroy({ where: { userId: user.id }, transaction });
    await Membership.destroy({ where: { userId: user.id }, transaction });
    await Invitation.destroy({ where: { email: user.email, acceptedAt: null }, transaction });
    await CalendarFeed.destroy({ where: { userId: user.id }, transaction });
    await PoolInvitation.destroy({ where: { userId: user.id }, transaction });
    await AnnouncementRecipient.destroy({ where: { userId: user.id }, transaction });
    await DraftDownload.destroy({ where: { userId: user.id }, transaction });
    // The copies of the profile and size advice made when applying hold the measurements.
    await Application.update(
      { profileSnapshot: {}, adviceSnapshot: null, note: null, plannedFabric: '—', decisionReason: null },
      { where: { userId: user.id }, transaction },
    );
    // Applications still waiting for a decision are withdrawn: nobody is left to choose.
    await Application.update({ status: 'withdrawn', decidedAt: new Date() }, { where: { userId: user.id, status: { [Op.in]: ['applied', 'shortlisted', 'waitlisted'] } }, transaction });
    await Enrollment.update({ status: 'dropped', excuseNote: null }, { where: { userId: user.id, status: 'active' }, transaction });
    // Mail: nothing more goes out, and what went out no longer names them.
    await OutboxMessage.update({ status: 'cancelled', lastError: 'Not sent: the recipient deleted their account.' }, { where: { recipientId: user.id, status: 'queued' }, transaction });
    await OutboxMessage.update({ recipientEmail: anonymousEmail, text: null, html: null }, { where: { recipientId: user.id }, transaction });
    await User.update(
      {
        email: anonymousEmail,
        name: FORMER_TESTER,
        // No password opens this account again: a random value that is not a bcrypt hash.
        passwordHash: `deleted:${randomBytes(24).toString('hex')}`,
        sessionVersion: (user.sessionVersion ?? 0) + 1,
        currentStudioId: null,
        mailReminders: false,
        mailTrialNews: false,
        mailDigest: false,
        deletedAt: new Date(),
      },
      { where: { id: user.id }, transaction },
    );
  });

  // The body differences behind "personal fit" came from the measurements just removed.
  const trialIds = [...new Set(enrollments.filter((e) => reportTrials.some((r) => r.enrollmentId === e.id)).map((e) => e.trialId))];
  for (const trial of await Trial.findAll({ where: { id: { [Op.in]: trialIds } } })) await refreshFindingsQuietly(trial);
  return { deleted: true, photosRemoved: photos.length, reportsKept: reportTrials.length, notice: DELETION_NOTICE };
}
