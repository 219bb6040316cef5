import { useLocalSearchParams } from 'expo-router';
import { ReleaseChecklist } from '@/components/release/release-checklist';
import { Loading } from '@/components/ui/states';
import { useSession } from '@/hooks/use-session';
import { can } from '@/server/domain/policy';

export default function ReleaseScreen() {
  const { trialId } = useLocalSearchParams<{ trialId: string }>();
  const { currentStudio } = useSession();
  if (!currentStudio) return <Loading />;
  return <ReleaseChecklist studioId={currentStudio.id} trialId={trialId} canEdit={can(currentStudio.role, 'trials.write')} canManage={can(currentStudio.role, 'applicants.manage')} />;
}
