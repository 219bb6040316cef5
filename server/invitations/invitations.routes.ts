import { Router } from 'express';
import type { RouteDeps } from '../app';
import { requireStudio, requireUser } from '../auth/guards';
import { inviteSchema } from '../domain/schemas/studios';
import { rateLimit } from '../middleware/rate-limit';
import { uuidParam } from '../middleware/uuid-param';
import { validate } from '../middleware/validate';
import { serializeInvitation, serializeStudio } from '../serializers';
import { acceptInvitation, createInvitation, listInvitations, previewInvitation, revokeInvitation } from './invitations.service';

/** Mounted at /api/studios/:studioId/invitations: the studio's side. */
export function invitationsRouter(deps: RouteDeps): Router {
  const router = Router({ mergeParams: true });
  // A studio's invitations per day, counted only when one is sent (a refused one is given back).
  const daily = rateLimit(deps.limiters.invitations, { key: (_req, res) => res.locals.membership!.studioId, who: 'this studio today', refundRefused: true });

  router.get('/', requireStudio('invitations.list', 'see invitations'), async (req, res) => {
    res.json((await listInvitations(res.locals.membership!.studioId)).map(serializeInvitation));
  });

  router.post('/', requireStudio('invitations.create', 'invite people'), validate({ body: inviteSchema }), daily, async (req, res) => {
    const invitation = await createInvitation(
      {
        studioId: res.locals.membership!.studioId,
        inviter: res.locals.user!,
        inviterRole: res.locals.membership!.role,
        input: res.locals.body,
      },
      deps,
    );
    res.status(201).json(serializeInvitation(invitation));
  });

  router.delete(
    '/:invitationId',
    requireStudio('invitations.revoke', 'withdraw invitations'),
    uuidParam('invitationId', 'invitation'),
    async (req, res) => {
      await revokeInvitation(res.locals.membership!.studioId, String(req.params.invitationId));
      res.status(204).end();
    },
  );
  return router;
}

/** Mounted at /api/invitations: the invited person's side, reached through the e-mailed link. */
export function invitationLinksRouter(): Router {
  const router = Router();

  router.get('/:token', async (req, res) => {
    res.json(await previewInvitation(String(req.params.token)));
  });

  router.post('/:token/accept', requireUser, async (req, res) => {
    const { studio, role } = await acceptInvitation(String(req.params.token), res.locals.user!);
    res.json(serializeStudio(studio, role));
  });
  return router;
}
