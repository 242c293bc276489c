import { StyleSheet, Text, View } from 'react-native';

import type { SurfaceExposure } from '@/components/queries';
import { colors, fonts, space, tabular, type } from '@/components/theme';
import { COATING_TYPE_LABELS, EXPOSURE_WORDS } from '@/ingest/words';

import { formatAge, formatHours, recoatState, recoatStateWord, type RecoatState } from './careText';

// The state's colour is the level colour of the same worry: due is wet's rust, no coat close's
// ochre; the word beside it always says which.
const STATE_COLORS: Record<RecoatState, string> = {
  due: colors.wet,
  none: colors.close,
  ok: colors.dry,
};

/** "Re-coat due" / "Within budget" / "No coat logged" as a word in its colour, with a dot. */
export function RecoatMark({ exposure }: { exposure: SurfaceExposure }) {
  const state = recoatState(exposure);
  const color = STATE_COLORS[state];
  return (
    <View style={styles.mark} testID="recoat-state">
      <View style={[styles.dot, { backgroundColor: color }]} />
      <Text style={[styles.word, { color }]}>{recoatStateWord(state)}</Text>
    </View>
  );
}

interface ExposureFiguresProps {
  exposure: SurfaceExposure;
  nowMs: number;
}

/** The last coat and the hours since it: close, wet and time of wetness. */
export function ExposureFigures({ exposure, nowMs }: ExposureFiguresProps) {
  const coat = exposure.coating ? COATING_TYPE_LABELS[exposure.coating] : null;
  return (
    <View style={styles.box}>
      <Text style={type.body} testID="exposure-coat">
        {exposure.since && coat ? `${coat}, ${formatAge(exposure.since, nowMs)}` : 'No coat yet'}
      </Text>
      <View style={styles.figures}>
        <Figure label={EXPOSURE_WORDS.hoursClose} value={exposure.hoursClose} id="close" />
        <Figure label={EXPOSURE_WORDS.hoursWet} value={exposure.hoursWet} id="wet" />
        <Figure label={EXPOSURE_WORDS.tow} value={exposure.timeOfWetnessHours} id="tow" />
      </View>
    </View>
  );
}

function Figure({ label, value, id }: { label: string; value: number | null; id: string }) {
  return (
    <View style={styles.figure}>
      <Text style={type.label}>{label}</Text>
      <Text style={[styles.value, tabular]} testID={`exposure-${id}`}>
        {formatHours(value)}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  mark: { flexDirection: 'row', alignItems: 'center', gap: space.xs + 2 },
  dot: { width: 8, height: 8, borderRadius: 4 },
  word: { fontFamily: fonts.bold, fontSize: 13, letterSpacing: 0.4 },
  box: { gap: space.sm },
  figures: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  // Values at the bottom, in one line, however many lines their labels take.
  figure: { minWidth: 96, flexGrow: 1, flexBasis: 96, gap: 2, justifyContent: 'space-between' },
  value: { fontFamily: fonts.bold, fontSize: 20, lineHeight: 26, color: colors.ink },
});
