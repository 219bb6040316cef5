import { StyleSheet, View } from 'react-native';
import { ButtonLink } from '@/components/ui/button-link';
import { Card } from '@/components/ui/card';
import { Screen } from '@/components/ui/screen';
import { AppText } from '@/components/ui/text';
import { space } from '@/constants/theme';
import { useIsWide } from '@/hooks/use-is-wide';

export default function HomeScreen() {
  const wide = useIsWide();
  return (
    <Screen
      title="Basted"
      intro="Fit trials for sewing patterns: find testers across the whole size range, collect their fit reports, and learn whether a problem is in the draft, the grading, or one tester's body."
    >
      <View style={[styles.cards, wide && styles.cardsWide]}>
        <View style={styles.cell}>
          <Card title="Run a studio">
            <AppText>Calls for testers, coverage of every size and height, drafts, reports and findings.</AppText>
            <ButtonLink href="/trials" label="Studio" />
          </Card>
        </View>
        <View style={styles.cell}>
          <Card title="Test a pattern">
            <AppText>Your trials, due dates, the files you may download and your fit reports.</AppText>
            <ButtonLink href="/my-trials" label="My trials" />
          </Card>
        </View>
        <View style={styles.cell}>
          <Card title="Your account">
            <AppText>Sign in, or create an account to apply to an open call.</AppText>
            <ButtonLink href="/sign-in" label="Sign in" tone="quiet" />
          </Card>
        </View>
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  cards: { gap: space.lg },
  cardsWide: { flexDirection: 'row', alignItems: 'stretch' },
  cell: { flex: 1 },
});
