import { useEffect, useRef, useState, type ReactNode } from 'react';
import { Animated, type StyleProp, type ViewStyle } from 'react-native';

import { useReducedMotion } from './useReducedMotion';

interface FlashProps {
  /** When this changes (after the first render), the background flashes once, softly. */
  value: unknown;
  children: ReactNode;
  style?: StyleProp<ViewStyle>;
}

const FLASH_MS = 1_200;

/** Marks a value that just changed, so a live update is noticed without being shouted. */
export function Flash({ value, children, style }: FlashProps) {
  const [glow] = useState(() => new Animated.Value(0));
  const previous = useRef(value);
  const reducedMotion = useReducedMotion();

  useEffect(() => {
    if (Object.is(previous.current, value)) return;
    previous.current = value;
    if (reducedMotion) return;
    glow.setValue(1);
    Animated.timing(glow, { toValue: 0, duration: FLASH_MS, useNativeDriver: false }).start();
  }, [value, glow, reducedMotion]);

  const backgroundColor = glow.interpolate({
    inputRange: [0, 1],
    // The close colour, faint: attention without alarm.
    outputRange: ['rgba(143, 98, 16, 0)', 'rgba(143, 98, 16, 0.12)'],
  });
  return (
    <Animated.View style={[{ backgroundColor, borderRadius: 4 }, style]}>{children}</Animated.View>
  );
}
