import Ionicons from '@expo/vector-icons/Ionicons';
import { Link, usePathname } from 'expo-router';
import type { ReactNode } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { useSafeAreaInsets } from 'react-native-safe-area-context';
import { InsideMain } from '@/components/ui/landmarks';
import { AppText } from '@/components/ui/text';
import { colors, fonts, space } from '@/constants/theme';
import { useIsWide } from '@/hooks/use-is-wide';
import { isActive, type NavItem } from './nav-items';

type Props = {
  area: string;
  items: NavItem[];
  /** A few words beside the area, e.g. what a grader may do. */
  badge?: string;
  /** Shown at the foot of the side navigation, and at the end of the phone header. */
  footer?: ReactNode;
  children: ReactNode;
};

function Brand({ area, badge, compact = false }: { area: string; badge?: string; compact?: boolean }) {
  return (
    <View style={compact ? styles.brandCompact : styles.brand}>
      <Link href="/" asChild>
        <Pressable role="link" aria-label="Basted home">
          <AppText style={styles.brandName}>Basted</AppText>
        </Pressable>
      </Link>
      {/* Wraps rather than clips: the studio's name and the role are read in full at any width. */}
      <View style={styles.areaRow}>
        <AppText variant="caption" style={styles.brandArea}>
          {area}
        </AppText>
        {badge ? (
          <AppText variant="caption" style={styles.badge}>
            {badge}
          </AppText>
        ) : null}
      </View>
    </View>
  );
}

/** The page's one `main` landmark; screens inside it do not draw another. */
function MainLandmark({ children }: { children: ReactNode }) {
  return (
    <View style={styles.main} role="main">
      <InsideMain.Provider value>{children}</InsideMain.Provider>
    </View>
  );
}

/**
 * The frame around every signed-in screen: a header and bottom tabs on a phone, a side
 * navigation on a window at least 900 px wide.
 * (Link asChild passes its style to the child through a slot that takes flat styles only.)
 */
export function AppShell({ area, items, badge, footer, children }: Props) {
  const wide = useIsWide();
  const pathname = usePathname();
  const insets = useSafeAreaInsets();

  if (wide) {
    return (
      <View style={styles.wideRoot}>
        <View style={styles.side} role="navigation" aria-label="Sections">
          <Brand area={area} badge={badge} />
          {items.map((item) => {
            const active = isActive(pathname, item.href);
            return (
              <Link key={item.href} href={item.href} asChild>
                <Pressable
                  role="link"
                  aria-current={active ? 'page' : undefined}
                  style={StyleSheet.flatten([styles.sideItem, active && styles.sideItemActive])}
                >
                  <Ionicons name={item.icon} size={20} color={active ? colors.thread : colors.inkMuted} />
                  <AppText style={[styles.sideLabel, active && styles.activeLabel]}>{item.label}</AppText>
                </Pressable>
              </Link>
            );
          })}
          {footer ? <View style={styles.sideFooter}>{footer}</View> : null}
        </View>
        <MainLandmark>{children}</MainLandmark>
      </View>
    );
  }

  return (
    <View style={[styles.phoneRoot, { paddingTop: insets.top }]}>
      <View style={styles.header} role="banner">
        <Brand area={area} badge={badge} compact />
        {footer}
      </View>
      <MainLandmark>{children}</MainLandmark>
      <View
        style={[styles.tabs, { paddingBottom: Math.max(insets.bottom, space.xs) }]}
        role="navigation"
        aria-label="Sections"
      >
        {items.map((item) => {
          const active = isActive(pathname, item.href);
          return (
            <Link key={item.href} href={item.href} asChild>
              <Pressable role="link" aria-current={active ? 'page' : undefined} style={styles.tab}>
                <Ionicons name={item.icon} size={22} color={active ? colors.thread : colors.inkMuted} />
                <AppText style={[styles.tabLabel, active && styles.activeLabel]}>{item.label}</AppText>
              </Pressable>
            </Link>
          );
        })}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  wideRoot: { flex: 1, flexDirection: 'row', backgroundColor: colors.paper },
  side: {
    width: 232,
    borderRightWidth: 1,
    borderRightColor: colors.line,
    backgroundColor: colors.surfaceSunken,
    paddingVertical: space.lg,
    paddingHorizontal: space.md,
    gap: space.xs,
  },
  sideItem: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    borderRadius: 8,
    minHeight: 44,
  },
  sideItemActive: { backgroundColor: colors.threadSoft },
  sideLabel: { fontFamily: fonts.medium, fontSize: 15, color: colors.inkMuted },
  activeLabel: { color: colors.thread, fontFamily: fonts.semibold },
  main: { flex: 1 },
  phoneRoot: { flex: 1, backgroundColor: colors.paper },
  header: {
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'space-between',
    borderBottomWidth: 1,
    borderBottomColor: colors.line,
    backgroundColor: colors.surfaceSunken,
    paddingHorizontal: space.lg,
    paddingVertical: space.sm,
  },
  brand: { paddingHorizontal: space.md, paddingVertical: space.sm, marginBottom: space.sm },
  brandCompact: { flex: 1, flexDirection: 'row', alignItems: 'baseline', gap: space.sm, minHeight: 44, paddingTop: space.sm },
  areaRow: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', columnGap: space.sm, rowGap: 2, flexShrink: 1 },
  badge: {
    color: colors.thread,
    borderWidth: 1,
    borderColor: colors.thread,
    borderRadius: 4,
    paddingHorizontal: 6,
    fontFamily: fonts.medium,
  },
  sideFooter: { marginTop: 'auto', paddingTop: space.lg },
  brandName: { fontFamily: fonts.bold, fontSize: 22, color: colors.thread, letterSpacing: 0.3 },
  brandArea: { marginTop: 2, flexShrink: 1 },
  tabs: {
    flexDirection: 'row',
    borderTopWidth: 1,
    borderTopColor: colors.line,
    backgroundColor: colors.surface,
    paddingTop: space.xs,
  },
  tab: { flex: 1, alignItems: 'center', justifyContent: 'center', minHeight: 52, gap: 2 },
  tabLabel: { fontFamily: fonts.medium, fontSize: 12, color: colors.inkMuted },
});
