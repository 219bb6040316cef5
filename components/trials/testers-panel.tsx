import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import useSWR from 'swr';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { colors, fonts, radius, space } from '@/constants/theme';
import { api } from '@/hooks/api';
import { trialKeys } from '@/hooks/use-trials';
import { describeInstant, fromLocalText, LOCAL_FORMAT, toLocalText } from './dates';

type Roster = { id: string; status: string; tester: { name: string }; size: { label: string }; dues: { kind: string; label: string; dueAt: string; extended: boolean }[] }[];

/** The enrolled testers against the timeline, and more time for one of them. */
export function TestersPanel({ studioId, trialId, timeZone }: { studioId: string; trialId: string; timeZone: string }) {
  const key = trialKeys.enrollments(studioId, trialId);
  const { data, error, mutate } = useSWR<Roster>(key);
  const [editing, setEditing] = useState<{ id: string; kind: string; text: string } | null>(null);
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);

  const save = async () => {
    if (!editing) return;
    const iso = fromLocalText(editing.text, timeZone);
    if (!iso) {
      setMessage({ tone: 'error', text: `New date: write it as ${LOCAL_FORMAT}, e.g. 2027-03-01 18:00.` });
      return;
    }
    try {
      await api(`${trialKeys.one(studioId, trialId)}/enrollments/${editing.id}/due`, { method: 'PATCH', body: { kind: editing.kind, dueAt: iso } });
      await mutate();
      setEditing(null);
      setMessage({ tone: 'success', text: 'New date saved for this tester.' });
    } catch (e) {
      setMessage({ tone: 'error', text: e instanceof Error ? e.message : 'Not saved.' });
    }
  };

  return (
    <Card title="Testers">
      {error ? <LoadError error={error} onRetry={() => mutate()} /> : null}
      {!data && !error ? <Loading /> : null}
      {data && data.length === 0 ? <Empty>No one is enrolled yet.</Empty> : null}
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      {data?.map((e) => (
        <View key={e.id} style={styles.row}>
          <AppText style={styles.strong}>{`${e.tester.name} · size ${e.size.label} · ${e.status}`}</AppText>
          {e.dues.map((d) => (
            <View key={d.kind} style={styles.due}>
              <AppText variant="caption">{`${d.label}: ${describeInstant(d.dueAt, timeZone)}${d.extended ? ' (more time given)' : ''}`}</AppText>
              {editing?.id === e.id && editing.kind === d.kind ? (
                <>
                  <TextField label={`New date for ${e.tester.name}, ${d.label.toLowerCase()}`} value={editing.text} onChangeText={(text) => setEditing({ ...editing, text })} />
                  <Button label="Save the new date" onPress={save} />
                </>
              ) : (
                <Button label="Give more time" accessibleLabel={`Give more time: ${e.tester.name}, ${d.label}`} tone="quiet" onPress={() => setEditing({ id: e.id, kind: d.kind, text: toLocalText(d.dueAt, timeZone) })} />
              )}
            </View>
          ))}
        </View>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  row: { gap: space.xs, paddingVertical: space.sm, borderTopWidth: 1, borderTopColor: colors.line },
  due: { gap: space.xs, padding: space.sm, borderRadius: radius.sm, backgroundColor: colors.surfaceSunken },
  strong: { fontFamily: fonts.semibold },
});
