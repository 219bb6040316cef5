import { useRouter } from 'expo-router';
import { useState, type ReactNode } from 'react';
import { Pressable, StyleSheet } from 'react-native';
import Ionicons from '@expo/vector-icons/Ionicons';
import { AppText } from '@/components/ui/text';
import { colors, fonts, space } from '@/constants/theme';
import { useIsWide } from '@/hooks/use-is-wide';
import { signOut, useSession } from '@/hooks/use-session';
import { can } from '@/server/domain/policy';
import { ROLE_LABELS, STAFF_ROLES, type Role } from '@/server/domain/roles';
import { AppShell } from './app-shell';
import { ACCOUNT_NAV, STUDIO_NAV, TESTER_NAV } from './nav-items';

/** What a role may do in the studio, in a few words beside its name (only where the name alone misleads). */
const ROLE_BADGES: Partial<Record<Role, string>> = {
  // A grader changes no trial or pattern, but triages findings and writes notes on them.
  grader: 'Triage and notes',
};

/**
 * The shell for a signed-in person: the studio's sections when they work in the current studio
 * (only those their role may use), a tester's sections otherwise, and their own pages. Someone
 * who only tests sees no studio switcher: they start a studio from their profile if they wish.
 */
export function SignedInShell({ children }: { children: ReactNode }) {
  const { session, currentStudio } = useSession();
  const router = useRouter();
  const wide = useIsWide();
  const [leaving, setLeaving] = useState(false);
  const role = currentStudio?.role;
  const staff = role != null && STAFF_ROLES.includes(role);
  const primary = staff ? STUDIO_NAV.filter((item) => !item.action || can(role, item.action)) : TESTER_NAV;
  const worksInAStudio = (session?.studios ?? []).some((s) => STAFF_ROLES.includes(s.role));
  const account = ACCOUNT_NAV.filter((item) => item.href !== '/studios' || worksInAStudio);
  const area = currentStudio ? `${currentStudio.name} · ${ROLE_LABELS[currentStudio.role]}` : 'Your account';

  const footer = (
    <Pressable
      role="button"
      aria-label="Sign out"
      disabled={leaving}
      style={styles.signOut}
      onPress={async () => {
        setLeaving(true);
        try {
          await signOut();
          router.replace('/sign-in');
        } finally {
          setLeaving(false);
        }
      }}
    >
      <Ionicons name="log-out-outline" size={20} color={colors.inkMuted} />
      {/* On a phone the header has room for the icon only; its name stays for screen readers. */}
      {wide ? <AppText style={styles.signOutLabel}>{leaving ? 'Signing out…' : 'Sign out'}</AppText> : null}
    </Pressable>
  );

  return (
    <AppShell area={area} items={[...primary, ...account]} badge={role ? ROLE_BADGES[role] : undefined} footer={footer}>
      {children}
    </AppShell>
  );
}

const styles = StyleSheet.create({
  signOut: { flexDirection: 'row', alignItems: 'center', gap: space.sm, minHeight: 44, paddingHorizontal: space.md },
  signOutLabel: { fontFamily: fonts.medium, fontSize: 14, color: colors.inkMuted },
});
