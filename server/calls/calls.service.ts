import { UniqueConstraintError, type Sequelize } from 'sequelize';
import type { z } from 'zod';
import { Application, Enrollment, Milestone, Pattern, PatternSize, PatternVariant, Report, Studio, TesterProfile, Trial, type User } from '../../db/models';
import type { MeasurementKey } from '../domain/measurements';
import type { applySchema } from '../domain/schemas/trials';
import { MILESTONE_KINDS, MILESTONE_LABELS, TESTER_EXPECTATIONS, TESTER_MILESTONES, type MilestoneKind } from '../domain/trials';
import { conflict, notFound, badRequest } from '../errors';
import type { Config } from '../config';
import type { Mailer } from '../mail/mailer';
import { applicationReceivedMail } from '../mail/templates';
import { cancelObsoleteReminders, optOutFor, send as sendMail } from '../outbox/outbox.service';
import { adviceFor } from '../patterns/size-advice.service';
import { purgeSoon } from '../storage/object-deletions';
import type { Storage } from '../storage/storage';
import { formatDue, sendDecisionMail } from '../trials/trial-mail';
import { loadTrial, withdraw } from '../trials/trials.service';
import { serializeUser } from '../serializers';

/** A call is public while the trial is open or running; drafts and closed trials are not found. */
async function publicTrial(slug: string) {
  const trial = await Trial.findOne({
    where: { slug, state: ['open', 'running'] },
    include: [
      { model: Milestone, as: 'milestones' },
      { model: Pattern, as: 'pattern', include: [{ model: PatternSize, as: 'sizes' }, { model: PatternVariant, as: 'variants' }] },
    ],
    order: [[{ model: Pattern, as: 'pattern' }, { model: PatternSize, as: 'sizes' }, 'position', 'ASC']],
  });
  if (!trial) throw notFound('call for testers');
  return trial;
}

function closesAt(trial: Trial): Date | null {
  return trial.milestones?.find((m) => m.kind === 'applications-close')?.dueAt ?? null;
}

export async function callBySlug(slug: string) {
  const trial = await publicTrial(slug);
  const studio = (await Studio.findByPk(trial.studioId))!;
  const wanted = new Set(trial.coverage.sizes.map((s) => s.sizeId));
  const close = closesAt(trial);
  return {
    slug: trial.slug,
    title: trial.title,
    studio: { name: studio.name, timeZone: studio.timeZone },
    pattern: { name: trial.pattern!.name, category: trial.pattern!.category, fabricKind: trial.pattern!.fabricKind, minStretchPct: trial.pattern!.minStretchPct },
    callText: trial.callText,
    requirements: trial.requirements,
    state: trial.state,
    accepting: trial.state === 'open' && (!close || close > new Date()),
    closesAt: close,
    sizes: (trial.pattern!.sizes ?? []).filter((s) => wanted.has(s.id)).map((s) => ({ id: s.id, label: s.label })),
    variants: (trial.pattern!.variants ?? []).filter((v) => trial.coverage.variants.includes(v.id)).map((v) => ({ id: v.id, name: v.name })),
    milestones: MILESTONE_KINDS.flatMap((kind) => {
      const m = trial.milestones?.find((x) => x.kind === kind);
      return m ? [{ kind, label: MILESTONE_LABELS[kind], dueAt: m.dueAt }] : [];
    }),
  };
}

export async function adviceForCall(slug: string, user: User) {
  const trial = await publicTrial(slug);
  const profile = await TesterProfile.findByPk(user.id);
  const measurementsMm = (profile?.measurementsMm ?? {}) as Partial<Record<MeasurementKey, number>>;
  return { measurementsMm, advice: await adviceFor(trial.pattern!, measurementsMm, user.lengthUnit) };
}

/**
 * An application, with a snapshot of the tester's profile and size advice as they are now, so a
 * later change of profile does not rewrite what the studio decided on.
 */
