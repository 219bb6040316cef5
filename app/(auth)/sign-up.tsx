import { zodResolver } from '@hookform/resolvers/zod';
import { useLocalSearchParams } from 'expo-router';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { applyApiError } from '@/components/forms/api-errors';
import { EMAIL_INPUT, FormTextField } from '@/components/forms/form-text-field';
import { safeNext } from '@/components/forms/safe-next';
import { Button } from '@/components/ui/button';
import { ButtonLink } from '@/components/ui/button-link';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { AppText } from '@/components/ui/text';
import { signUp } from '@/hooks/use-session';
import { signUpSchema, type SignUpInput } from '@/server/domain/schemas/auth';
import { deviceTimeZone } from '@/server/domain/time-zones';

export default function SignUpScreen() {
  const { next } = useLocalSearchParams<{ next?: string }>();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<SignUpInput>({
    resolver: zodResolver(signUpSchema),
    // The zone this device is set to: reminders then reach the person on their own mornings.
    defaultValues: { name: '', email: '', password: '', timeZone: deviceTimeZone() },
  });

  const [sent, setSent] = useState<string | null>(null);
  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      const back = safeNext(next);
      // The link in the e-mail brings the person back to where they were going (e.g. an invitation).
      setSent(await signUp({ ...values, ...(back ? { next: String(back) } : {}) }));
    } catch (error) {
      setFormError(applyApiError(error, setError, ['name', 'email', 'password', 'timeZone'], { name: 'Your name', email: 'E-mail', password: 'Password', timeZone: 'Time zone' }));
    }
  });

  if (sent) {
    return (
      <Screen title="Check your e-mail" intro="One more step: confirm that the address is yours.">
        <Notice tone="success">{sent}</Notice>
        <AppText>The link works once, for a day. Nothing arrived? Look in the spam folder, or create the account again to get a new link.</AppText>
        <Button label="Use another address" tone="quiet" onPress={() => setSent(null)} />
      </Screen>
    );
  }

  return (
    <Screen title="Create an account" intro="One account works in every studio you design, grade or test for. We e-mail you a link to confirm your address.">
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <FormTextField control={control} name="name" label="Your name" autoComplete="name" />
      <FormTextField control={control} name="email" label="E-mail" {...EMAIL_INPUT} />
      <FormTextField control={control} name="password" label="Password" hint="At least 10 characters. A few unrelated words make a strong one." secureTextEntry autoComplete="new-password" />
      <FormTextField control={control} name="timeZone" label="Time zone" hint="Taken from this device. Reminders arrive in your morning and times show in this zone; change it here or later in your profile." autoCapitalize="none" autoCorrect={false} onSubmitEditing={submit} />
      <Button label="Create account" busyLabel="Creating your account…" busy={formState.isSubmitting} onPress={submit} />
      <ButtonLink href={{ pathname: '/sign-in', params: next ? { next } : {} }} label="I already have an account" tone="quiet" />
    </Screen>
  );
}
