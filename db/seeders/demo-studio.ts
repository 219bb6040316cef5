import bcrypt from 'bcryptjs';
import type { Sequelize } from 'sequelize';
import type { Role } from '../../server/domain/roles';
import { Membership, Studio, User } from '../models';

/**
 * The demo studio: an invented small pattern brand with its staff and a few volunteer testers.
 * Every name and address is made up; `.test` is a domain reserved for testing (RFC 2606).
 */
export const DEMO_STUDIO = { name: 'Tern & Thimble (demo)', slug: 'tern-and-thimble', timeZone: 'Europe/Lisbon' };
export const DEMO_PASSWORD = 'basted-demo';
export const DEMO_ACCOUNTS: { email: string; name: string; role: Role }[] = [
  { email: 'designer@demo.basted.test', name: 'Demo Designer', role: 'owner' },
  { email: 'coordinator@demo.basted.test', name: 'Demo Coordinator', role: 'coordinator' },
  { email: 'grader@demo.basted.test', name: 'Demo Grader', role: 'grader' },
  { email: 'tester1@demo.basted.test', name: 'Demo Tester One', role: 'tester' },
  { email: 'tester2@demo.basted.test', name: 'Demo Tester Two', role: 'tester' },
  { email: 'tester3@demo.basted.test', name: 'Demo Tester Three', role: 'tester' },
];

/** Creates whatever of the demo studio is missing; running it again changes nothing. */
export async function seedDemoStudio(sequelize: Sequelize, bcryptCost = 10): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const [studio] = await Studio.findOrCreate({
      where: { slug: DEMO_STUDIO.slug },
      defaults: DEMO_STUDIO,
      transaction,
    });
    const passwordHash = await bcrypt.hash(DEMO_PASSWORD, bcryptCost);
    for (const account of DEMO_ACCOUNTS) {
      const [user] = await User.findOrCreate({
        where: { email: account.email },
        defaults: { email: account.email, name: account.name, passwordHash },
        transaction,
      });
      await Membership.findOrCreate({
        where: { studioId: studio.id, userId: user.id },
        defaults: { studioId: studio.id, userId: user.id, role: account.role },
        transaction,
      });
    }
  });
}
