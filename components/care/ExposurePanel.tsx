import { StyleSheet, Text, View } from 'react-native';

import type { SurfaceExposure } from '@/components/queries';
import { colors, space, type } from '@/components/theme';
import { Panel } from '@/components/ui';
import { EXPOSURE_WORDS, RECOAT_CAUTIONS } from '@/ingest/words';

import { ExposureFigures, RecoatMark } from './ExposureFigures';

interface ExposurePanelProps {
  exposure: SurfaceExposure | undefined;
  error: string | null;
  nowMs: number;
}

/**
 * The exposure since the last coat, the re-coat suggestion with its reason, and the cautions
 * that go with putting a coat on (label and safety data sheet, ventilation, oily rags), shown
 * always: they matter whenever someone coats, not only when Drybench says it is due.
 */
export function ExposurePanel({ exposure, error, nowMs }: ExposurePanelProps) {
  return (
    <Panel title={EXPOSURE_WORDS.since} testID="exposure-panel">
      {exposure ? (
        <>
          <RecoatMark exposure={exposure} />
          <ExposureFigures exposure={exposure} nowMs={nowMs} />
          <Text style={type.body} testID="recoat-reason">
            {exposure.recoat.reason}
          </Text>
        </>
      ) : (
        <Text style={type.small}>{error ?? 'Reading the exposure…'}</Text>
      )}
      <View style={styles.cautions} testID="care-cautions">
        <Text style={type.label} role="heading" aria-level={3}>
          Safety when coating
        </Text>
        {RECOAT_CAUTIONS.map((caution) => (
          <Text key={caution} style={type.small}>
            • {caution}
          </Text>
        ))}
      </View>
    </Panel>
  );
}

const styles = StyleSheet.create({
  cautions: {
    gap: space.xs,
    paddingTop: space.md,
    borderTopWidth: 1,
    borderTopColor: colors.border,
  },
});
