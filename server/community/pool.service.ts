import { Op } from 'sequelize';
import type { z } from 'zod';
import { Application, Enrollment, Milestone, PatternSize, PatternVariant, PoolInvitation, Report, Studio, Trial, User } from '../../db/models';
import type { Config } from '../config';
import { POOL_HEIGHT_BANDS, poolBandOf, type copyTrialSchema, type poolInviteSchema, type PoolQuery } from '../domain/schemas/release';
import { TESTER_MILESTONES } from '../domain/trials';
import { badRequest, conflict } from '../errors';
import type { Mailer } from '../mail/mailer';
import { poolInvitationMail } from '../mail/release-templates';
import { optOutFor, send as sendMail } from '../outbox/outbox.service';
import { formatDue } from '../trials/trial-mail';
import { createTrial, loadTrial } from '../trials/trials.service';

type MailDeps = { config: Config; mailer: Mailer };
type Row = Enrollment & { user: User; trial: Trial; reports?: Report[]; application?: Application };

/**
 * The studio's tester pool: everyone who was a tester in one of its trials (and still has an
 * account), with the sizes and variants they sewed, their height band (from the measurements
 * they last applied with; the band only, not the number), how many of their reports came on time
 * and how many trials they finished. Filtered as asked.
 */
export async function testerPool(studioId: string, filter: PoolQuery = {}, now = new Date()) {
  const rows = (await Enrollment.findAll({
    include: [
      { model: Trial, as: 'trial', required: true, where: { studioId }, attributes: ['id', 'title', 'state', 'releasedAt', 'patternId'] },
      { model: User, as: 'user', required: true, where: { deletedAt: null }, attributes: ['id', 'name', 'email'] },
      { model: Report, as: 'reports' },
      { model: Application, as: 'application', attributes: ['id', 'profileSnapshot', 'appliedAt', 'variantId'] },
    ],
    order: [['createdAt', 'ASC']],
  })) as Row[];
  const trialIds = [...new Set(rows.map((r) => r.trialId))];
  const milestones = trialIds.length ? await Milestone.findAll({ where: { trialId: { [Op.in]: trialIds } } }) : [];
  const sizeIds = [...new Set(rows.map((r) => r.sizeId))];
  const sizes = new Map((sizeIds.length ? await PatternSize.findAll({ where: { id: { [Op.in]: sizeIds } } }) : []).map((s) => [s.id, s.label]));
  const variantIds = [...new Set(rows.map((r) => r.variantId).filter((v): v is string => Boolean(v)))];
  const variants = new Map((variantIds.length ? await PatternVariant.findAll({ where: { id: { [Op.in]: variantIds } } }) : []).map((v) => [v.id, v.name]));
  const invitations = trialIds.length ? await PoolInvitation.findAll({ where: { trialId: { [Op.in]: (await Trial.findAll({ where: { studioId }, attributes: ['id'] })).map((t) => t.id) } }, include: [{ model: Trial, as: 'trial', attributes: ['id', 'title'] }] }) : [];

  const people = new Map<string, ReturnType<typeof emptyPerson>>();
  function emptyPerson(user: User) {
    return {
      userId: user.id,
      name: user.name,
      email: user.email,
      sizes: [] as string[],
      variants: [] as string[],
      heightMm: null as number | null,
      heightAt: 0,
      trials: [] as { trialId: string; title: string; size: string; status: Enrollment['status']; finished: boolean }[],
      trialsFinished: 0,
      reports: { onTime: 0, late: 0, missed: 0 },
      lastTrialAt: null as Date | null,
      invitedTo: [] as { trialId: string; title: string; sentAt: Date | null }[],
    };
  }
  for (const r of rows) {
    const p = people.get(r.userId) ?? emptyPerson(r.user);
    people.set(r.userId, p);
    const size = sizes.get(r.sizeId) ?? '?';
    p.trials.push({ trialId: r.trialId, title: r.trial.title, size, status: r.status, finished: r.status === 'finished' });
    if (r.status === 'finished') p.trialsFinished += 1;
    // Sizes and variants sewn: the ones reported, else the ones enrolled in.
    const reported = (r.reports ?? []).filter((x) => x.submittedAt);
    const sewn = reported.map((x) => x.content.sizeSewn).filter((s): s is string => Boolean(s));
    for (const s of sewn.length ? sewn : [size]) if (!p.sizes.includes(s)) p.sizes.push(s);
    const variantSewn = reported.map((x) => x.content.variantSewn).filter((v): v is string => Boolean(v));
    const enrolledVariant = r.variantId ? variants.get(r.variantId) : undefined;
    for (const v of variantSewn.length ? variantSewn : enrolledVariant ? [enrolledVariant] : []) if (!p.variants.includes(v)) p.variants.push(v);
    const snapshot = r.application?.profileSnapshot as { measurementsMm?: Record<string, number> } | undefined;
    const applied = r.application?.appliedAt?.getTime() ?? 0;
    if (typeof snapshot?.measurementsMm?.height === 'number' && applied >= p.heightAt) {
      p.heightMm = snapshot.measurementsMm.height;
      p.heightAt = applied;
    }
    if (!p.lastTrialAt || r.createdAt > p.lastTrialAt) p.lastTrialAt = r.createdAt;
    // Each report the tester owed: on time, late, or missed once its due time passed.
    for (const kind of TESTER_MILESTONES) {
      const trialDue = milestones.find((m) => m.trialId === r.trialId && m.kind === kind)?.dueAt;
      const due = r.dueOverrides[kind] ? new Date(r.dueOverrides[kind]) : trialDue;
      const stage = kind === 'toile-check-in' ? 'check-in' : 'final';
      const report = reported.find((x) => x.stage === stage);
      if (report) {
        if (!due || report.submittedAt! <= due) p.reports.onTime += 1;
        else p.reports.late += 1;
      } else if (due && due < now && r.status !== 'dropped' && !r.excusedAt) {
        p.reports.missed += 1;
      }
    }
  }
  for (const inv of invitations) {
    const p = people.get(inv.userId);
    const trial = (inv as PoolInvitation & { trial?: Trial }).trial;
    if (p && trial) p.invitedTo.push({ trialId: trial.id, title: trial.title, sentAt: inv.sentAt });
  }

  const bandLabel = new Map<string, string>(POOL_HEIGHT_BANDS.map((b) => [b.id, b.label]));
  const all = [...people.values()].map(({ heightMm, heightAt: _at, ...p }) => {
    const band = poolBandOf(heightMm);
    const owed = p.reports.onTime + p.reports.late + p.reports.missed;
    return { ...p, heightBand: band ? { id: band, label: bandLabel.get(band)! } : null, allOnTime: owed > 0 && p.reports.onTime === owed };
  });
  const variantWanted = filter.variant?.toLowerCase();
  const sizeWanted = filter.size?.toLowerCase();
  return all
    .filter((p) => !sizeWanted || p.sizes.some((s) => s.toLowerCase() === sizeWanted))
    .filter((p) => !filter.band || p.heightBand?.id === filter.band)
    .filter((p) => !variantWanted || p.variants.some((v) => v.toLowerCase().includes(variantWanted)))
    .filter((p) => filter.minFinished === undefined || p.trialsFinished >= filter.minFinished)
    .filter((p) => filter.onTime !== 'true' || p.allOnTime)
    .sort((a, b) => b.trialsFinished - a.trialsFinished || a.name.localeCompare(b.name));
}

