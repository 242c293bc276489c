import { StyleSheet, View } from 'react-native';

import { zoneHref } from '@/components/hrefs';
import type { Zone } from '@/components/queries';
import { space } from '@/components/theme';

import { ZoneCard } from './ZoneCard';

interface ZoneListProps {
  shopId: string;
  zones: Zone[];
  timeZone: string;
  selectedZoneId?: string;
}

/** Every zone of a shop as a card that opens the zone. */
export function ZoneList({ shopId, zones, timeZone, selectedZoneId }: ZoneListProps) {
  return (
    <View style={styles.list} testID="zone-list">
      {zones.map((zone) => (
        <ZoneCard
          key={zone.id}
          zone={zone}
          timeZone={timeZone}
          href={zoneHref(shopId, zone.id)}
          selected={zone.id === selectedZoneId}
        />
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
});
