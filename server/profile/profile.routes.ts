import { Router } from 'express';
import { requireUser } from '../auth/guards';
import { profileSchema } from '../domain/schemas/profile';
import { validate } from '../middleware/validate';
import { getProfile, updateProfile } from './profile.service';

/** Mounted at /api/me: always the caller's own records, so no studio check applies. */
export function profileRouter(): Router {
  const router = Router();
  router.get('/profile', requireUser, async (_req, res) => {
    res.json(await getProfile(res.locals.user!));
  });
  router.patch('/profile', requireUser, validate({ body: profileSchema }), async (_req, res) => {
    res.json(await updateProfile(res.locals.user!, res.locals.body));
  });
  return router;
}
