import { useLocalSearchParams, useRouter } from 'expo-router';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { ButtonLink } from '@/components/ui/button-link';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { ApiError } from '@/hooks/api';
import { useSession } from '@/hooks/use-session';
import { acceptInvitation, useInvitationPreview } from '@/hooks/use-studio';
import { ROLE_LABELS, STAFF_ROLES } from '@/server/domain/roles';

const STATE_MESSAGES = {
  accepted: 'This invitation was accepted already.',
  revoked: 'The studio withdrew this invitation.',
  expired: 'This invitation has expired. Ask the studio to send a new one.',
} as const;

// Reached from the e-mailed link; readable without signing in.
export default function InvitationScreen() {
  const { token } = useLocalSearchParams<{ token: string }>();
  const router = useRouter();
  const { session } = useSession();
  const { data: invitation, error, mutate } = useInvitationPreview(token);
  const [busy, setBusy] = useState(false);
  const [failure, setFailure] = useState<string | null>(null);
  const here = `/invitations/${token}`;

  if (error) {
    const missing = error instanceof ApiError && error.status === 404;
    return (
      <Screen title="Invitation">
        {missing ? <Notice tone="error">This invitation link is not valid. Check that the whole link was copied.</Notice> : <LoadError error={error} onRetry={() => mutate()} />}
      </Screen>
    );
  }
  if (!invitation) return <Loading label="Opening the invitation…" />;

  const accept = async () => {
    setBusy(true);
    setFailure(null);
    try {
      const studio = await acceptInvitation(token);
      router.replace(STAFF_ROLES.includes(studio.role) ? '/trials' : '/my-trials');
    } catch (e) {
      setFailure(e instanceof Error ? e.message : 'The invitation could not be accepted.');
      setBusy(false);
    }
  };

  return (
    <Screen title={`Join ${invitation.studio.name}`}>
      <Card title={`You are invited as ${ROLE_LABELS[invitation.role].toLowerCase()}`}>
        <AppText>{`The invitation was sent to ${invitation.email}.`}</AppText>
        {invitation.state !== 'open' ? <Notice tone="error">{STATE_MESSAGES[invitation.state]}</Notice> : null}
        {failure ? <Notice tone="error">{failure}</Notice> : null}
        {invitation.state === 'open' && session ? (
          <>
            <AppText variant="caption">{`Signed in as ${session.user.email}.`}</AppText>
            <Button label="Accept the invitation" busyLabel="Joining…" busy={busy} onPress={accept} />
          </>
        ) : null}
        {invitation.state === 'open' && session === null ? (
          <>
            <AppText>Sign in with the address the invitation was sent to, or create an account with it.</AppText>
            <ButtonLink href={{ pathname: '/sign-up', params: { next: here } }} label="Create an account" />
            <ButtonLink href={{ pathname: '/sign-in', params: { next: here } }} label="I have an account" tone="quiet" />
          </>
        ) : null}
      </Card>
    </Screen>
  );
}
