import type { ReactNode } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';
import { CONTENT_MAX_WIDTH, colors, space } from '@/constants/theme';
import { useInsideMain } from './landmarks';
import { AppText } from './text';

type Props = { title: string; intro?: string; children?: ReactNode };

/** Every screen's wrapper: a title and a readable column, centred on a wide window. */
export function Screen({ title, intro, children }: Props) {
  // Inside the shell, the shell's own `main` holds the screen; on its own, the screen is the main landmark.
  const insideMain = useInsideMain();
  return (
    <ScrollView style={styles.scroll} contentContainerStyle={styles.content} role={insideMain ? undefined : 'main'} aria-label={insideMain ? undefined : title}>
      <View style={styles.column}>
        <AppText variant="title">{title}</AppText>
        {intro ? <AppText style={styles.intro}>{intro}</AppText> : null}
        <View style={styles.body}>{children}</View>
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.paper },
  content: { paddingHorizontal: space.lg, paddingVertical: space.xl, alignItems: 'center' },
  column: { width: '100%', maxWidth: CONTENT_MAX_WIDTH },
  intro: { marginTop: space.sm, color: colors.inkMuted },
  body: { marginTop: space.xl, gap: space.lg },
});