export async function apply(slug: string, user: User, input: z.output<typeof applySchema>, deps: { config: Config; mailer: Mailer }) {
  const trial = await publicTrial(slug);
  const close = closesAt(trial);
  if (trial.state !== 'open' || (close && close <= new Date())) {
    throw conflict(close ? `Applications closed on ${formatDue(close, user.timeZone)}.` : 'This call is not taking applications.');
  }
  const wanted = new Set(trial.coverage.sizes.map((s) => s.sizeId));
  if (input.sizeId && !wanted.has(input.sizeId)) throw badRequest('Choose one of the sizes this call wants.', { sizeId: 'is not a size this call wants' });
  if (input.variantId && !trial.coverage.variants.includes(input.variantId)) throw badRequest('Choose one of the call’s variants.', { variantId: 'is not a variant of this call' });
  const existing = await Application.findOne({ where: { trialId: trial.id, userId: user.id } });
  if (existing) throw conflict('You have applied to this call already; see My trials.', { trial: 'already applied' });

  const profile = await TesterProfile.findByPk(user.id);
  const measurementsMm = (profile?.measurementsMm ?? {}) as Partial<Record<MeasurementKey, number>>;
  const advice = await adviceFor(trial.pattern!, measurementsMm, user.lengthUnit);
  let application: Application;
  try {
    application = await Application.create({
      trialId: trial.id,
      userId: user.id,
      sizeId: input.sizeId ?? (advice.size && wanted.has(advice.size.id) ? advice.size.id : null),
      variantId: input.variantId,
      profileSnapshot: { ...serializeUser(user), measurementsMm, experience: profile?.experience ?? null, fitNotes: profile?.fitNotes ?? null },
      adviceSnapshot: advice as unknown as Record<string, unknown>,
      plannedFabric: input.plannedFabric,
      experience: input.experience,
      photoConsent: input.photoConsent,
      note: input.note,
      appliedAt: new Date(),
    });
  } catch (error) {
    // Two submissions racing: the unique constraint answers for the second.
    if (error instanceof UniqueConstraintError) throw conflict('You have applied to this call already; see My trials.', { trial: 'already applied' });
    throw error;
  }
  const studio = (await Studio.findByPk(trial.studioId))!;
  try {
    await sendMail(deps, {
      key: `application-received:${application.id}`,
      to: { id: user.id, email: user.email },
      template: 'application-received',
      category: 'trial-news',
      studioId: studio.id,
      trialId: trial.id,
      content: applicationReceivedMail({
        name: user.name,
        trialTitle: trial.title,
        studioName: studio.name,
        link: `${deps.config.publicUrl}/my-trials`,
        closesOn: close ? formatDue(close, user.timeZone) : null,
        optOut: optOutFor(deps.config, user.id, 'trial-news'),
      }),
    });
  } catch (error) {
    console.error('[mail] application receipt not sent:', error);
  }
  return application;
}

/** When each of the tester's reports reached the studio (null: not submitted). */
function receiptsOf(enrollment: Enrollment) {
  const reports = (enrollment as Enrollment & { reports?: Report[] }).reports ?? [];
  const at = (stage: 'check-in' | 'final') => reports.find((r) => r.stage === stage)?.submittedAt ?? null;
  return { checkIn: at('check-in'), final: at('final') };
}

/**
 * A tester's own applications and enrollments, each with the next thing due and what it asks,
 * and when each report was received.
 */
export async function myTrials(user: User) {
  const apps = await Application.findAll({
    where: { userId: user.id },
    include: [{ model: Trial, as: 'trial', include: [{ model: Milestone, as: 'milestones' }, { model: Pattern, as: 'pattern' }] }],
    order: [['appliedAt', 'DESC']],
  });
  const enrollments = await Enrollment.findAll({ where: { userId: user.id }, include: [{ model: Report, as: 'reports', attributes: ['stage', 'submittedAt'] }] });
  const now = new Date();
  return Promise.all(
    apps.map(async (app) => {
      const trial = app.trial!;
      const studio = await Studio.findByPk(trial.studioId);
      const size = app.sizeId ? await PatternSize.findByPk(app.sizeId) : null;
      const enrollment = enrollments.find((e) => e.applicationId === app.id) ?? null;
      const dues = TESTER_MILESTONES.flatMap((kind: MilestoneKind) => {
        const m = trial.milestones?.find((x) => x.kind === kind);
        if (!m) return [];
        const override = enrollment?.dueOverrides[kind];
        return [{ kind, label: MILESTONE_LABELS[kind], dueAt: override ? new Date(override) : m.dueAt, extended: Boolean(override), expects: TESTER_EXPECTATIONS[kind] ?? '' }];
      });
      const next = enrollment?.status === 'active' ? (dues.find((d) => d.dueAt > now) ?? null) : null;
      return {
        applicationId: app.id,
        trial: { id: trial.id, slug: trial.slug, title: trial.title, state: trial.state, studioName: studio?.name ?? '', patternId: trial.patternId, studioId: trial.studioId, category: trial.pattern?.category ?? 'other', fabricKind: trial.pattern?.fabricKind ?? null },
        status: app.status,
        size: size ? { id: size.id, label: size.label } : null,
        enrollment: enrollment ? { id: enrollment.id, status: enrollment.status, submitted: receiptsOf(enrollment) } : null,
        dues: enrollment ? dues : [],
        next,
        appliedAt: app.appliedAt,
      };
    }),
  );
}

/**
 * A tester withdraws: one transaction marks the application withdrawn, drops the enrolment,
 * removes their photos' rows (recording the stored objects for removal) and hands a selected
 * tester's seat to the best waitlisted applicant. Only then, outside it, the reminders still
 * queued are cancelled, the promoted applicant is told, and the stored objects are removed — a
 * file store that is down delays the removal (a job finishes it), never the withdrawal.
 */
export async function withdrawApplication(user: User, applicationId: string, deps: { config: Config; mailer: Mailer; storage: Storage; sequelize: Sequelize }) {
  const result = await withdraw(user, applicationId);
  const enrollment = await Enrollment.findOne({ where: { applicationId: result.application.id } });
  if (enrollment) await cancelObsoleteReminders({ enrollmentId: enrollment.id });
  if (result.offered) {
    const studioId = (await Trial.findByPk(result.application.trialId))!.studioId;
    await sendDecisionMail(await loadTrial(studioId, result.application.trialId), { selected: [result.offered], waitlisted: [], declined: [] }, deps);
  }
  await purgeSoon(deps.sequelize, deps.storage);
  return result;
}
