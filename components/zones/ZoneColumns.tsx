import type { ReactNode } from 'react';
import { ScrollView, StyleSheet, View, useWindowDimensions } from 'react-native';

import { LIST_COLUMN_WIDTH } from '@/components/layout';
import type { Zone } from '@/components/queries';
import { space } from '@/components/theme';

import { LevelStrip } from './LevelStrip';
import { ZoneList } from './ZoneList';
import { countByLevel } from './zoneOrder';

/** The shop header, the page's top and bottom padding and the level strip above the list. */
export const WIDE_CHROME_PX = 160;
/** The list's scrolling box is never shorter than this, however low the window. */
export const LIST_MIN_HEIGHT_PX = 320;

interface ZoneColumnsProps {
  shopId: string;
  /** In the order to show them (orderByRisk). */
  zones: Zone[];
  timeZone: string;
  selectedZoneId: string;
  /** The selected zone's column beside the list. */
  children: ReactNode;
}

/**
 * The overview on a wide screen: the level strip and the zone list in a left column, the selected
 * zone beside it. One component for the app's overview (ZonesScreen) and the server's first
 * screen (components/shop/FirstScreen.tsx), so the cards stand where the app's will.
 */
export function ZoneColumns({
  shopId,
  zones,
  timeZone,
  selectedZoneId,
  children,
}: ZoneColumnsProps) {
  const { height: windowHeight } = useWindowDimensions();
  return (
    <View style={styles.columns}>
      <View style={styles.listColumn}>
        <LevelStrip counts={countByLevel(zones)} />
        {/* The list scrolls on its own beside the chart, so bringing the selected card into
            view never scrolls the chart out of it. */}
        <ScrollView
          style={{ maxHeight: Math.max(LIST_MIN_HEIGHT_PX, windowHeight - WIDE_CHROME_PX) }}
          contentContainerStyle={styles.listScroll}
          testID="zone-list-scroll"
        >
          <ZoneList
            shopId={shopId}
            zones={zones}
            timeZone={timeZone}
            selectedZoneId={selectedZoneId}
          />
        </ScrollView>
      </View>
      <View style={styles.detailColumn} testID="zone-detail">
        {children}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  columns: { flexDirection: 'row', alignItems: 'flex-start', gap: space.xl },
  listColumn: { width: LIST_COLUMN_WIDTH, flexShrink: 0, gap: space.md },
  detailColumn: { flex: 1, minWidth: 0, gap: space.md },
  // Room for the selected card's border inside the scrolling box.
  listScroll: { padding: 2 },
});
