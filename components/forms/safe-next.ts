import type { Href } from 'expo-router';

/** A `next` address from the URL, kept only when it is a path of this app (no open redirect). */
export function safeNext(next: string | string[] | undefined): Href | null {
  const value = Array.isArray(next) ? next[0] : next;
  if (!value || !value.startsWith('/') || value.startsWith('//') || value.startsWith('/sign-')) return null;
  return value as Href;
}
