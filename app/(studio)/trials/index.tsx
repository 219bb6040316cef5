import dayjs from 'dayjs';
import { Link } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { NewTrialForm } from '@/components/trials/new-trial-form';
import { Card } from '@/components/ui/card';
import { Screen } from '@/components/ui/screen';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { colors, radius, space } from '@/constants/theme';
import { useSession } from '@/hooks/use-session';
import { useTrials } from '@/hooks/use-trials';
import { can } from '@/server/domain/policy';
import { TRIAL_STATE_LABELS } from '@/server/domain/trials';

export default function TrialsScreen() {
  const { currentStudio } = useSession();
  const { data, error, mutate } = useTrials(currentStudio?.id);
  // The time the list was opened: the next milestone is judged against it.
  const [now] = useState(() => Date.now());
  return (
    <Screen title="Trials" intro="Every fit trial of the studio, from the call for testers to the release.">
      {currentStudio && can(currentStudio.role, 'trials.write') ? <NewTrialForm studioId={currentStudio.id} /> : null}
      <Card title="The studio’s trials">
        {error ? <LoadError error={error} onRetry={() => mutate()} /> : null}
        {!data && !error ? <Loading /> : null}
        {data && data.length === 0 ? <Empty>No trials yet.</Empty> : null}
        <View style={styles.list}>
          {data?.map((t) => {
            const next = t.milestones.find((m) => new Date(m.dueAt).getTime() > now);
            return (
              <Link key={t.id} href={{ pathname: '/trials/[id]', params: { id: t.id } }} asChild>
                <Pressable role="link" style={styles.row}>
                  <AppText variant="heading">{t.title}</AppText>
                  <AppText variant="caption">
                    {`${TRIAL_STATE_LABELS[t.state]} · ${t.pattern?.name ?? ''}${next ? ` · next: ${next.label.toLowerCase()} ${dayjs(next.dueAt).format('D MMM')}` : ''}`}
                  </AppText>
                </Pressable>
              </Link>
            );
          })}
        </View>
      </Card>
    </Screen>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  row: { padding: space.md, borderRadius: radius.sm, borderWidth: 1, borderColor: colors.line, backgroundColor: colors.surface, gap: 2 },
});
