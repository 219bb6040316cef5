import { PlannedSection } from '@/components/ui/planned-section';
import { Screen } from '@/components/ui/screen';

export default function FindingsScreen() {
  return (
    <Screen title="Findings" intro="What the fit reports say once they are added up.">
      <PlannedSection
        items={[
          "Alterations per size with their rates and intervals",
          "Whether a problem lies in the draft, the grading or one tester's body",
          "Whether the next draft fixed it, with triage notes",
        ]}
      />
    </Screen>
  );
}
