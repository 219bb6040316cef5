import { Slot } from 'expo-router';
import { RequireSession } from '@/components/layout/require-session';
import { SignedInShell } from '@/components/layout/signed-in-shell';

export default function StudioLayout() {
  return (
    <RequireSession staffOnly>
      <SignedInShell>
        <Slot />
      </SignedInShell>
    </RequireSession>
  );
}
