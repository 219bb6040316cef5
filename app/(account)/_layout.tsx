import { Slot } from 'expo-router';
import { RequireSession } from '@/components/layout/require-session';
import { SignedInShell } from '@/components/layout/signed-in-shell';

// Everyone's own pages (studios, profile), whatever their role.
export default function AccountLayout() {
  return (
    <RequireSession>
      <SignedInShell>
        <Slot />
      </SignedInShell>
    </RequireSession>
  );
}
