import { Link, Redirect } from 'expo-router';
import type { ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { shopHref } from '@/components/hrefs';
import { LIST_COLUMN_WIDTH, useBreakpoints } from '@/components/layout';
import { isSignedOut, useZonesQuery, type Zone } from '@/components/queries';
import { useFrameShop } from '@/components/shop/ShopFrame';
import { colors, space, TAP_TARGET_PX, type } from '@/components/theme';
import { Notice, useDocumentTitle } from '@/components/ui';

import { ZoneCard } from './ZoneCard';
import { ZoneHistory } from './ZoneHistory';
import { ZoneList } from './ZoneList';

interface ZonesScreenProps {
  /** The zone to show; without it a phone shows the list and a wide screen the first zone. */
  zoneId?: string;
}

/**
 * A shop's zones. Phone: the list, or one zone with its chart. Wide: the list in a left column
 * beside the selected zone's chart. The shop frame around it pins the open alarms above.
 */
export function ZonesScreen({ zoneId }: ZonesScreenProps) {
  const shop = useFrameShop();
  const shopId = shop.id;
  const zones = useZonesQuery(shopId);
  const { isWide } = useBreakpoints();
  const zoneList = zones.data?.zones;
  const selected = zoneId ? zoneList?.find((zone) => zone.id === zoneId) : undefined;
  useDocumentTitle(selected?.name, shop.name);

  if (isSignedOut(zones.error)) return <Redirect href="/sign-in" />;

  const timeZone = shop.timeZone;
  let body: ReactNode;
  if (!zoneList) {
    body = zones.isError ? (
      <Notice title="Zones could not be loaded" testID="zones-error">
        {zones.error.message}
      </Notice>
    ) : (
      <Notice title="Loading zones…" />
    );
  } else if (zoneList.length === 0) {
    body = (
      <Notice title="No zones yet" testID="zones-empty">
        A zone is an area with its own air, such as the machine room or the lumber rack. The shop
        owner adds zones and places a sensor in each.
      </Notice>
    );
  } else if (zoneId && !selected) {
    body = (
      <Notice title="Zone not found" testID="zone-not-found">
        <Text style={type.body}>
          This zone is not part of {shop.name}.{' '}
          <Link href={shopHref(shopId)} style={styles.link}>
            All zones
          </Link>
        </Text>
      </Notice>
    );
  } else if (isWide) {
    const shown: Zone = selected ?? zoneList[0]!;
    body = (
      <View style={styles.columns}>
        <View style={styles.listColumn}>
          <ZoneList
            shopId={shopId}
            zones={zoneList}
            timeZone={timeZone}
            selectedZoneId={shown.id}
          />
        </View>
        <View style={styles.detailColumn} testID="zone-detail">
          <Text style={type.title} role="heading" aria-level={2}>
            {shown.name}
          </Text>
          <ZoneHistory shopId={shopId} zone={shown} timeZone={timeZone} chartHeight={360} />
        </View>
      </View>
    );
  } else if (selected) {
    body = (
      <View style={styles.stack} testID="zone-detail">
        <Link href={shopHref(shopId)} style={styles.back}>
          ← All zones
        </Link>
        <ZoneCard zone={selected} timeZone={timeZone} />
        <ZoneHistory shopId={shopId} zone={selected} timeZone={timeZone} />
      </View>
    );
  } else {
    body = <ZoneList shopId={shopId} zones={zoneList} timeZone={timeZone} />;
  }

  return body;
}

const styles = StyleSheet.create({
  columns: { flexDirection: 'row', alignItems: 'flex-start', gap: space.xl },
  listColumn: { width: LIST_COLUMN_WIDTH, flexShrink: 0 },
  detailColumn: { flex: 1, minWidth: 0, gap: space.md },
  stack: { gap: space.md },
  back: {
    ...type.body,
    color: colors.air,
    alignSelf: 'flex-start',
    minHeight: TAP_TARGET_PX,
    paddingVertical: (TAP_TARGET_PX - type.body.lineHeight) / 2,
  },
  link: { color: colors.air, textDecorationLine: 'underline' },
});