/** Calls the pool can be invited to: the studio's trials whose call is open or not yet public. */
export async function invitableTrials(studioId: string) {
  return (await Trial.findAll({ where: { studioId, state: { [Op.in]: ['draft', 'open'] } }, order: [['createdAt', 'DESC']] })).map((t) => ({ id: t.id, title: t.title, state: t.state }));
}

/**
 * Invites chosen people of the pool to a call: each gets one e-mail with the call's link (they
 * still apply like anyone else). For a call not yet open the invitations wait and go out when it
 * opens. Someone invited before, or who applied already, is not asked again.
 */
export async function inviteFromPool(studioId: string, inviter: User, input: z.output<typeof poolInviteSchema>, deps: MailDeps) {
  const trial = await Trial.findOne({ where: { id: input.trialId, studioId } });
  if (!trial) throw badRequest('Choose one of the studio’s calls.', { trialId: 'is not a trial of this studio' });
  if (trial.state !== 'open' && trial.state !== 'draft') {
    throw conflict('Invitations go to a call that is open or not yet public; this trial is past its call.', { trialId: 'the call is closed' });
  }
  const pool = new Set((await testerPool(studioId)).map((p) => p.userId));
  const fields: Record<string, string> = {};
  input.userIds.forEach((id, i) => {
    if (!pool.has(id)) fields[`userIds.${i}`] = 'is not in the studio’s tester pool';
  });
  if (Object.keys(fields).length) throw badRequest('Invite people from the studio’s tester pool.', fields);
  const applied = new Set((await Application.findAll({ where: { trialId: trial.id, userId: { [Op.in]: input.userIds } }, attributes: ['userId'] })).map((a) => a.userId));
  let invited = 0;
  let already = 0;
  for (const userId of new Set(input.userIds)) {
    if (applied.has(userId)) continue;
    const [, created] = await PoolInvitation.findOrCreate({ where: { trialId: trial.id, userId }, defaults: { trialId: trial.id, userId, invitedById: inviter.id } });
    if (created) invited += 1;
    else already += 1;
  }
  const sent = trial.state === 'open' ? await sendPendingPoolInvitations(trial, deps) : 0;
  return { invited, alreadyInvited: already, alreadyApplied: applied.size, sent, waitingForCall: trial.state === 'open' ? 0 : invited };
}

