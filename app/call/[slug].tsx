import { useLocalSearchParams } from 'expo-router';
import { ApplyForm } from '@/components/trials/apply-form';
import { describeInstant } from '@/components/trials/dates';
import { ButtonLink } from '@/components/ui/button-link';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { ApiError } from '@/hooks/api';
import { useSession } from '@/hooks/use-session';
import { useCall } from '@/hooks/use-trials';
import { GARMENT_CATEGORIES } from '@/server/domain/garments';

// The public call for testers of one trial: readable without signing in.
export default function CallScreen() {
  const { slug } = useLocalSearchParams<{ slug: string }>();
  const { session } = useSession();
  const { data: call, error, mutate } = useCall(slug);
  if (error) {
    return (
      <Screen title="Call for testers">
        {error instanceof ApiError && error.status === 404 ? <Notice tone="error">This call is not open. The link may be old, or the studio has closed it.</Notice> : <LoadError error={error} onRetry={() => mutate()} />}
      </Screen>
    );
  }
  if (!call) return <Loading />;
  // Dates in the reader's own zone once signed in, else in the studio's.
  const zone = session?.user.timeZone ?? call.studio.timeZone;
  const describeDue = (iso: string) => describeInstant(iso, zone);
  const here = `/call/${call.slug}`;
  return (
    <Screen title={call.title} intro={`${call.studio.name} is looking for testers: ${call.pattern.name} (${GARMENT_CATEGORIES.find((c) => c.key === call.pattern.category)?.label ?? call.pattern.category}).`}>
      <Card title="Call for testers">
        {call.callText ? <AppText>{call.callText}</AppText> : null}
        {call.requirements ? <AppText variant="caption">{`Requirements: ${call.requirements}`}</AppText> : null}
        <AppText variant="caption">{`Sizes wanted: ${call.sizes.map((s) => s.label).join(', ')}`}</AppText>
        {call.milestones.map((m) => (
          <AppText key={m.kind} variant="caption">{`${m.label}: ${describeDue(m.dueAt)}`}</AppText>
        ))}
      </Card>
      {!call.accepting ? <Notice tone="info">{call.closesAt ? `Applications closed on ${describeDue(call.closesAt)}.` : 'This call is not taking applications.'}</Notice> : null}
      {call.accepting && session === null ? (
        <Card title="Apply">
          <AppText>Applying needs a free account, so the studio can reach you and you can follow your trial.</AppText>
          <ButtonLink href={{ pathname: '/sign-up', params: { next: here } }} label="Create an account and apply" />
          <ButtonLink href={{ pathname: '/sign-in', params: { next: here } }} label="I have an account" tone="quiet" />
        </Card>
      ) : null}
      {call.accepting && session ? <ApplyForm call={call} describeDue={describeDue} /> : null}
    </Screen>
  );
}
