import type { Membership, User } from '../db/models';
import type { SessionClaims } from './auth/session-token';

declare global {
  namespace Express {
    interface Locals {
      /** The signed-in user, set by authenticate(). */
      user?: User;
      /** The session's claims (its id is what signing out revokes), set by authenticate(). */
      session?: SessionClaims;
      /** The caller's membership of the studio in the URL, set by requireStudio(). */
      membership?: Membership;
      /** The caller's membership (or none) of the studio named in the path, read with the session by authenticate(). */
      sessionMembership?: { studioId: string; membership: Membership | null };
    }
  }
}
