import { useLocalSearchParams } from 'expo-router';
import { PlannedSection } from '@/components/ui/planned-section';
import { Screen } from '@/components/ui/screen';

// The public call for testers of one trial: readable without signing in.
export default function CallScreen() {
  const { slug } = useLocalSearchParams<{ slug: string }>();
  return (
    <Screen title="Call for testers" intro={`Trial: ${slug}`}>
      <PlannedSection
        items={['What the designer asks of testers, and the closing date', 'The application form with your measurements and size advice']}
      />
    </Screen>
  );
}
