import { Op } from 'sequelize';
import type { z } from 'zod';
import { Announcement, AnnouncementRecipient, Enrollment, OutboxMessage, Studio, Trial, User } from '../../db/models';
import type { AnnouncementAudience } from '../../db/models/community';
import type { Config } from '../config';
import type { announcementSchema } from '../domain/schemas/release';
import { resolveStudioSettings } from '../domain/studio-settings';
import { badRequest, conflict } from '../errors';
import type { Mailer } from '../mail/mailer';
import { announcementMail } from '../mail/release-templates';
import { optOutFor, send as sendMail } from '../outbox/outbox.service';
import { loadTrial } from '../trials/trials.service';

/**
 * Sends a message from the staff to a trial's testers, all or a filtered set (by where they are in
 * the trial, and by size). Every copy goes through the outbox under a key of the announcement and
 * the person, with Reply-To set to the studio's own address, so answers reach the studio rather
 * than Basted's no-reply sender. The message is kept on the trial and shown in My trials.
 */
export async function sendAnnouncement(studioId: string, trialId: string, author: User, input: z.output<typeof announcementSchema>, deps: { config: Config; mailer: Mailer }) {
  const trial = await loadTrial(studioId, trialId);
  const studio = (await Studio.findByPk(studioId))!;
  const replyTo = resolveStudioSettings(studio.settings).contactEmail;
  if (!replyTo) {
    throw conflict('Set the studio’s contact address first (Members page, owner only): testers answer to it.', { replyTo: 'the studio has no contact address' });
  }
  const sizeIds = new Set((trial.pattern?.sizes ?? []).map((s) => s.id));
  const fields: Record<string, string> = {};
  input.sizeIds.forEach((id, i) => {
    if (!sizeIds.has(id)) fields[`sizeIds.${i}`] = 'is not a size of the pattern';
  });
  if (Object.keys(fields).length) throw badRequest('Choose sizes of the trial’s pattern.', fields);

  const enrollments = (await Enrollment.findAll({
    where: { trialId: trial.id, status: { [Op.in]: input.statuses }, ...(input.sizeIds.length ? { sizeId: { [Op.in]: input.sizeIds } } : {}) },
    include: [{ model: User, as: 'user', required: true, where: { deletedAt: null } }],
  })) as (Enrollment & { user: User })[];
  if (enrollments.length === 0) throw badRequest('No tester matches that choice; nothing was sent.', { statuses: 'no tester matches' });

  const audience: AnnouncementAudience = { statuses: input.statuses, sizeIds: input.sizeIds };
  const announcement = await Announcement.sequelize!.transaction(async (transaction) => {
    const created = await Announcement.create({ trialId: trial.id, authorId: author.id, subject: input.subject, body: input.body, audience, replyTo }, { transaction });
    await AnnouncementRecipient.bulkCreate(
      [...new Set(enrollments.map((e) => e.userId))].map((userId) => ({ announcementId: created.id, userId })),
      { transaction },
    );
    return created;
  });
  for (const e of enrollments) {
    try {
      await sendMail(deps, {
        key: `announcement:${announcement.id}:${e.userId}`,
        to: { id: e.userId, email: e.user.email },
        template: 'announcement',
        category: 'trial-news',
        studioId,
        trialId: trial.id,
        enrollmentId: e.id,
        headers: { 'Reply-To': replyTo },
        content: announcementMail({
          name: e.user.name,
          trialTitle: trial.title,
          studioName: studio.name,
          link: `${deps.config.publicUrl}/my-trials`,
          subject: input.subject,
          body: input.body,
          replyTo,
          optOut: optOutFor(deps.config, e.userId, 'trial-news'),
        }),
      });
    } catch (error) {
      console.error(`[mail] announcement to ${e.user.email} not recorded:`, error);
    }
  }
  return (await listAnnouncements(studioId, trialId))[0];
}

/** A trial's announcements, newest first, with how many people each went to and how the mail went. */
export async function listAnnouncements(studioId: string, trialId: string) {
  const trial = await Trial.findOne({ where: { id: trialId, studioId } });
  if (!trial) return [];
  const rows = await Announcement.findAll({
    where: { trialId },
    include: [{ model: User, as: 'author', attributes: ['name', 'deletedAt'] }, { model: AnnouncementRecipient, as: 'recipients' }],
    order: [['createdAt', 'DESC']],
  });
  const mail = await OutboxMessage.findAll({ where: { trialId, template: 'announcement' }, attributes: ['idempotencyKey', 'status'] });
  return rows.map((a) => {
    const mine = mail.filter((m) => m.idempotencyKey.startsWith(`announcement:${a.id}:`));
    return {
      id: a.id,
      subject: a.subject,
      body: a.body,
      audience: a.audience,
      replyTo: a.replyTo,
      author: a.author && !a.author.deletedAt ? a.author.name : null,
      createdAt: a.createdAt,
      recipients: (a.recipients ?? []).length,
      mail: {
        sent: mine.filter((m) => m.status === 'sent').length,
        skipped: mine.filter((m) => m.status === 'skipped').length,
        waiting: mine.filter((m) => m.status === 'queued' || m.status === 'sending').length,
        failed: mine.filter((m) => m.status === 'failed').length,
      },
    };
  });
}

/** The announcements sent to one person, newest first, by trial: what My trials shows them. */
export async function myAnnouncements(user: User) {
  const rows = await AnnouncementRecipient.findAll({ where: { userId: user.id } });
  if (rows.length === 0) return [];
  const announcements = await Announcement.findAll({
    where: { id: { [Op.in]: rows.map((r) => r.announcementId) } },
    include: [{ model: Trial, as: 'trial', attributes: ['id', 'title', 'studioId'] }],
    order: [['createdAt', 'DESC']],
  });
  const studios = new Map((await Studio.findAll({ where: { id: [...new Set(announcements.map((a) => (a as Announcement & { trial: Trial }).trial.studioId))] } })).map((s) => [s.id, s.name]));
  return announcements.map((a) => {
    const trial = (a as Announcement & { trial: Trial }).trial;
    return { id: a.id, trialId: trial.id, trialTitle: trial.title, studioName: studios.get(trial.studioId) ?? '', subject: a.subject, body: a.body, replyTo: a.replyTo, createdAt: a.createdAt };
  });
}
