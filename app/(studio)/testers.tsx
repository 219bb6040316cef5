import { TesterPool } from '@/components/release/tester-pool';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { Loading } from '@/components/ui/states';
import { useSession } from '@/hooks/use-session';
import { can } from '@/server/domain/policy';

export default function TesterPoolScreen() {
  const { currentStudio } = useSession();
  if (!currentStudio) return <Loading />;
  if (!can(currentStudio.role, 'applicants.manage')) {
    return (
      <Screen title="Tester pool">
        <Notice tone="info">The tester pool is for the studio’s owner and coordinators, who choose testers.</Notice>
      </Screen>
    );
  }
  return <TesterPool studioId={currentStudio.id} />;
}
