import { Redirect, usePathname, useRouter } from 'expo-router';
import { useEffect, useState, type ReactNode } from 'react';
import { Screen } from '@/components/ui/screen';
import { LoadError, Loading } from '@/components/ui/states';
import { useSession, type Session } from '@/hooks/use-session';
import { STAFF_ROLES } from '@/server/domain/roles';

/** Where a signed-in person starts: their studio's trials, their own trials, or choosing a studio. */
export function landingFor(session: Session): '/trials' | '/my-trials' | '/studios' {
  const current = session.studios.find((s) => s.id === session.currentStudioId);
  if (current && STAFF_ROLES.includes(current.role)) return '/trials';
  return session.studios.length ? '/my-trials' : '/studios';
}

function ToSignIn({ next }: { next: string }) {
  const router = useRouter();
  useEffect(() => {
    router.replace({ pathname: '/sign-in', params: { next } });
  }, [router, next]);
  return <Loading label="Taking you to sign-in…" />;
}

/**
 * The one gate of a signed-in area, used by its group layout: a signed-out visitor goes to sign-in
 * (and comes back after), and only studio staff enter the studio area.
 */
export function RequireSession({ staffOnly = false, children }: { staffOnly?: boolean; children: ReactNode }) {
  const { session, currentStudio, error, revalidate } = useSession();
  // The address asked for, read on the first render: the group's navigator, not yet mounted while
  // the session loads, may settle on another of its screens before the redirect runs (seen on web).
  const [asked] = useState(usePathname());
  if (error) {
    return (
      <Screen title="Basted">
        <LoadError error={error} onRetry={() => revalidate()} />
      </Screen>
    );
  }
  if (session === undefined) return <Loading label="Checking your sign-in…" />;
  if (session === null) return <ToSignIn next={asked} />;
  if (staffOnly && !(currentStudio && STAFF_ROLES.includes(currentStudio.role))) return <Redirect href={landingFor(session)} />;
  return children;
}
