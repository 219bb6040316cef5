import { Slot } from 'expo-router';
import { AppShell } from '@/components/layout/app-shell';
import { STUDIO_NAV } from '@/components/layout/nav-items';

export default function StudioLayout() {
  return (
    <AppShell area="Studio" items={STUDIO_NAV}>
      <Slot />
    </AppShell>
  );
}