/** Sends the invitations that wait for this call to open (once each: the outbox key is the trial and person). */
export async function sendPendingPoolInvitations(trial: Trial, deps: MailDeps): Promise<number> {
  if (trial.state !== 'open') return 0;
  const waiting = await PoolInvitation.findAll({ where: { trialId: trial.id, sentAt: null }, include: [{ model: User, as: 'user', required: true, where: { deletedAt: null } }] });
  if (waiting.length === 0) return 0;
  const studio = (await Studio.findByPk(trial.studioId))!;
  const close = (await Milestone.findOne({ where: { trialId: trial.id, kind: 'applications-close' } }))?.dueAt ?? null;
  let sent = 0;
  for (const inv of waiting) {
    const user = (inv as PoolInvitation & { user: User }).user;
    if (await Application.count({ where: { trialId: trial.id, userId: user.id } })) {
      await inv.update({ sentAt: new Date() });
      continue;
    }
    try {
      await sendMail(deps, {
        key: `pool-invite:${trial.id}:${user.id}`,
        to: { id: user.id, email: user.email },
        template: 'pool-invitation',
        category: 'trial-news',
        studioId: trial.studioId,
        trialId: trial.id,
        content: poolInvitationMail({
          name: user.name,
          trialTitle: trial.title,
          studioName: studio.name,
          link: `${deps.config.publicUrl}/call/${trial.slug}`,
          closesOn: close ? formatDue(close, user.timeZone) : null,
          optOut: optOutFor(deps.config, user.id, 'trial-news'),
        }),
      });
      await inv.update({ sentAt: new Date() });
      sent += 1;
    } catch (error) {
      console.error(`[mail] pool invitation to ${user.email} not recorded:`, error);
    }
  }
  return sent;
}

/**
 * A next round of a trial: the same pattern, call, requirements and targets, every date moved by
 * the same number of days, as a draft (not public). Optionally the finishers of this round are
 * invited; their invitations go out when the new call opens.
 */
export async function copyTrial(studioId: string, trialId: string, inviter: User, input: z.output<typeof copyTrialSchema>) {
  const source = await loadTrial(studioId, trialId);
  const shift = input.shiftDays * 86_400_000;
  const sizeIds = new Set((source.pattern?.sizes ?? []).map((s) => s.id));
  const variantIds = new Set((source.pattern?.variants ?? []).map((v) => v.id));
  const copy = await createTrial(studioId, {
    patternId: source.patternId,
    title: input.title,
    callText: source.callText,
    requirements: source.requirements,
    // Sizes or variants removed from the pattern since are left out of the copy.
    coverage: {
      sizes: source.coverage.sizes.filter((s) => sizeIds.has(s.sizeId)),
      heightBands: source.coverage.heightBands,
      variants: source.coverage.variants.filter((v) => variantIds.has(v)),
    },
    milestones: Object.fromEntries((source.milestones ?? []).map((m) => [m.kind, new Date(m.dueAt.getTime() + shift).toISOString()])),
  });
  await copy.update({ copiedFromId: source.id });
  let invited = 0;
  if (input.inviteFinishers) {
    const finishers = await Enrollment.findAll({ where: { trialId: source.id, status: 'finished' }, include: [{ model: User, as: 'user', required: true, where: { deletedAt: null } }] });
    for (const f of finishers) {
      const [, created] = await PoolInvitation.findOrCreate({ where: { trialId: copy.id, userId: f.userId }, defaults: { trialId: copy.id, userId: f.userId, invitedById: inviter.id } });
      if (created) invited += 1;
    }
  }
  return { trial: await loadTrial(studioId, copy.id), invitationsWaiting: invited };
}
