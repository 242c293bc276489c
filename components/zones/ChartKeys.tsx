import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';

import { space } from '@/components/theme';

interface ChartKeysProps {
  /** Points the charts hold; the crosshair moves among their indexes. */
  count: number;
  activeIndex: number | null;
  onMove: (index: number | null) => void;
  /** The group's accessible name: the summary and how to read a point. */
  label: string;
  children: ReactNode;
}

interface KeyEvent {
  key: string;
  shiftKey: boolean;
  preventDefault(): void;
}

/**
 * The charts as one keyboard stop: focus it (Tab) and the arrow keys move the crosshair a point
 * left or right (with Shift, ten), Home and End jump to the first and last point, Escape clears
 * it. What the crosshair is on is read out beside the charts (aria-live), so a keyboard or
 * screen-reader user gets the values a pointer user gets from hovering.
 */
export function ChartKeys({ count, activeIndex, onMove, label, children }: ChartKeysProps) {
  const onKeyDown = (event: KeyEvent) => {
    if (count === 0) return;
    const last = count - 1;
    const at = activeIndex ?? last;
    const step = event.shiftKey ? 10 : 1;
    const next: Record<string, number | null> = {
      ArrowLeft: activeIndex === null ? last : Math.max(0, at - step),
      ArrowRight: activeIndex === null ? last : Math.min(last, at + step),
      Home: 0,
      End: last,
      Escape: null,
    };
    if (!(event.key in next)) return;
    event.preventDefault();
    onMove(next[event.key]!);
  };
  return (
    <View
      style={styles.group}
      role="group"
      aria-label={label}
      focusable={count > 0}
      testID="zone-charts"
      // react-native-web passes key events to the View; React Native's types know no onKeyDown,
      // and native has no arrow keys to handle.
      {...({ onKeyDown } as object)}
    >
      {children}
    </View>
  );
}

const styles = StyleSheet.create({
  group: { gap: space.md },
});
