import { useLocalSearchParams } from 'expo-router';
import { TrialSummaryView } from '@/components/release/trial-summary-view';
import { Loading } from '@/components/ui/states';
import { useSession } from '@/hooks/use-session';

export default function TrialSummaryScreen() {
  const { trialId } = useLocalSearchParams<{ trialId: string }>();
  const { currentStudio } = useSession();
  if (!currentStudio) return <Loading />;
  return <TrialSummaryView studioId={currentStudio.id} trialId={trialId} />;
}
