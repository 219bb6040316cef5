import { Router } from 'express';
import type { AppDeps } from '../app';
import { requireStudio } from '../auth/guards';
import { poolInviteSchema, poolQuerySchema, type PoolQuery } from '../domain/schemas/release';
import { validate } from '../middleware/validate';
import { invitableTrials, inviteFromPool, testerPool } from './pool.service';

/** Mounted at /api/studios/:studioId/pool: the people who tested for the studio, and inviting them. */
export function poolRouter(deps: AppDeps): Router {
  const router = Router({ mergeParams: true });
  // The pool draws on applications (measurements): the staff who choose testers only.
  const manage = requireStudio('applicants.manage', 'see the tester pool');
  router.get('/', manage, validate({ query: poolQuerySchema }), async (_req, res) => {
    res.json(await testerPool(res.locals.membership!.studioId, res.locals.query as PoolQuery));
  });
  router.get('/calls', manage, async (_req, res) => {
    res.json(await invitableTrials(res.locals.membership!.studioId));
  });
  router.post('/invitations', manage, validate({ body: poolInviteSchema }), async (_req, res) => {
    res.json(await inviteFromPool(res.locals.membership!.studioId, res.locals.user!, res.locals.body, deps));
  });
  return router;
}
