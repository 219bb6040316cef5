import { Router } from 'express';
import type { RouteDeps } from '../app';
import { requireStudio, requireUser } from '../auth/guards';
import { createStudioSchema, updateStudioSchema } from '../domain/schemas/studios';
import { invitationsRouter } from '../invitations/invitations.routes';
import { membersRouter } from '../members/members.routes';
import { patternsRouter } from '../patterns/patterns.routes';
import { trialsRouter } from '../trials/trials.routes';
import { poolRouter } from '../community/pool.routes';
import { removeMember } from '../members/members.service';
import { validate } from '../middleware/validate';
import { serializeStudio } from '../serializers';
import { createStudio, deleteStudio, getStudio, myStudios, updateStudio } from './studios.service';

export function studiosRouter(deps: RouteDeps): Router {
  const router = Router();

  router.get('/', requireUser, async (_req, res) => {
    res.json(await myStudios(res.locals.user!));
  });

  router.post('/', requireUser, validate({ body: createStudioSchema }), async (_req, res) => {
    const studio = await createStudio(res.locals.user!, res.locals.body);
    res.status(201).json(serializeStudio(studio, 'owner'));
  });

  router.get('/:studioId', requireStudio('studio.read', 'see this studio'), async (req, res) => {
    res.json(serializeStudio(await getStudio(res.locals.membership!.studioId), res.locals.membership!.role));
  });

  router.patch(
    '/:studioId',
    requireStudio('studio.update', 'change the studio'),
    validate({ body: updateStudioSchema }),
    async (req, res) => {
      const studio = await updateStudio(res.locals.membership!.studioId, res.locals.body);
      res.json(serializeStudio(studio, res.locals.membership!.role));
    },
  );

  router.delete('/:studioId', requireStudio('studio.delete', 'delete the studio'), async (req, res) => {
    await deleteStudio(res.locals.membership!.studioId, deps);
    res.status(204).end();
  });

  // Leaving a studio: any member may, except its last owner.
  router.delete('/:studioId/membership', requireStudio('studio.read', 'leave this studio'), async (req, res) => {
    await removeMember(res.locals.membership!.studioId, res.locals.membership!.id);
    res.status(204).end();
  });

  router.use('/:studioId/members', membersRouter());
  router.use('/:studioId/invitations', invitationsRouter(deps));
  router.use('/:studioId/patterns', patternsRouter(deps));
  router.use('/:studioId/trials', trialsRouter(deps));
  router.use('/:studioId/pool', poolRouter(deps));
  return router;
}
