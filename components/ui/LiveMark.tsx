import { StyleSheet, Text, View } from 'react-native';

import { useLiveStatus, type LiveStatus } from '@/components/live';
import { colors, space, type } from '@/components/theme';

const WORDS: Record<LiveStatus, string> = {
  open: 'live',
  connecting: 'connecting',
  waiting: 'reconnecting',
  off: 'offline',
};

/** Whether readings arrive by themselves right now: a dot and a word. */
export function LiveMark() {
  const status = useLiveStatus();
  const live = status === 'open';
  return (
    <View
      style={styles.row}
      testID="live-status"
      accessibilityLabel={live ? 'Live updates on' : `Live updates ${WORDS[status]}`}
      aria-label={live ? 'Live updates on' : `Live updates ${WORDS[status]}`}
    >
      <View style={[styles.dot, live ? styles.on : styles.off]} />
      <Text style={[type.small, live && styles.liveWord]}>{WORDS[status]}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', alignItems: 'center', gap: space.xs + 2 },
  dot: { width: 8, height: 8, borderRadius: 4 },
  on: { backgroundColor: colors.dry },
  off: { backgroundColor: 'transparent', borderWidth: 1.5, borderColor: colors.unknown },
  liveWord: { color: colors.dry },
});
