import { ButtonLink } from '@/components/ui/button-link';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';

/** Where a person lands after deleting their account: what was removed and what stays. */
export default function AccountDeletedScreen() {
  return (
    <Screen title="Your account is deleted">
      <Notice tone="success">
        Your account, your body measurements and your photos are deleted. Reports you already sent stay in the studios’ findings without your name, e-mail or measurements, so the counts
        the designers worked from do not change.
      </Notice>
      <ButtonLink href="/" label="Back to Basted" tone="quiet" />
    </Screen>
  );
}
