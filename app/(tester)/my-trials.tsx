import { PlannedSection } from '@/components/ui/planned-section';
import { Screen } from '@/components/ui/screen';

export default function MyTrialsScreen() {
  return (
    <Screen title="My trials" intro="The trials you applied to or test in.">
      <PlannedSection
        items={[
          "Each trial with its next due date and what is expected",
          "The draft files you may download",
          "Your size advice, check-in and final report",
        ]}
      />
    </Screen>
  );
}
