import { zodResolver } from '@hookform/resolvers/zod';
import { useLocalSearchParams, useRouter } from 'expo-router';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { applyApiError } from '@/components/forms/api-errors';
import { EMAIL_INPUT, FormTextField } from '@/components/forms/form-text-field';
import { safeNext } from '@/components/forms/safe-next';
import { landingFor } from '@/components/layout/require-session';
import { Button } from '@/components/ui/button';
import { ButtonLink } from '@/components/ui/button-link';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { signUp } from '@/hooks/use-session';
import { signUpSchema, type SignUpInput } from '@/server/domain/schemas/auth';
import { deviceTimeZone } from '@/server/domain/time-zones';

export default function SignUpScreen() {
  const router = useRouter();
  const { next } = useLocalSearchParams<{ next?: string }>();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<SignUpInput>({
    resolver: zodResolver(signUpSchema),
    // The zone this device is set to: reminders then reach the person on their own mornings.
    defaultValues: { name: '', email: '', password: '', timeZone: deviceTimeZone() },
  });

  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      const session = await signUp(values);
      router.replace(safeNext(next) ?? landingFor(session));
    } catch (error) {
      setFormError(applyApiError(error, setError, ['name', 'email', 'password', 'timeZone'], { name: 'Your name', email: 'E-mail', password: 'Password', timeZone: 'Time zone' }));
    }
  });

  return (
    <Screen title="Create an account" intro="One account works in every studio you design, grade or test for.">
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
