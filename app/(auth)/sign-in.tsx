import { ButtonLink } from '@/components/ui/button-link';
import { PlannedSection } from '@/components/ui/planned-section';
import { Screen } from '@/components/ui/screen';

export default function SignInScreen() {
  return (
    <Screen title="Sign in" intro="Studio staff and testers sign in here.">
      <PlannedSection items={['E-mail and password sign-in', 'A link to reset a forgotten password']} />
      <ButtonLink href="/sign-up" label="Create an account" tone="quiet" />
    </Screen>
  );
}
