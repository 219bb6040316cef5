import { zodResolver } from '@hookform/resolvers/zod';
import { useLocalSearchParams, useRouter } from 'expo-router';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { applyApiError } from '@/components/forms/api-errors';
import { safeNext } from '@/components/forms/safe-next';
import { landingFor } from '@/components/layout/require-session';
import { Button } from '@/components/ui/button';
import { ButtonLink } from '@/components/ui/button-link';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { TextField } from '@/components/ui/text-field';
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
      <Controller
        control={control}
        name="email"
        render={({ field, fieldState }) => (
          <TextField
            label="E-mail"
            value={field.value}
            onChangeText={field.onChange}
            onBlur={field.onBlur}
            error={fieldState.error?.message}
            autoComplete="email"
            inputMode="email"
            autoCapitalize="none"
          />
        )}
      />
      <Controller
        control={control}
        name="password"
        render={({ field, fieldState }) => (
          <TextField
            label="Password"
            value={field.value}
            onChangeText={field.onChange}
            onBlur={field.onBlur}
            onSubmitEditing={submit}
            error={fieldState.error?.message}
            secureTextEntry
            autoComplete="current-password"
          />
        )}
      />
      <Button label="Sign in" busyLabel="Signing in…" busy={formState.isSubmitting} onPress={submit} />
      <ButtonLink href={{ pathname: '/sign-up', params: next ? { next } : {} }} label="Create an account" tone="quiet" />
      <ButtonLink href="/reset-password" label="Forgot your password?" tone="quiet" />
    </Screen>
  );
}
