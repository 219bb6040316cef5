import { zodResolver } from '@hookform/resolvers/zod';
import dayjs from 'dayjs';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { applyApiError } from '@/components/forms/api-errors';
import { FormTextField } from '@/components/forms/form-text-field';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { Empty, LoadError } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { ToggleChips } from '@/components/ui/toggle-chips';
import { colors, fonts, space } from '@/constants/theme';
import { sendAnnouncement, useAnnouncements } from '@/hooks/use-release';
import { ANNOUNCEMENT_STATUS_LABELS, ANNOUNCEMENT_STATUSES, announcementSchema, type AnnouncementInput } from '@/server/domain/schemas/release';

type Props = { studioId: string; trialId: string; sizes: { id: string; label: string }[]; canSend: boolean };

function AnnouncementForm({ studioId, trialId, sizes }: Omit<Props, 'canSend'>) {
  const [formError, setFormError] = useState<string | null>(null);
  const [sent, setSent] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState, reset } = useForm<AnnouncementInput>({
    resolver: zodResolver(announcementSchema),
    defaultValues: { subject: '', body: '', statuses: ['active', 'finished'], sizeIds: [] },
  });
  const submit = handleSubmit(async (values) => {
    setFormError(null);
    setSent(null);
    try {
      const row = await sendAnnouncement(studioId, trialId, values);
      setSent(`Sent to ${row.recipients} ${row.recipients === 1 ? 'tester' : 'testers'}; their replies go to ${row.replyTo}.`);
      reset({ subject: '', body: '', statuses: values.statuses, sizeIds: values.sizeIds });
    } catch (error) {
      setFormError(applyApiError(error, setError, ['subject', 'body', 'statuses', 'sizeIds']));
    }
  });
  return (
    <View style={styles.form}>
      <FormTextField control={control} name="subject" label="Subject" />
      <FormTextField control={control} name="body" label="Message" multiline hint="A blank line starts a new paragraph." />
      <Controller
        control={control}
        name="statuses"
        render={({ field, fieldState }) => (
          <View>
            <ToggleChips label="To testers who are" options={ANNOUNCEMENT_STATUSES.map((s) => ({ value: s, label: ANNOUNCEMENT_STATUS_LABELS[s] }))} selected={field.value} onChange={field.onChange} />
            {fieldState.error ? <AppText style={styles.error}>{fieldState.error.message}</AppText> : null}
          </View>
        )}
      />
      <Controller
        control={control}
        name="sizeIds"
        render={({ field }) => (
          <ToggleChips label="Only these sizes (none chosen: every size)" options={sizes.map((s) => ({ value: s.id, label: s.label }))} selected={field.value ?? []} onChange={field.onChange} />
        )}
      />
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      {sent ? <Notice tone="success">{sent}</Notice> : null}
      <Button label="Send the message" busy={formState.isSubmitting} busyLabel="Sending…" onPress={submit} />
    </View>
  );
}

/** The studio's messages to a trial's testers: what was sent to whom, and a new one. */
export function AnnouncementsPanel({ studioId, trialId, sizes, canSend }: Props) {
  const { data, error, mutate } = useAnnouncements(studioId, trialId);
  return (
    <Card title="Messages to testers">
      <AppText variant="caption">Each tester gets the message by e-mail, with replies going to the studio’s contact address, and finds it in My trials.</AppText>
      {canSend ? <AnnouncementForm studioId={studioId} trialId={trialId} sizes={sizes} /> : null}
      {error ? <LoadError error={error} onRetry={() => mutate()} /> : null}
      {data && data.length === 0 ? <Empty>No message sent yet.</Empty> : null}
      {data?.map((a) => (
        <View key={a.id} style={styles.item}>
          <AppText style={styles.strong}>{a.subject}</AppText>
          <AppText variant="caption">
            {`${dayjs(a.createdAt).format('D MMM YYYY, HH:mm')}${a.author ? ` · ${a.author}` : ''} · to ${a.recipients} (${a.audience.statuses.map((s) => ANNOUNCEMENT_STATUS_LABELS[s as keyof typeof ANNOUNCEMENT_STATUS_LABELS].toLowerCase()).join(', ')}${a.audience.sizeIds.length ? `; sizes ${a.audience.sizeIds.map((id) => sizes.find((s) => s.id === id)?.label ?? '?').join(', ')}` : ''}) · ${a.mail.sent} sent${a.mail.skipped ? `, ${a.mail.skipped} turned off` : ''}${a.mail.failed ? `, ${a.mail.failed} failed` : ''}`}
          </AppText>
          <AppText>{a.body}</AppText>
        </View>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.sm },
  item: { gap: 2, paddingVertical: space.sm, borderTopWidth: 1, borderTopColor: colors.line },
  strong: { fontFamily: fonts.semibold },
  error: { color: colors.warning, fontFamily: fonts.medium },
});
