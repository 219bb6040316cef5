import { useLocalSearchParams } from 'expo-router';
import { TrialFindings } from '@/components/findings/trial-findings';
import { Loading } from '@/components/ui/states';
import { useSession } from '@/hooks/use-session';

export default function TrialFindingsScreen() {
  const { trialId } = useLocalSearchParams<{ trialId: string }>();
  const { session, currentStudio } = useSession();
  if (!session || !currentStudio || !trialId) return <Loading />;
  return (
    <TrialFindings
      studioId={currentStudio.id}
      trialId={trialId}
      role={currentStudio.role}
      lengthUnit={session.user.lengthUnit ?? 'cm'}
      fabricUnit={session.user.fabricUnit ?? 'm'}
    />
  );
}
