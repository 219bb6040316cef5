import type { Membership, User } from '../db/models';

declare global {
  namespace Express {
    interface Locals {
      /** The signed-in user, set by authenticate(). */
      user?: User;
      /** The caller's membership of the studio in the URL, set by requireStudio(). */
      membership?: Membership;
    }
  }
}
