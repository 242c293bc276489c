import { StyleSheet, Text } from 'react-native';

import { colors, type } from '@/components/theme';

/** The message of a failed submit that belongs to no single field; read out when it appears. */
export function FormError({ message, testID }: { message?: string | null; testID?: string }) {
  if (!message) return null;
  return (
    <Text
      style={[type.body, styles.error]}
      testID={testID}
      accessibilityLiveRegion="polite"
      aria-live="polite"
      role="alert"
    >
      {message}
    </Text>
  );
}

const styles = StyleSheet.create({ error: { color: colors.wet } });
