import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'expo-router';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { applyApiError } from '@/components/forms/api-errors';
import { FormTextField } from '@/components/forms/form-text-field';
import { startDownload } from '@/components/patterns/download';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { colors, fonts, space } from '@/constants/theme';
import { deleteMyAccount, forgetSession, myDataKeys } from '@/hooks/use-my-data';
import { deleteAccountSchema, type DeleteAccountInput } from '@/server/domain/schemas/release';

function DeleteAccount() {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<DeleteAccountInput>({
    resolver: zodResolver(deleteAccountSchema),
    defaultValues: { password: '', confirm: '' as 'delete' },
  });
  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await deleteMyAccount(values);
      router.replace('/account-deleted');
      await forgetSession();
    } catch (error) {
      setFormError(applyApiError(error, setError, ['password', 'confirm']));
    }
  });
  if (!open) return <Button label="Delete my account…" tone="danger" onPress={() => setOpen(true)} />;
  return (
    <View style={styles.danger}>
      <AppText style={styles.strong}>Deleting your account</AppText>
      <AppText variant="caption">
        Removes your account, your body measurements (your profile and the copies made when you applied) and every photo you uploaded. It cannot be undone. Reports you already sent stay in
        the studios’ findings, without your name, e-mail or measurements, so the counts designers worked from stay the same. Download your data first if you want a copy.
      </AppText>
      <FormTextField control={control} name="password" label="Your password" secureTextEntry autoComplete="current-password" />
      <FormTextField control={control} name="confirm" label="Type delete to confirm" autoCapitalize="none" />
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <View style={styles.actions}>
        <Button label="Delete my account" tone="danger" busy={formState.isSubmitting} busyLabel="Deleting…" onPress={submit} />
        <Button label="Keep my account" tone="quiet" onPress={() => setOpen(false)} />
      </View>
    </View>
  );
}

/** Everything Basted holds about the person, to take away or to delete. */
export function MyDataCard() {
  return (
    <Card title="My data">
      <AppText variant="caption">A ZIP with your profile, applications, reports and photos (JSON files and the images).</AppText>
      <Button label="Download all my data (ZIP)" tone="quiet" onPress={() => startDownload(myDataKeys.export)} />
      <DeleteAccount />
    </Card>
  );
}

const styles = StyleSheet.create({
  danger: { gap: space.sm, padding: space.md, borderWidth: 1, borderColor: colors.warning, borderRadius: 8, backgroundColor: colors.warningSoft },
  strong: { fontFamily: fonts.semibold },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
