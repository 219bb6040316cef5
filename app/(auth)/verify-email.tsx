import { useLocalSearchParams, useRouter } from 'expo-router';
import { useEffect, useRef, useState } from 'react';
import { safeNext } from '@/components/forms/safe-next';
import { landingFor } from '@/components/layout/require-session';
import { ButtonLink } from '@/components/ui/button-link';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { Loading } from '@/components/ui/states';
import { confirmAddress } from '@/hooks/use-session';

// Reached from the link in the confirmation e-mail: confirms the address, which makes the account.
export default function VerifyEmailScreen() {
  const { token } = useLocalSearchParams<{ token?: string }>();
  const router = useRouter();
  const [failure, setFailure] = useState<string | null>(null);
  // The link works once: a second render (strict mode, a re-focus) must not spend it again.
  const tried = useRef(false);

  useEffect(() => {
    if (!token || tried.current) return;
    tried.current = true;
    confirmAddress(token)
      .then(({ session, next }) => router.replace(safeNext(next ?? undefined) ?? landingFor(session)))
      .catch((error: unknown) => setFailure(error instanceof Error ? error.message : 'The link could not be used.'));
  }, [token, router]);

  if (!token) {
    return (
      <Screen title="Confirm your e-mail address">
        <Notice tone="error">This link is incomplete. Open the whole link from the e-mail, or create the account again.</Notice>
        <ButtonLink href="/sign-up" label="Create an account" />
      </Screen>
    );
  }
  if (failure) {
    return (
      <Screen title="Confirm your e-mail address">
        <Notice tone="error">{failure}</Notice>
        <ButtonLink href="/sign-in" label="Sign in" />
        <ButtonLink href="/sign-up" label="Create the account again" tone="quiet" />
      </Screen>
    );
  }
  return <Loading label="Confirming your address…" />;
}
