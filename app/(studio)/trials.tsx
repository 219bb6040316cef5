import { PlannedSection } from '@/components/ui/planned-section';
import { Screen } from '@/components/ui/screen';

export default function TrialsScreen() {
  return (
    <Screen title="Trials" intro="Every fit trial of the studio, from the call for testers to the release.">
      <PlannedSection
        items={[
          "Each trial with its state, pattern and next milestone",
          "A trial's call, applicants with the coverage grid, testers, reports, findings, photos and mail",
        ]}
      />
    </Screen>
  );
}
