import { Link } from 'expo-router';
import { StyleSheet, Text, View } from 'react-native';

import { surfaceHref } from '@/components/hrefs';
import { useSurfacesQuery } from '@/components/queries';
import { colors, space, TAP_TARGET_PX, type } from '@/components/theme';

/** The zone's protected surfaces, a link each to its care page; nothing when it has none. */
export function ZoneSurfaces({ shopId, zoneId }: { shopId: string; zoneId: string }) {
  const surfaces = useSurfacesQuery(shopId);
  const inZone = (surfaces.data?.surfaces ?? []).filter((s) => s.zoneId === zoneId);
  if (inZone.length === 0) return null;
  return (
    <View style={styles.box} testID="zone-surfaces">
      <Text style={type.label} role="heading" aria-level={3}>
        Surfaces in this zone
      </Text>
      <View style={styles.row}>
        {inZone.map((s) => (
          <Link key={s.id} href={surfaceHref(shopId, s.id)} style={styles.link}>
            {s.name}
          </Link>
        ))}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.xs },
  row: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.lg },
  link: {
    ...type.body,
    color: colors.air,
    textDecorationLine: 'underline',
    minHeight: TAP_TARGET_PX,
    paddingVertical: (TAP_TARGET_PX - type.body.lineHeight) / 2,
  },
});
