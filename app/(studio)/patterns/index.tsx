import { PlannedSection } from '@/components/ui/planned-section';
import { Screen } from '@/components/ui/screen';

export default function PatternsScreen() {
  return (
    <Screen title="Patterns" intro="The studio's patterns with their size charts and drafts.">
      <PlannedSection
        items={[
          "Size chart and variants, with grade steps checked",
          "Finished measurements and ease per size",
          "Fabric needs per size and width",
          "Draft versions and their change notes",
        ]}
      />
    </Screen>
  );
}
