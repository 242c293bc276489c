import { Text } from 'react-native';

import { type } from '@/components/theme';

/**
 * The screen's one level-1 heading ("Alarms", "Sensors"). react-native-web renders
 * `role="heading"` with `aria-level` as a real `<h1>`…`<h6>`; `accessibilityRole="header"` would
 * give an `<h1>` without a level, whatever it wraps.
 */
export function ScreenTitle({ children, testID }: { children: string; testID?: string }) {
  return (
    <Text style={type.title} role="heading" aria-level={1} testID={testID ?? 'screen-title'}>
      {children}
    </Text>
  );
}
