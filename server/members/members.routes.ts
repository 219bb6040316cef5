import { Router } from 'express';
import { requireStudio } from '../auth/guards';
import { changeRoleSchema } from '../domain/schemas/studios';
import { uuidParam } from '../middleware/uuid-param';
import { validate } from '../middleware/validate';
import { serializeMember } from '../serializers';
import { changeRole, listMembers, removeMember } from './members.service';

/** Mounted at /api/studios/:studioId/members. */
export function membersRouter(): Router {
  const router = Router({ mergeParams: true });

  router.get('/', requireStudio('members.list', 'see the member list'), async (req, res) => {
    const members = await listMembers(res.locals.membership!.studioId);
    res.json(members.map(serializeMember));
  });

  router.patch(
    '/:membershipId',
    requireStudio('members.changeRole', 'change roles'),
    uuidParam('membershipId', 'member'),
    validate({ body: changeRoleSchema }),
    async (req, res) => {
      const membership = await changeRole(res.locals.membership!.studioId, String(req.params.membershipId), res.locals.body.role);
      res.json(serializeMember(membership));
    },
  );

  router.delete(
    '/:membershipId',
    requireStudio('members.remove', 'remove members'),
    uuidParam('membershipId', 'member'),
    async (req, res) => {
      await removeMember(res.locals.membership!.studioId, String(req.params.membershipId));
      res.status(204).end();
    },
  );
  return router;
}
