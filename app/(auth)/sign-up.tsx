import { ButtonLink } from '@/components/ui/button-link';
import { PlannedSection } from '@/components/ui/planned-section';
import { Screen } from '@/components/ui/screen';

export default function SignUpScreen() {
  return (
    <Screen title="Create an account" intro="One account works in every studio you design, grade or test for.">
      <PlannedSection items={['Name, e-mail and password', 'Accepting an invitation to a studio']} />
      <ButtonLink href="/sign-in" label="I already have an account" tone="quiet" />
    </Screen>
  );
}
