import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'expo-router';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { applyApiError } from '@/components/forms/api-errors';
import { landingFor } from '@/components/layout/require-session';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { Empty } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { colors, space } from '@/constants/theme';
import { chooseStudio, useSession } from '@/hooks/use-session';
import { createStudio } from '@/hooks/use-studio';
import { ROLE_LABELS } from '@/server/domain/roles';
import { createStudioSchema } from '@/server/domain/schemas/studios';
import type { z } from 'zod';


function deviceTimeZone(): string {
  return Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
}

function NewStudioForm() {
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState, reset } = useForm<z.input<typeof createStudioSchema>, unknown, z.output<typeof createStudioSchema>>({
    resolver: zodResolver(createStudioSchema),
    defaultValues: { name: '', timeZone: deviceTimeZone() },
  });
  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await createStudio(values);
      reset();
      router.push('/trials');
    } catch (error) {
      setFormError(applyApiError(error, setError, ['name', 'timeZone']));
    }
  });
  return (
    <Card title="Start a studio">
      <AppText variant="caption">For your pattern brand. You become its owner and can invite coordinators, graders and testers.</AppText>
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <Controller
        control={control}
        name="name"
        render={({ field, fieldState }) => (
          <TextField label="Studio name" value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={fieldState.error?.message} />
        )}
      />
      <Controller
        control={control}
        name="timeZone"
        render={({ field, fieldState }) => (
          <TextField
            label="Time zone"
            hint="Deadlines are set in this zone, e.g. Europe/Lisbon."
            value={field.value}
            onChangeText={field.onChange}
            onBlur={field.onBlur}
            error={fieldState.error?.message}
            autoCapitalize="none"
          />
        )}
      />
      <Button label="Create studio" busyLabel="Creating…" busy={formState.isSubmitting} onPress={submit} />
    </Card>
  );
}

export default function StudiosScreen() {
  const router = useRouter();
  const { session } = useSession();
  const [switching, setSwitching] = useState<string | null>(null);
  const [failure, setFailure] = useState<string | null>(null);
  if (!session) return null;

  const open = async (studioId: string) => {
    setSwitching(studioId);
    setFailure(null);
    try {
      await chooseStudio(studioId);
      router.push(landingFor({ ...session, currentStudioId: studioId }));
    } catch (error) {
      setFailure(error instanceof Error ? error.message : 'Could not switch studio.');
    } finally {
      setSwitching(null);
    }
  };

  return (
    <Screen title="Your studios" intro="Each studio is one pattern brand. You may hold a different role in each.">
      {failure ? <Notice tone="error">{failure}</Notice> : null}
      {session.studios.length === 0 ? (
        <Empty>You are not in any studio yet. Start your own below, or open an invitation a studio sent you.</Empty>
      ) : (
        <View style={styles.list}>
          {session.studios.map((studio) => {
            const current = studio.id === session.currentStudioId;
            return (
              <View key={studio.id} style={[styles.row, current && styles.current]}>
                <View style={styles.grow}>
                  <AppText variant="heading">{studio.name}</AppText>
                  <AppText variant="caption">{`${ROLE_LABELS[studio.role]}${current ? ' · current studio' : ''}`}</AppText>
                </View>
                <Button
                  label={current ? 'Open' : 'Switch to this studio'}
                  tone="quiet"
                  busy={switching === studio.id}
                  busyLabel="Switching…"
                  onPress={() => open(studio.id)}
                />
              </View>
            );
          })}
        </View>
      )}
      <NewStudioForm />
    </Screen>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  row: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    gap: space.md,
    padding: space.md,
    borderRadius: 10,
    borderWidth: 1,
    borderColor: colors.line,
    backgroundColor: colors.surface,
  },
  current: { borderColor: colors.thread },
  grow: { flex: 1, minWidth: 180 },
});
