import { useEffect, useRef } from 'react';
import { StyleSheet, View } from 'react-native';

import { zoneHref } from '@/components/hrefs';
import type { Zone } from '@/components/queries';
import { space } from '@/components/theme';

import { ZoneCard } from './ZoneCard';

interface ZoneListProps {
  shopId: string;
  /** In the order to show them (ZonesScreen orders them by risk). */
  zones: Zone[];
  timeZone: string;
  selectedZoneId?: string;
}

/** What react-native-web hands a View's ref: the DOM element, which can scroll itself into view. */
interface Scrollable {
  scrollIntoView?: (options: { block: 'nearest'; behavior?: 'auto' | 'smooth' }) => void;
}

/**
 * Every zone of a shop as a card that opens the zone. The selected zone (wide screens) is
 * scrolled into view when it changes, so a zone opened from an alarm or a link is never
 * selected out of sight further down the list.
 */
export function ZoneList({ shopId, zones, timeZone, selectedZoneId }: ZoneListProps) {
  const selectedRef = useRef<View>(null);
  useEffect(() => {
    if (!selectedZoneId) return;
    // After the frame's own effect: the shop frame scrolls a new page to the top (Screen's
    // scrollKey), and a parent's effect runs after its children's.
    const timer = setTimeout(() => {
      const node = selectedRef.current as unknown as Scrollable | null;
      node?.scrollIntoView?.({ block: 'nearest' });
    }, 0);
    return () => clearTimeout(timer);
  }, [selectedZoneId]);
  return (
    <View style={styles.list} testID="zone-list">
      {zones.map((zone) => {
        const selected = zone.id === selectedZoneId;
        return (
          <View key={zone.id} ref={selected ? selectedRef : undefined}>
            <ZoneCard
              zone={zone}
              timeZone={timeZone}
              href={zoneHref(shopId, zone.id)}
              selected={selected}
            />
          </View>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
});
