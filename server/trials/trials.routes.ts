import express, { Router } from 'express';
import { Enrollment, User } from '../../db/models';
import { MILESTONE_LABELS, TESTER_MILESTONES } from '../domain/trials';
import type { AppDeps } from '../app';
import { requireStudio } from '../auth/guards';
import { createTrialSchema, decideSchema, dueOverrideSchema, updateTrialSchema } from '../domain/schemas/trials';
import { notFound } from '../errors';
import { uuidParam } from '../middleware/uuid-param';
import { validate } from '../middleware/validate';
import { findingsRouter } from '../findings/findings.routes';
import { trialReportsRouter } from '../reports/reports.routes';
import { cancelObsoleteReminders } from '../outbox/outbox.service';
import { trialMailRouter } from '../outbox/outbox.routes';
import { sendPendingPoolInvitations } from '../community/pool.service';
import { trialReleaseRouter } from '../release/release.routes';
import { readPage, sendPage } from '../pagination';
import { sendDecisionMail } from './trial-mail';
import { applicationsPage, enrollmentsPage } from './trial-pages';
import { serializeApplication, serializeTrial } from './trial-serializer';
import { coverageOf, createTrial, decide, listTrials, loadTrial, milestoneMap, proposalFor, updateTrial } from './trials.service';

/** Mounted at /api/studios/:studioId/trials. */
export function trialsRouter(deps: AppDeps): Router {
  const router = Router({ mergeParams: true });
  const studioId = (res: express.Response) => res.locals.membership!.studioId;
  const trialId = (req: express.Request) => String(req.params.trialId);
  const read = requireStudio('trials.read', 'see trials');
  const write = requireStudio('trials.write', 'change trials');
  const manage = requireStudio('applicants.manage', 'see or decide on applicants');
  const trial = uuidParam('trialId', 'trial');

  router.get('/', read, async (_req, res) => {
    res.json((await listTrials(studioId(res))).map(serializeTrial));
  });
  router.post('/', write, validate({ body: createTrialSchema }), async (_req, res) => {
    res.status(201).json(serializeTrial(await createTrial(studioId(res), res.locals.body)));
  });
  router.get('/:trialId', read, trial, async (req, res) => {
    res.json(serializeTrial(await loadTrial(studioId(res), trialId(req))));
  });
  router.patch('/:trialId', write, trial, validate({ body: updateTrialSchema }), async (req, res) => {
    const updated = await updateTrial(studioId(res), trialId(req), res.locals.body);
    // New dates (or a closed trial) cancel reminders queued for the old ones.
    await cancelObsoleteReminders({ trialId: updated.id });
    // Invitations from the tester pool that waited for this call to open go out now.
    if (updated.state === 'open') await sendPendingPoolInvitations(updated, deps);
    res.json(serializeTrial(updated));
  });

  router.get('/:trialId/applications', manage, trial, async (req, res) => {
    const page = readPage(req);
    const found = await loadTrial(studioId(res), trialId(req));
    const labels = new Map((found.pattern?.sizes ?? []).map((s) => [s.id, s.label]));
    const { rows, next } = await applicationsPage(found.id, page.limit, page.after);
    sendPage(req, res, rows.map((r) => serializeApplication(r, labels)), next);
  });

  router.get('/:trialId/coverage', manage, trial, async (req, res) => {
    res.json(await coverageOf(await loadTrial(studioId(res), trialId(req)), res.locals.user!.lengthUnit));
  });

  // A proposal only: nothing changes until the coordinator accepts it (as a decision).
  router.post('/:trialId/selection/proposal', manage, trial, async (req, res) => {
    res.json(await proposalFor(await loadTrial(studioId(res), trialId(req)), res.locals.user!.lengthUnit));
  });

  router.post('/:trialId/decisions', manage, trial, validate({ body: decideSchema }), async (req, res) => {
    const effects = await decide(studioId(res), trialId(req), res.locals.body);
    await cancelObsoleteReminders({ trialId: trialId(req) });
    await sendDecisionMail(await loadTrial(studioId(res), trialId(req)), effects, deps);
    res.json({ selected: effects.selected.length, waitlisted: effects.waitlisted.length, declined: effects.declined.length });
  });

  // The enrolled testers with their own dates (the trial's, or the ones granted to them).
  router.get('/:trialId/enrollments', manage, trial, async (req, res) => {
    const page = readPage(req);
    const found = await loadTrial(studioId(res), trialId(req));
    const dues = milestoneMap(found);
    const labels = new Map((found.pattern?.sizes ?? []).map((s) => [s.id, s.label]));
    const { rows, next } = await enrollmentsPage(found.id, page.limit, page.after);
    sendPage(
      req,
      res,
      rows.map((e) => ({
        id: e.id,
        status: e.status,
        tester: { name: (e as Enrollment & { user?: User }).user?.name ?? '' },
        size: { id: e.sizeId, label: labels.get(e.sizeId) ?? '?' },
        dues: TESTER_MILESTONES.flatMap((kind) =>
          dues[kind] ? [{ kind, label: MILESTONE_LABELS[kind], dueAt: e.dueOverrides[kind] ?? dues[kind]!.toISOString(), extended: Boolean(e.dueOverrides[kind]) }] : [],
        ),
      })),
      next,
    );
  });

  router.use('/:trialId', trialReportsRouter());
  router.use('/:trialId/mail', trialMailRouter(deps));

  router.use('/:trialId', findingsRouter());
  router.use('/:trialId', trialReleaseRouter(deps));

  // More time for one tester: a per-milestone date that replaces the trial's for them alone.
  router.patch(
    '/:trialId/enrollments/:enrollmentId/due',
    manage,
    trial,
    uuidParam('enrollmentId', 'enrollment'),
    validate({ body: dueOverrideSchema }),
    async (req, res) => {
      await loadTrial(studioId(res), trialId(req));
      const enrollment = await Enrollment.findOne({ where: { id: String(req.params.enrollmentId), trialId: trialId(req) } });
      if (!enrollment) throw notFound('enrollment');
      const { kind, dueAt } = res.locals.body as { kind: string; dueAt: string | null };
      const overrides = { ...enrollment.dueOverrides };
      if (dueAt) overrides[kind] = new Date(dueAt).toISOString();
      else delete overrides[kind];
      await enrollment.update({ dueOverrides: overrides });
      await cancelObsoleteReminders({ enrollmentId: enrollment.id });
      res.json({ id: enrollment.id, dueOverrides: overrides });
    },
  );
  return router;
}
