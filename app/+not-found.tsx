import { ButtonLink } from '@/components/ui/button-link';
import { Screen } from '@/components/ui/screen';

export default function NotFoundScreen() {
  return (
    <Screen title="Page not found" intro="There is nothing at this address. It may have moved, or the link may be mistyped.">
      <ButtonLink href="/" label="Go to the start page" />
    </Screen>
  );
}
