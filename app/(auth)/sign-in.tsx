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
import { signIn } from '@/hooks/use-session';
import { signInSchema, type SignInInput } from '@/server/domain/schemas/auth';

export default function SignInScreen() {
  const router = useRouter();
  const { next } = useLocalSearchParams<{ next?: string }>();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<SignInInput>({
    resolver: zodResolver(signInSchema),
    defaultValues: { email: '', password: '' },
  });

  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      const session = await signIn(values);
      router.replace(safeNext(next) ?? landingFor(session));
    } catch (error) {
      setFormError(applyApiError(error, setError, ['email', 'password']));
    }
  });

  return (
    <Screen title="Sign in" intro="Studio staff and testers sign in here.">
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <FormTextField control={control} name="email" label="E-mail" {...EMAIL_INPUT} />
      <FormTextField control={control} name="password" label="Password" onSubmitEditing={submit} secureTextEntry autoComplete="current-password" />
      <Button label="Sign in" busyLabel="Signing in…" busy={formState.isSubmitting} onPress={submit} />
      <ButtonLink href={{ pathname: '/sign-up', params: next ? { next } : {} }} label="Create an account" tone="quiet" />
      <ButtonLink href="/reset-password" label="Forgot your password?" tone="quiet" />
    </Screen>
  );
}
