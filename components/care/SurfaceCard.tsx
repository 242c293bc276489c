import { Link } from 'expo-router';
import { StyleSheet, Text, View } from 'react-native';

import { surfaceHref } from '@/components/hrefs';
import type { Surface, SurfaceExposure } from '@/components/queries';
import { cardSurface, colors, space, TAP_TARGET_PX, type } from '@/components/theme';

import { ExposureFigures, RecoatMark } from './ExposureFigures';

interface SurfaceCardProps {
  shopId: string;
  surface: Surface;
  exposure: SurfaceExposure | undefined;
  exposureError: string | null;
  nowMs: number;
}

/** One surface on the Care page: its name (a link to its page), last coat, exposure, verdict. */
export function SurfaceCard({ shopId, surface, exposure, exposureError, nowMs }: SurfaceCardProps) {
  return (
    <View style={styles.card} testID="surface-card">
      <View style={styles.head}>
        <Link href={surfaceHref(shopId, surface.id)} style={styles.link} testID="surface-link">
          {surface.name}
        </Link>
        {exposure ? <RecoatMark exposure={exposure} /> : null}
      </View>
      {surface.material ? <Text style={type.small}>{surface.material}</Text> : null}
      {exposure ? (
        <>
          <ExposureFigures exposure={exposure} nowMs={nowMs} />
          <Text style={type.small} testID="recoat-reason">
            {exposure.recoat.reason}
          </Text>
        </>
      ) : (
        <Text style={type.small}>{exposureError ?? 'Reading the exposure…'}</Text>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  card: { ...cardSurface, padding: space.lg, gap: space.sm },
  head: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    columnGap: space.md,
  },
  link: {
    ...type.heading,
    color: colors.air,
    textDecorationLine: 'underline',
    minHeight: TAP_TARGET_PX,
    paddingVertical: (TAP_TARGET_PX - type.heading.lineHeight) / 2,
  },
});
