import type { Transaction } from 'sequelize';
import { Membership, User } from '../../db/models';
import type { Role } from '../domain/roles';
import { conflict, notFound } from '../errors';

export async function listMembers(studioId: string) {
  return Membership.findAll({
    where: { studioId },
    include: [{ model: User, as: 'user' }],
    order: [
      ['role', 'ASC'],
      [{ model: User, as: 'user' }, 'name', 'ASC'],
    ],
  });
}

async function findMember(studioId: string, membershipId: string, transaction: Transaction) {
  const membership = await Membership.findOne({
    where: { id: membershipId, studioId },
    // An inner join: PostgreSQL cannot lock the nullable side of an outer one.
    include: [{ model: User, as: 'user', required: true }],
    transaction,
    lock: transaction.LOCK.UPDATE,
  });
  if (!membership) throw notFound('member');
  return membership;
}

/** A studio always keeps at least one owner. Locks the owners so two changes cannot both pass. */
async function assertAnotherOwner(studioId: string, leaving: Membership, transaction: Transaction) {
  if (leaving.role !== 'owner') return;
  const owners = await Membership.findAll({ where: { studioId, role: 'owner' }, transaction, lock: transaction.LOCK.UPDATE });
  if (owners.filter((o) => o.id !== leaving.id).length === 0) {
    throw conflict('A studio needs at least one owner. Make someone else owner first.', { role: 'the last owner must stay owner' });
  }
}

export async function changeRole(studioId: string, membershipId: string, role: Role) {
  return Membership.sequelize!.transaction(async (transaction) => {
    const membership = await findMember(studioId, membershipId, transaction);
    if (role !== 'owner') await assertAnotherOwner(studioId, membership, transaction);
    return membership.update({ role }, { transaction });
  });
}

export async function removeMember(studioId: string, membershipId: string) {
  await Membership.sequelize!.transaction(async (transaction) => {
    const membership = await findMember(studioId, membershipId, transaction);
    await assertAnotherOwner(studioId, membership, transaction);
    await membership.destroy({ transaction });
  });
}
