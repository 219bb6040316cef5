import type { Invitation, Membership, Studio, TesterProfile, User } from '../db/models';
import { resolveStudioSettings } from './domain/studio-settings';

/** What the API says about a user: never the password hash or the session version. */
export function serializeUser(user: User) {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    lengthUnit: user.lengthUnit,
    fabricUnit: user.fabricUnit,
    timeZone: user.timeZone,
    mail: { reminders: user.mailReminders, trialNews: user.mailTrialNews, digest: user.mailDigest },
  };
}

export function serializeStudio(studio: Studio, role?: Membership['role']) {
  return {
    id: studio.id,
    name: studio.name,
    slug: studio.slug,
    timeZone: studio.timeZone,
    settings: resolveStudioSettings(studio.settings),
    ...(role ? { role } : {}),
  };
}

export function serializeMember(membership: Membership) {
  return {
    id: membership.id,
    role: membership.role,
    userId: membership.userId,
    name: membership.user?.name ?? '',
    email: membership.user?.email ?? '',
    since: membership.createdAt,
  };
}

export function invitationState(invitation: Invitation, now = new Date()): 'open' | 'accepted' | 'revoked' | 'expired' {
  if (invitation.acceptedAt) return 'accepted';
  if (invitation.revokedAt) return 'revoked';
  if (invitation.expiresAt <= now) return 'expired';
  return 'open';
}

export function serializeInvitation(invitation: Invitation) {
  return {
    id: invitation.id,
    email: invitation.email,
    role: invitation.role,
    state: invitationState(invitation),
    expiresAt: invitation.expiresAt,
    createdAt: invitation.createdAt,
  };
}

export function serializeProfile(user: User, profile: TesterProfile | null) {
  return {
    ...serializeUser(user),
    measurementsMm: profile?.measurementsMm ?? {},
    experience: profile?.experience ?? null,
    fitNotes: profile?.fitNotes ?? null,
  };
}
