import { PlannedSection } from '@/components/ui/planned-section';
import { Screen } from '@/components/ui/screen';

export default function ProfileScreen() {
  return (
    <Screen title="Profile" intro="Your body measurements and preferences, copied into each application you make.">
      <PlannedSection
        items={[
          "Measurements in inches or centimetres",
          "Height, time zone and sewing experience",
          "Which e-mails you receive",
        ]}
      />
    </Screen>
  );
}
