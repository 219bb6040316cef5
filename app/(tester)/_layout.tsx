import { Slot } from 'expo-router';
import { AppShell } from '@/components/layout/app-shell';
import { TESTER_NAV } from '@/components/layout/nav-items';

export default function TesterLayout() {
  return (
    <AppShell area="Tester" items={TESTER_NAV}>
      <Slot />
    </AppShell>
  );
}
