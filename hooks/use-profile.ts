import useSWR, { mutate } from 'swr';
import type { ProfileInput } from '@/server/domain/schemas/profile';
import { api } from './api';
import { SESSION_KEY, type SessionUser } from './use-session';

export type Profile = SessionUser & {
  measurementsMm: Record<string, number>;
  experience: string | null;
  fitNotes: string | null;
};

export const PROFILE_KEY = '/api/me/profile';

export function useProfile() {
  return useSWR<Profile>(PROFILE_KEY);
}

export async function saveProfile(body: ProfileInput) {
  const profile = await api<Profile>(PROFILE_KEY, { method: 'PATCH', body });
  await mutate(PROFILE_KEY, profile, { revalidate: false });
  await mutate(SESSION_KEY);
  return profile;
}
