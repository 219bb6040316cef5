import { col, fn, Op, where } from 'sequelize';
import { Invitation, Membership, Studio, User } from '../../db/models';
import { hashSecretToken, newSecretToken } from '../auth/secret-token';
import type { Config } from '../config';
import { ROLE_LABELS } from '../domain/roles';
import type { InviteInput } from '../domain/schemas/studios';
import { conflict, forbidden, notFound, unavailable } from '../errors';
import type { Mailer } from '../mail/mailer';
import { invitationMail } from '../mail/templates';
import { sendOrThrow } from '../outbox/outbox.service';
import { invitationState } from '../serializers';

export const INVITATION_DAYS = 14;

export async function listInvitations(studioId: string) {
  return Invitation.findAll({ where: { studioId }, order: [['createdAt', 'DESC']], limit: 200 });
}

/**
 * Records the invitation and e-mails its link. A new invitation to the same address replaces
 * the open one. When the mail cannot be sent nothing is kept, so the person can simply retry.
 */
export async function createInvitation(
  args: { studioId: string; inviter: User; inviterRole: Membership['role']; input: InviteInput },
  deps: { config: Config; mailer: Mailer },
) {
  const { studioId, inviter, inviterRole, input } = args;
  if (inviterRole !== 'owner' && input.role === 'coordinator') {
    throw forbidden('Only the owner can invite a coordinator.');
  }
  // Basted sends the invitation in the studio's name: only from an address shown to be its owner's.
  if (!inviter.emailVerifiedAt) throw forbidden('Confirm your own e-mail address before inviting people.');
  const email = input.email.toLowerCase();
  const studio = (await Studio.findByPk(studioId))!;

  return Invitation.sequelize!.transaction(async (transaction) => {
    const existingMember = await Membership.findOne({
      where: { studioId },
      include: [{ model: User, as: 'user', where: where(fn('lower', col('user.email')), email), required: true }],
      transaction,
    });
    if (existingMember) {
      throw conflict('This person is a member of the studio already.', { email: 'is already a member of this studio' });
    }
    await Invitation.update(
      { revokedAt: new Date() },
      { where: { studioId, acceptedAt: null, revokedAt: null, [Op.and]: [where(fn('lower', col('email')), email)] }, transaction },
    );
    const { token, hash } = newSecretToken();
    const invitation = await Invitation.create(
      {
        studioId,
        email,
        role: input.role,
        tokenHash: hash,
        invitedById: inviter.id,
        expiresAt: new Date(Date.now() + INVITATION_DAYS * 24 * 60 * 60 * 1000),
      },
      { transaction },
    );
    const link = `${deps.config.publicUrl}/invitations/${encodeURIComponent(token)}`;
    try {
      // Recorded outside this transaction, so a failed attempt stays on record after the rollback.
      await sendOrThrow(deps, {
        key: `invitation:${invitation.id}`,
        to: { id: null, email },
        template: 'invitation',
        studioId,
        content: invitationMail({
          studioName: studio.name,
          roleLabel: ROLE_LABELS[input.role],
          inviterName: inviter.name,
          link,
          days: INVITATION_DAYS,
        }),
      });
    } catch (error) {
      console.error('[mail] invitation not sent:', error);
      throw unavailable('The invitation e-mail could not be sent just now, so nothing was saved. Please try again shortly.');
    }
    return invitation;
  });
}

export async function revokeInvitation(studioId: string, invitationId: string) {
  const invitation = await Invitation.findOne({ where: { id: invitationId, studioId } });
  if (!invitation) throw notFound('invitation');
  if (invitationState(invitation) === 'open') await invitation.update({ revokedAt: new Date() });
}

async function byToken(token: string) {
  const invitation = await Invitation.findOne({
    where: { tokenHash: hashSecretToken(token) },
    include: [{ model: Studio, as: 'studio' }],
  });
  if (!invitation) throw notFound('invitation');
  return invitation;
}

function maskEmail(email: string): string {
  const [local, domain] = email.split('@');
  return `${local.slice(0, 1)}${'•'.repeat(Math.max(1, Math.min(local.length - 1, 6)))}@${domain}`;
}

/** What the invitation page shows before sign-in: enough to recognise it, not the full address. */
export async function previewInvitation(token: string) {
  const invitation = await byToken(token);
  return {
    studio: { name: invitation.studio!.name },
    role: invitation.role,
    email: maskEmail(invitation.email),
    state: invitationState(invitation),
    expiresAt: invitation.expiresAt,
  };
}

export async function acceptInvitation(token: string, user: User) {
  const invitation = await byToken(token);
  const state = invitationState(invitation);
  if (state !== 'open') {
    throw conflict(
      state === 'accepted'
        ? 'This invitation was accepted already.'
        : state === 'expired'
          ? 'This invitation has expired. Ask the studio for a new one.'
          : 'This invitation was withdrawn by the studio.',
    );
  }
  // The link only works for the address it was sent to, and only for an account whose owner has
  // shown they read that address, so a forwarded link gives no access.
  if (!user.emailVerifiedAt) {
    throw forbidden('Confirm your e-mail address first: open the link in the confirmation e-mail, then accept the invitation.');
  }
  if (invitation.email.toLowerCase() !== user.email.toLowerCase()) {
    throw forbidden(`This invitation was sent to ${maskEmail(invitation.email)}. Sign in with that address to accept it.`);
  }
  return Invitation.sequelize!.transaction(async (transaction) => {
    const [membership] = await Membership.findOrCreate({
      where: { studioId: invitation.studioId, userId: user.id },
      defaults: { studioId: invitation.studioId, userId: user.id, role: invitation.role },
      transaction,
    });
    await invitation.update({ acceptedAt: new Date(), acceptedById: user.id }, { transaction });
    await user.update({ currentStudioId: invitation.studioId }, { transaction });
    return { studio: invitation.studio!, role: membership.role };
  });
}
