import type { RequestHandler } from 'express';
import { z } from 'zod';
import { Membership } from '../../db/models';
import { can, type Action } from '../domain/policy';
import { ROLE_LABELS } from '../domain/roles';
import { forbidden, notFound, unauthenticated } from '../errors';

export const requireUser: RequestHandler = (_req, res, next) => {
  if (!res.locals.user) throw unauthenticated();
  next();
};

const uuid = z.uuid();

/**
 * The caller must belong to the studio in :studioId and hold a role the policy allows for
 * the action. A non-member gets 404, so studio ids cannot be probed; a member without the
 * right gets 403 saying what their role cannot do.
 */
export function requireStudio(action: Action, what: string): RequestHandler {
  return async (req, res, next) => {
    const user = res.locals.user;
    if (!user) throw unauthenticated();
    const studioId = req.params.studioId;
    if (!uuid.safeParse(studioId).success) throw notFound('studio');
    const known = res.locals.sessionMembership;
    const membership = known && known.studioId === String(studioId).toLowerCase() ? known.membership : await Membership.findOne({ where: { studioId, userId: user.id } });
    if (!membership) throw notFound('studio');
    if (!can(membership.role, action)) {
      throw forbidden(`A ${ROLE_LABELS[membership.role].toLowerCase()} of this studio may not ${what}.`);
    }
    res.locals.membership = membership;
    next();
  };
}
