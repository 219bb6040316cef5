import useSWR, { mutate } from 'swr';
import type { Role } from '@/server/domain/roles';
import { api, ApiError } from './api';

export type SessionUser = {
  id: string;
  email: string;
  name: string;
  lengthUnit: 'in' | 'cm';
  fabricUnit: 'yd' | 'm';
  timeZone: string;
  mail: { reminders: boolean; trialNews: boolean; digest: boolean };
};
export type StudioSummary = { id: string; name: string; slug: string; timeZone: string; role: Role };
export type Session = { user: SessionUser; studios: StudioSummary[]; currentStudioId: string | null };

export const SESSION_KEY = '/api/auth/session';

/** Null when signed out; undefined while loading. */
async function loadSession(path: string): Promise<Session | null> {
  try {
    return await api<Session>(path);
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export function useSession() {
  const { data, error, isLoading, mutate: revalidate } = useSWR<Session | null>(SESSION_KEY, loadSession);
  const currentStudio = data?.studios.find((s) => s.id === data.currentStudioId) ?? null;
  return { session: data, currentStudio, error: error as Error | undefined, isLoading, revalidate };
}

/** Loads the new session into the cache and returns it, so the caller can decide where to go. */
async function refreshSession(): Promise<Session> {
  const session = await api<Session>(SESSION_KEY);
  await mutate(SESSION_KEY, session, { revalidate: false });
  return session;
}

export async function signIn(body: { email: string; password: string }): Promise<Session> {
  await api('/api/auth/sign-in', { method: 'POST', body });
  return refreshSession();
}

/**
 * Asks for an account: the server e-mails a link that confirms the address and makes the account.
 * Returns what to tell the person (the same whether or not the address has an account).
 */
export async function signUp(body: { name: string; email: string; password: string; timeZone?: string; next?: string }): Promise<string> {
  const res = await api<{ message: string }>('/api/auth/sign-up', { method: 'POST', body });
  return res.message;
}

/** The link from the confirmation e-mail: makes the account and signs in; `next` is where to go. */
export async function confirmAddress(token: string): Promise<{ session: Session; next: string | null }> {
  const res = await api<Session & { next: string | null }>('/api/auth/verify-email', { method: 'POST', body: { token } });
  return { session: await refreshSession(), next: res.next };
}

export async function requestPasswordReset(body: { email: string }): Promise<string> {
  const res = await api<{ message: string }>('/api/auth/password-reset', { method: 'POST', body });
  return res.message;
}

export async function confirmPasswordReset(body: { token: string; password: string }): Promise<Session> {
  await api('/api/auth/password-reset/confirm', { method: 'POST', body });
  return refreshSession();
}

export async function signOut() {
  await api('/api/auth/sign-out', { method: 'POST' });
  // Forget everything cached for the previous person.
  await mutate(() => true, undefined, { revalidate: false });
  await mutate(SESSION_KEY, null, { revalidate: false });
}

export async function chooseStudio(studioId: string) {
  const session = await api<Session>('/api/auth/session/studio', { method: 'PUT', body: { studioId } });
  // Another studio's data must not linger under the same keys.
  await mutate((key) => typeof key === 'string' && key.startsWith('/api/studios/'), undefined, { revalidate: true });
  await mutate(SESSION_KEY, session, { revalidate: false });
}
