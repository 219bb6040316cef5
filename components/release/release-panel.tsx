import dayjs from 'dayjs';
import { StyleSheet, View } from 'react-native';
import { ButtonLink } from '@/components/ui/button-link';
import { Card } from '@/components/ui/card';
import { AppText } from '@/components/ui/text';
import { space } from '@/constants/theme';
import { useReleaseStatus } from '@/hooks/use-release';

/** On the trial page: where the trial stands towards its release, and the way to the summary and the checklist. */
export function ReleasePanel({ studioId, trialId }: { studioId: string; trialId: string }) {
  const { data } = useReleaseStatus(studioId, trialId);
  const open = data ? data.checklist.filter((i) => !i.ok).length : null;
  const line = !data
    ? 'Checking the release checklist…'
    : data.released
      ? `Released on ${dayjs(data.released.at).format('D MMM YYYY')}.`
      : open === 0
        ? 'Every item of the release checklist holds.'
        : `${open} of ${data.checklist.length} release checklist items open.`;
  return (
    <Card title="Summary and release">
      <AppText>{line}</AppText>
      <View style={styles.actions}>
        <ButtonLink href={{ pathname: '/summary/[trialId]', params: { trialId } }} label="Trial summary" />
        <ButtonLink href={{ pathname: '/release/[trialId]', params: { trialId } }} label={data?.released ? 'Release and rewards' : 'Release checklist'} tone="quiet" />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
