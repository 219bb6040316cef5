import { useLocalSearchParams } from 'expo-router';
import useSWR from 'swr';
import { AdviceView } from '@/components/patterns/advice-view';
import { ButtonLink } from '@/components/ui/button-link';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { LoadError, Loading } from '@/components/ui/states';
import { ApiError } from '@/hooks/api';
import { patternKeys } from '@/hooks/use-patterns';
import { useSession } from '@/hooks/use-session';
import type { SizeAdvice } from '@/server/domain/size-advice';

type AdviceResponse = { pattern: { id: string; name: string }; measurementsMm: Record<string, number>; advice: SizeAdvice };

/** A tester's own size advice for one pattern, from the measurements in their profile. */
export default function MySizeAdviceScreen() {
  const { patternId } = useLocalSearchParams<{ patternId: string }>();
  const { currentStudio } = useSession();
  const key = currentStudio && patternId ? `${patternKeys.one(currentStudio.id, patternId)}/size-advice` : null;
  const { data, error, mutate } = useSWR<AdviceResponse>(key);

  if (error) {
    return (
      <Screen title="Your size">
        {error instanceof ApiError && error.status === 404 ? <Notice tone="error">This pattern is not available to you.</Notice> : <LoadError error={error} onRetry={() => mutate()} />}
      </Screen>
    );
  }
  if (!data) return <Loading label="Working out your size…" />;
  const measured = Object.keys(data.measurementsMm).length > 0;
  return (
    <Screen title={`Your size for ${data.pattern.name}`} intro="From the measurements in your profile and the pattern’s size chart. Measure again if you are unsure: a tape pulled tight changes the answer.">
      {!measured ? <Notice tone="info">Your profile has no measurements yet. Add them to get advice.</Notice> : null}
      <AdviceView advice={data.advice} />
      <ButtonLink href="/profile" label="Update my measurements" tone="quiet" />
    </Screen>
  );
}
