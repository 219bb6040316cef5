import { Router } from 'express';
import type { AppDeps } from '../app';
import { currentStudioSchema } from '../domain/schemas/studios';
import { resetConfirmSchema, resetRequestSchema, signInSchema, signUpSchema } from '../domain/schemas/auth';
import { validate } from '../middleware/validate';
import { serializeUser } from '../serializers';
import { chooseStudio, sessionFor } from '../studios/studios.service';
import { confirmPasswordReset, requestPasswordReset, signIn, signUp } from './auth.service';
import { clearSessionCookie, setSessionCookie } from './authenticate';
import { requireUser } from './guards';
import { authRateLimit } from './rate-limit';

export function authRouter(deps: AppDeps): Router {
  const router = Router();
  const auth = deps.config.auth;
  const limited = authRateLimit(auth.rateLimit);

  // The token is also in the body for API clients, which send it back as a Bearer header.
  router.post('/sign-up', limited, validate({ body: signUpSchema }), async (_req, res) => {
    const user = await signUp(res.locals.body, auth);
    const token = setSessionCookie(res, user, auth);
    res.status(201).json({ user: serializeUser(user), token });
  });

  router.post('/sign-in', limited, validate({ body: signInSchema }), async (_req, res) => {
    const user = await signIn(res.locals.body, auth);
    const token = setSessionCookie(res, user, auth);
    res.json({ user: serializeUser(user), token });
  });

  router.post('/sign-out', (_req, res) => {
    clearSessionCookie(res, auth);
    res.status(204).end();
  });

  router.get('/session', requireUser, async (_req, res) => {
    res.json(await sessionFor(res.locals.user!));
  });

  router.put('/session/studio', requireUser, validate({ body: currentStudioSchema }), async (_req, res) => {
    res.json(await chooseStudio(res.locals.user!, res.locals.body.studioId));
  });

  // The same answer whether or not the address has an account.
  router.post('/password-reset', limited, validate({ body: resetRequestSchema }), async (_req, res) => {
    await requestPasswordReset(res.locals.body.email, deps);
    res.status(202).json({ message: 'If an account uses this address, a link to choose a new password is on its way.' });
  });

  router.post('/password-reset/confirm', limited, validate({ body: resetConfirmSchema }), async (_req, res) => {
    const user = await confirmPasswordReset(res.locals.body, auth);
    const token = setSessionCookie(res, user, auth);
    res.json({ user: serializeUser(user), token });
  });

  return router;
}
