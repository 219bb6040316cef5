import { useLocalSearchParams, useRouter } from 'expo-router';
import { TrialFindings } from '@/components/findings/trial-findings';
import { Loading } from '@/components/ui/states';
import { useSession } from '@/hooks/use-session';

export default function TrialFindingsScreen() {
  // ?draft=N keeps the chosen draft in the address, so a link can open draft 2 directly.
  const { trialId, draft } = useLocalSearchParams<{ trialId: string; draft?: string }>();
  const router = useRouter();
  const { session, currentStudio } = useSession();
  if (!session || !currentStudio || !trialId) return <Loading />;
  return (
    <TrialFindings
      studioId={currentStudio.id}
      trialId={trialId}
      role={currentStudio.role}
      lengthUnit={session.user.lengthUnit ?? 'cm'}
      fabricUnit={session.user.fabricUnit ?? 'm'}
      initialDraft={typeof draft === 'string' && /^\d+$/.test(draft) ? draft : undefined}
      onDraftChange={(d) => router.setParams({ draft: d })}
    />
  );
}
