import { PlannedSection } from '@/components/ui/planned-section';
import { Screen } from '@/components/ui/screen';

export default function MembersScreen() {
  return (
    <Screen title="Members" intro="Who works in this studio, and in which role.">
      <PlannedSection
        items={[
          "Owner, coordinators, graders and testers",
          "Invitations by e-mail",
        ]}
      />
    </Screen>
  );
}
