import { Link } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';
import { AnalysisSettingsCard } from '@/components/studio/analysis-settings-card';
import { Card } from '@/components/ui/card';
import { Screen } from '@/components/ui/screen';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { colors, radius, space } from '@/constants/theme';
import { useSession } from '@/hooks/use-session';
import { useTrials } from '@/hooks/use-trials';
import { can } from '@/server/domain/policy';
import { TRIAL_STATE_LABELS } from '@/server/domain/trials';

export default function FindingsScreen() {
  const { currentStudio } = useSession();
  const { data, error, mutate } = useTrials(currentStudio?.id);
  return (
    <Screen title="Findings" intro="What the reports of each trial add up to: which alterations cluster in which sizes, and whether the next draft fixed them.">
      <Card title="Choose a trial">
        {error ? <LoadError error={error} onRetry={() => mutate()} /> : null}
        {!data && !error ? <Loading /> : null}
        {data && data.length === 0 ? <Empty>No trials yet: findings appear once a trial has reports.</Empty> : null}
        <View style={styles.list}>
          {data?.map((t) => (
            <Link key={t.id} href={{ pathname: '/findings/[trialId]', params: { trialId: t.id } }} asChild>
              <Pressable role="link" style={styles.row}>
                <AppText variant="caption">Findings of</AppText>
                <AppText variant="heading">{t.title}</AppText>
                <AppText variant="caption">{`${TRIAL_STATE_LABELS[t.state]} · ${t.pattern?.name ?? ''}`}</AppText>
              </Pressable>
            </Link>
          ))}
        </View>
      </Card>
      {currentStudio ? <AnalysisSettingsCard studioId={currentStudio.id} canEdit={can(currentStudio.role, 'studio.update')} /> : null}
    </Screen>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  row: { padding: space.md, borderRadius: radius.sm, borderWidth: 1, borderColor: colors.line, backgroundColor: colors.surface, gap: 2 },
});
