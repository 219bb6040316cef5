import { Slot } from 'expo-router';
import { RequireSession } from '@/components/layout/require-session';
import { SignedInShell } from '@/components/layout/signed-in-shell';

export default function TesterLayout() {
  return (
    <RequireSession>
      <SignedInShell>
        <Slot />
      </SignedInShell>
    </RequireSession>
  );
}
