import { Router } from 'express';
import type { AppDeps } from '../app';
import { requireUser } from '../auth/guards';
import { applySchema } from '../domain/schemas/trials';
import { uuidParam } from '../middleware/uuid-param';
import { validate } from '../middleware/validate';
import { adviceForCall, apply, callBySlug, myTrials, withdrawApplication } from './calls.service';

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
    const { application, offered } = await withdrawApplication(res.locals.user!, String(req.params.applicationId), deps);
    res.json({ id: application.id, status: application.status, seatOffered: offered !== null });
  });
  return router;
}
