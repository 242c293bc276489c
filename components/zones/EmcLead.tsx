import { StyleSheet, Text, View } from 'react-native';

import { colors, fonts, space, tabular, type } from '@/components/theme';
import { Flash } from '@/components/ui';
import { emcBandPosition, type EmcBandPosition, type EmcTargetBand } from '@/ingest/emcTarget';
import {
  bandRange,
  EMC_POSITION_WORDS,
  EMC_REGION_WORDS,
  EMC_TARGET_SOURCE,
  formatPercent,
} from '@/ingest/words';

interface EmcLeadProps {
  emcPct: number | null;
  band: EmcTargetBand;
}

// A mark and a colour for each position; the words carry the meaning, the colour only helps.
const MARKS: Record<EmcBandPosition, { mark: string; color: string }> = {
  below: { mark: '▼', color: colors.close },
  in: { mark: '✓', color: colors.dry },
  above: { mark: '▲', color: colors.wet },
};

/**
 * A lumber zone's lead figure: the wood EMC its air gives, where it sits against the target
 * band of the zone's region, and the table the band comes from in small print.
 */
export function EmcLead({ emcPct, band }: EmcLeadProps) {
  const emc = formatPercent(emcPct, 1);
  const position = emcBandPosition(emcPct, band);
  const range = bandRange(band);
  return (
    <View style={styles.box}>
      <Flash value={emc} style={styles.hero}>
        <Text style={[type.hero, tabular]} testID="zone-emc-lead">
          {emc}
        </Text>
        <Text style={type.small}>wood EMC</Text>
      </Flash>
      <View style={styles.row} testID="zone-emc-band">
        {position ? (
          <Text style={[styles.position, { color: MARKS[position].color }]}>
            {MARKS[position].mark} {EMC_POSITION_WORDS[position]}
          </Text>
        ) : null}
        <Text style={[type.body, tabular]}>
          Target {range} · {EMC_REGION_WORDS[band.region]}
        </Text>
      </View>
      <Text style={styles.source} testID="zone-emc-source">
        {EMC_TARGET_SOURCE}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.xs },
  hero: { alignSelf: 'flex-start', paddingHorizontal: space.xs, marginLeft: -space.xs },
  row: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.md, rowGap: 2 },
  position: { fontFamily: fonts.bold, fontSize: 14, lineHeight: 20 },
  source: { ...type.small, fontSize: 11, lineHeight: 14 },
});
