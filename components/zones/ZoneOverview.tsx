import { StyleSheet, View } from 'react-native';

import type { Zone } from '@/components/queries';
import { space } from '@/components/theme';

import { LevelStrip } from './LevelStrip';
import { ZoneList } from './ZoneList';
import { countByLevel } from './zoneOrder';

interface ZoneOverviewProps {
  shopId: string;
  /** In the order to show them (orderByRisk). */
  zones: Zone[];
  timeZone: string;
}

/**
 * The overview on a phone: zones per level, then every zone's card. One component for the app's
 * overview and the server's first screen (FirstScreen.tsx), so both show the same cards.
 */
export function ZoneOverview({ shopId, zones, timeZone }: ZoneOverviewProps) {
  return (
    <View style={styles.stack}>
      <LevelStrip counts={countByLevel(zones)} />
      <ZoneList shopId={shopId} zones={zones} timeZone={timeZone} />
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.md },
});
