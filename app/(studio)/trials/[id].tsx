import { useLocalSearchParams } from 'expo-router';
import { FindingsSummary } from '@/components/findings/findings-summary';
import { OutboxPanel } from '@/components/mail/outbox-panel';
import { PhotoWall } from '@/components/photos/photo-wall';
import { AnnouncementsPanel } from '@/components/release/announcements-panel';
import { ReleasePanel } from '@/components/release/release-panel';
import { ApplicantsPanel } from '@/components/trials/applicants-panel';
import { CallEditor } from '@/components/trials/call-editor';
import { TargetsEditor } from '@/components/trials/targets-editor';
import { ReportsPanel } from '@/components/trials/reports-panel';
import { TestersPanel } from '@/components/trials/testers-panel';
import { ButtonLink } from '@/components/ui/button-link';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { LoadError, Loading } from '@/components/ui/states';
import { ApiError } from '@/hooks/api';
import { useSession } from '@/hooks/use-session';
import { useTrial } from '@/hooks/use-trials';
import { can } from '@/server/domain/policy';
import { TRIAL_STATE_LABELS } from '@/server/domain/trials';

export default function TrialScreen() {
  const { id } = useLocalSearchParams<{ id: string }>();
  const { session, currentStudio } = useSession();
  const { data: trial, error, mutate } = useTrial(currentStudio?.id, id);
  if (error) {
    return (
      <Screen title="Trial">
        {error instanceof ApiError && error.status === 404 ? <Notice tone="error">There is no such trial in this studio.</Notice> : <LoadError error={error} onRetry={() => mutate()} />}
      </Screen>
    );
  }
  if (!trial || !currentStudio || !session) return <Loading />;
  const canEdit = can(currentStudio.role, 'trials.write');
  return (
    <Screen title={trial.title} intro={`${TRIAL_STATE_LABELS[trial.state]} · ${trial.pattern?.name ?? ''}`}>
      {trial.state !== 'draft' ? <ButtonLink href={{ pathname: '/call/[slug]', params: { slug: trial.slug } }} label="Open the public call" tone="quiet" /> : null}
      <ReleasePanel studioId={currentStudio.id} trialId={trial.id} />
      <CallEditor key={`call-${trial.id}`} studioId={currentStudio.id} trial={trial} timeZone={currentStudio.timeZone} canEdit={canEdit} />
      <TargetsEditor key={`targets-${trial.id}`} studioId={currentStudio.id} trial={trial} unit={session.user.lengthUnit} canEdit={canEdit} />
      {can(currentStudio.role, 'applicants.manage') ? <ApplicantsPanel studioId={currentStudio.id} trialId={trial.id} unit={session.user.lengthUnit} /> : null}
      <ReportsPanel studioId={currentStudio.id} trial={trial} unit={session.user.lengthUnit} fabricUnit={session.user.fabricUnit} canMap={can(currentStudio.role, 'alterations.map')} />
      <PhotoWall studioId={currentStudio.id} trialId={trial.id} />
      <FindingsSummary studioId={currentStudio.id} trialId={trial.id} role={currentStudio.role} lengthUnit={session.user.lengthUnit} />
      {can(currentStudio.role, 'applicants.manage') ? <TestersPanel studioId={currentStudio.id} trialId={trial.id} timeZone={currentStudio.timeZone} /> : null}
      <AnnouncementsPanel studioId={currentStudio.id} trialId={trial.id} sizes={trial.pattern?.sizes ?? []} canSend={canEdit} />
      {can(currentStudio.role, 'applicants.manage') ? <OutboxPanel studioId={currentStudio.id} trialId={trial.id} timeZone={currentStudio.timeZone} /> : null}
    </Screen>
  );
}
