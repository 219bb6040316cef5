import { useState, type ReactNode } from 'react';
import { StyleSheet, View, type LayoutChangeEvent } from 'react-native';
import { AppText } from '@/components/ui/text';
import { space } from '@/constants/theme';

type Props = {
  /** Shown under the chart: what it shows and how to read it. */
  caption: string;
  /** Read out by screen readers in place of the drawing: the chart's numbers in words. */
  summary: string;
  /** Width to draw at before the first layout (and in tests, where nothing is laid out). */
  initialWidth?: number;
  /** True when the drawing itself holds labelled parts a screen reader should reach (heat cells). */
  explorable?: boolean;
  children: (width: number) => ReactNode;
  testID?: string;
};

/**
 * A chart that fills the width it is given: it measures itself and redraws at that width, so the
 * same chart reads on a 390 px phone and spreads out on a wide window.
 */
export function ChartFrame({ caption, summary, initialWidth = 320, explorable = false, children, testID }: Props) {
  const [width, setWidth] = useState(initialWidth);
  const onLayout = (e: LayoutChangeEvent) => {
    const w = Math.floor(e.nativeEvent.layout.width);
    if (w > 0 && w !== width) setWidth(w);
  };
  return (
    <View style={styles.frame} testID={testID}>
      <View onLayout={onLayout} role={explorable ? 'group' : 'img'} aria-label={summary} style={styles.drawing}>
        {children(width)}
      </View>
      <AppText variant="caption">{caption}</AppText>
    </View>
  );
}

const styles = StyleSheet.create({
  frame: { gap: space.xs, width: '100%' },
  drawing: { width: '100%' },
});
