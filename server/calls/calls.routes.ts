import { Router } from 'express';
import { Enrollment, Trial } from '../../db/models';
import { removeEnrollmentPhotos } from '../photos/photos.service';
import type { AppDeps } from '../app';
import { requireUser } from '../auth/guards';
import { applySchema } from '../domain/schemas/trials';
import { uuidParam } from '../middleware/uuid-param';
import { validate } from '../middleware/validate';
import { cancelObsoleteReminders } from '../outbox/outbox.service';
import { sendDecisionMail } from '../trials/trial-mail';
import { loadTrial, withdraw } from '../trials/trials.service';
import { adviceForCall, apply, callBySlug, myTrials } from './calls.service';

/** Mounted at /api/calls: the public call page and applying to it. */
export function callsRouter(deps: AppDeps): Router {
  const router = Router();
  router.get('/:slug', async (req, res) => {
    res.json(await callBySlug(String(req.params.slug)));
  });
  router.get('/:slug/my-advice', requireUser, async (req, res) => {
    res.json(await adviceForCall(String(req.params.slug), res.locals.user!));
  });
  router.post('/:slug/applications', requireUser, validate({ body: applySchema }), async (req, res) => {
    const application = await apply(String(req.params.slug), res.locals.user!, res.locals.body, deps);
    res.status(201).json({ id: application.id, status: application.status, sizeId: application.sizeId });
  });
  return router;
}

/** Mounted at /api/me: a tester's own trials. */
export function myTrialsRouter(deps: AppDeps): Router {
  const router = Router();
  router.get('/trials', requireUser, async (_req, res) => {
    res.json(await myTrials(res.locals.user!));
  });
  router.post('/applications/:applicationId/withdraw', requireUser, uuidParam('applicationId', 'application'), async (req, res) => {
    const { application, offered } = await withdraw(res.locals.user!, String(req.params.applicationId));
    const enrollment = await Enrollment.findOne({ where: { applicationId: application.id } });
    if (enrollment) await removeEnrollmentPhotos(enrollment.id, deps.storage);
    if (enrollment) await cancelObsoleteReminders({ enrollmentId: enrollment.id });
    // The freed seat went to the best waitlisted applicant of that size: tell them.
    if (offered) {
      const studioId = (await Trial.findByPk(application.trialId))!.studioId;
      const trial = await loadTrial(studioId, application.trialId);
      await sendDecisionMail(trial, { selected: [offered], waitlisted: [], declined: [] }, deps);
    }
    res.json({ id: application.id, status: application.status, seatOffered: offered !== null });
  });
  return router;
}
