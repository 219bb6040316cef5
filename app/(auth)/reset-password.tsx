import { zodResolver } from '@hookform/resolvers/zod';
import { useLocalSearchParams, useRouter } from 'expo-router';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { applyApiError } from '@/components/forms/api-errors';
import { EMAIL_INPUT, FormTextField } from '@/components/forms/form-text-field';
import { landingFor } from '@/components/layout/require-session';
import { Button } from '@/components/ui/button';
import { ButtonLink } from '@/components/ui/button-link';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { confirmPasswordReset, requestPasswordReset } from '@/hooks/use-session';
import { passwordSchema, resetRequestSchema, type ResetRequestInput } from '@/server/domain/schemas/auth';
import { z } from 'zod';

const newPasswordSchema = z.object({ password: passwordSchema });

function AskForLink() {
  const [sent, setSent] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<ResetRequestInput>({
    resolver: zodResolver(resetRequestSchema),
    defaultValues: { email: '' },
  });
  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      setSent(await requestPasswordReset(values));
    } catch (error) {
      setFormError(applyApiError(error, setError, ['email']));
    }
  });
  return (
    <Screen title="Reset your password" intro="We e-mail you a link to choose a new password. It works once, for an hour.">
      {sent ? <Notice tone="success">{sent}</Notice> : null}
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <FormTextField control={control} name="email" label="E-mail" onSubmitEditing={submit} {...EMAIL_INPUT} />
      <Button label="Send the link" busyLabel="Sending…" busy={formState.isSubmitting} onPress={submit} />
      <ButtonLink href="/sign-in" label="Back to sign-in" tone="quiet" />
    </Screen>
  );
}

function ChooseNewPassword({ token }: { token: string }) {
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<{ password: string }>({
    resolver: zodResolver(newPasswordSchema),
    defaultValues: { password: '' },
  });
  const submit = handleSubmit(async ({ password }) => {
    setFormError(null);
    try {
      router.replace(landingFor(await confirmPasswordReset({ token, password })));
    } catch (error) {
      setFormError(applyApiError(error, setError, ['password']));
    }
  });
  return (
    <Screen title="Choose a new password" intro="Signing in with the new password ends every other session of your account.">
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <FormTextField control={control} name="password" label="New password" hint="At least 10 characters." onSubmitEditing={submit} secureTextEntry autoComplete="new-password" />
      <Button label="Save and sign in" busyLabel="Saving…" busy={formState.isSubmitting} onPress={submit} />
      <ButtonLink href="/reset-password" label="Ask for a new link" tone="quiet" />
    </Screen>
  );
}

export default function ResetPasswordScreen() {
  const { token } = useLocalSearchParams<{ token?: string }>();
  return token ? <ChooseNewPassword token={token} /> : <AskForLink />;
}
