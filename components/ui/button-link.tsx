import { Link, type Href } from 'expo-router';
import { Pressable, StyleSheet } from 'react-native';
import { colors, fonts, radius, space } from '@/constants/theme';
import { AppText } from './text';

type Props = { href: Href; label: string; tone?: 'primary' | 'quiet' };

export function ButtonLink({ href, label, tone = 'primary' }: Props) {
  return (
    <Link href={href} asChild>
      <Pressable role="link" style={StyleSheet.flatten([styles.base, tone === 'primary' ? styles.primary : styles.quiet])}>
        <AppText style={[styles.label, tone === 'primary' ? styles.primaryLabel : styles.quietLabel]}>{label}</AppText>
      </Pressable>
    </Link>
  );
}

const styles = StyleSheet.create({
  base: {
    alignSelf: 'flex-start',
    borderRadius: radius.sm,
    paddingHorizontal: space.lg,
    paddingVertical: space.md,
    minHeight: 44,
    justifyContent: 'center',
  },
  primary: { backgroundColor: colors.thread },
  quiet: { borderWidth: 1, borderColor: colors.thread },
  label: { fontFamily: fonts.semibold, fontSize: 15 },
  primaryLabel: { color: colors.chalk },
  quietLabel: { color: colors.thread },
});
