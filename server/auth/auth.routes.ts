import { Router, type Request, type Response } from 'express';
import type { RouteDeps } from '../app';
import { track } from '../background';
import { describeError, type Logger } from '../logger';
import { currentStudioSchema } from '../domain/schemas/studios';
import { confirmAddressSchema, resetConfirmSchema, resetRequestSchema, signInSchema, signUpSchema } from '../domain/schemas/auth';
import { validate } from '../middleware/validate';
import { chooseStudio, sessionFor } from '../studios/studios.service';
import { confirmPasswordReset, confirmSignUp, requestPasswordReset, requestSignUp, signIn } from './auth.service';
import { clearSessionCookie, revokeSession, setSessionCookie } from './authenticate';
import { requireUser } from './guards';
import { clientAddress, rateLimit } from '../middleware/rate-limit';

/**
 * Answers at once, then does the work. For requests whose answer must not say whether an address
 * has an account (sign-up, password reset), the work differs between the two cases; done after
 * the answer, it cannot show in the answer's timing either. A failure is logged: the person sees
 * no mail arrive and asks again.
 */
async function answerThenDo(res: Response, status: number, body: unknown, what: string, work: () => Promise<void>, logger: Logger) {
  res.status(status).json(body);
  await track(
    work().catch((error: unknown) => {
      logger.error({ err: describeError(error) }, `${what} failed after the answer`);
    }),
  );
}

export function authRouter(deps: RouteDeps): Router {
  const router = Router();
  const auth = deps.config.auth;
  const { limiters } = deps;
  const connection = 'your connection';
  const byAddress = (req: Request) => clientAddress(req);
  // After validate(): the address as parsed.
  const byEmail = (_req: Request, res: Response) => (res.locals.body as { email?: string } | undefined)?.email?.toLowerCase() ?? null;
  // Only failures count, so many people signing in through one proxy address are not locked out
  // by each other's successes; guessing passwords or link tokens is what it stops.
  const failedAttempts = rateLimit(limiters.signIn, { key: byAddress, who: connection, failuresOnly: true });
  const signUps = [
    rateLimit(limiters.signUpByAddress, { key: byAddress, who: connection }),
    validate({ body: signUpSchema }),
    rateLimit(limiters.signUpByEmail, { key: byEmail, who: 'this address' }),
  ];
  const resets = [
    rateLimit(limiters.resetByAddress, { key: byAddress, who: connection }),
    validate({ body: resetRequestSchema }),
    rateLimit(limiters.resetByEmail, { key: byEmail, who: 'this address' }),
  ];

  // The same answer whether or not the address has an account; the account is made from the
  // link in the confirmation e-mail (POST /verify-email).
  router.post('/sign-up', ...signUps, async (_req, res) => {
    const input = res.locals.body;
    await answerThenDo(
      res,
      202,
      { message: `We sent an e-mail to ${input.email}. Open the link in it to confirm the address and finish creating your account.` },
      'sign-up',
      () => requestSignUp(input, deps),
      deps.logger,
    );
  });

  router.post('/verify-email', failedAttempts, validate({ body: confirmAddressSchema }), async (_req, res) => {
    const { user, next } = await confirmSignUp(res.locals.body.token);
    setSessionCookie(res, user, auth);
    res.status(201).json({ ...(await sessionFor(user)), next });
  });

  router.post('/sign-in', failedAttempts, validate({ body: signInSchema }), async (_req, res) => {
    const user = await signIn(res.locals.body, auth);
    setSessionCookie(res, user, auth);
    res.json(await sessionFor(user));
  });

  // Ends this session on every instance, not just the cookie in this browser.
  router.post('/sign-out', async (_req, res) => {
    if (res.locals.session) await revokeSession(res.locals.session, auth);
    clearSessionCookie(res, auth);
    res.status(204).end();
  });

  router.get('/session', requireUser, async (_req, res) => {
    res.json(await sessionFor(res.locals.user!));
  });

  router.put('/session/studio', requireUser, validate({ body: currentStudioSchema }), async (_req, res) => {
    res.json(await chooseStudio(res.locals.user!, res.locals.body.studioId));
  });

  // The same answer, at the same speed, whether or not the address has an account.
  router.post('/password-reset', ...resets, async (_req, res) => {
    const { email } = res.locals.body;
    await answerThenDo(res, 202, { message: 'If an account uses this address, a link to choose a new password is on its way.' }, 'password reset', () =>
      requestPasswordReset(email, deps),
    deps.logger,
    );
  });

  router.post('/password-reset/confirm', failedAttempts, validate({ body: resetConfirmSchema }), async (_req, res) => {
    const user = await confirmPasswordReset(res.locals.body, auth);
    setSessionCookie(res, user, auth);
    res.json(await sessionFor(user));
  });

  return router;
}
