import useSWR, { mutate } from 'swr';
import type { InvitableRole, Role } from '@/server/domain/roles';
import { api } from './api';
import { SESSION_KEY, type StudioSummary } from './use-session';

export type Member = { id: string; role: Role; userId: string; name: string; email: string; since: string };
export type InvitationRow = {
  id: string;
  email: string;
  role: InvitableRole;
  state: 'open' | 'accepted' | 'revoked' | 'expired';
  expiresAt: string;
  createdAt: string;
};

export const studioKeys = {
  members: (studioId: string) => `/api/studios/${studioId}/members`,
  invitations: (studioId: string) => `/api/studios/${studioId}/invitations`,
};

export function useMembers(studioId: string | null | undefined) {
  return useSWR<Member[]>(studioId ? studioKeys.members(studioId) : null);
}

export function useInvitations(studioId: string | null | undefined) {
  return useSWR<InvitationRow[]>(studioId ? studioKeys.invitations(studioId) : null);
}

export async function createStudio(body: { name: string; timeZone: string }) {
  const studio = await api<StudioSummary>('/api/studios', { method: 'POST', body });
  await mutate(SESSION_KEY);
  return studio;
}

export async function invite(studioId: string, body: { email: string; role: InvitableRole }) {
  await api(studioKeys.invitations(studioId), { method: 'POST', body });
  await mutate(studioKeys.invitations(studioId));
}

export async function withdrawInvitation(studioId: string, invitationId: string) {
  await api(`${studioKeys.invitations(studioId)}/${invitationId}`, { method: 'DELETE' });
  await mutate(studioKeys.invitations(studioId));
}

export async function changeRole(studioId: string, membershipId: string, role: Role) {
  await api(`${studioKeys.members(studioId)}/${membershipId}`, { method: 'PATCH', body: { role } });
  await mutate(studioKeys.members(studioId));
  await mutate(SESSION_KEY);
}

export async function removeMember(studioId: string, membershipId: string) {
  await api(`${studioKeys.members(studioId)}/${membershipId}`, { method: 'DELETE' });
  await mutate(studioKeys.members(studioId));
}

export type InvitationPreview = {
  studio: { name: string };
  role: InvitableRole;
  email: string;
  state: InvitationRow['state'];
  expiresAt: string;
};

export function useInvitationPreview(token: string | undefined) {
  return useSWR<InvitationPreview>(token ? `/api/invitations/${encodeURIComponent(token)}` : null);
}

export async function acceptInvitation(token: string) {
  const studio = await api<StudioSummary>(`/api/invitations/${encodeURIComponent(token)}/accept`, { method: 'POST' });
  await mutate(SESSION_KEY);
  return studio;
}
