import { StyleSheet, View } from 'react-native';

import { colors } from '@/components/theme';

/** A blank page in the paper colour while fonts or the session load; no flash of other type. */
export function Splash() {
  return <View style={styles.page} testID="splash" />;
}

const styles = StyleSheet.create({
  page: { flex: 1, backgroundColor: colors.paper },
});
