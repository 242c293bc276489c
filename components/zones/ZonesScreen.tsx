import { Link, Redirect } from 'expo-router';
import { useMemo, type ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { shopHref } from '@/components/hrefs';
import { useBreakpoints } from '@/components/layout';
import { isSignedOut, useZonesQuery, type Zone } from '@/components/queries';
import { SetupChecklist } from '@/components/shop/SetupChecklist';
import { useFrameShop } from '@/components/shop/ShopFrame';
import { colors, space, TAP_TARGET_PX, type } from '@/components/theme';
import { Notice, useDocumentTitle } from '@/components/ui';

import { ZoneCard } from './ZoneCard';
import { ZoneColumns } from './ZoneColumns';
import type { RangeKey } from './chartRange';
import { ZoneHistory } from './ZoneHistory';
import { ZoneOverview } from './ZoneOverview';
import { ZoneSurfaces } from './ZoneSurfaces';
import { orderByRisk } from './zoneOrder';

interface ZonesScreenProps {
  /** The zone to show; without it a phone shows the list and a wide screen the first zone. */
  zoneId?: string;
  /** The history's range, kept in the URL (`?range=7d`) by the route. */
  range?: RangeKey;
  onRangeChange?: (range: RangeKey) => void;
}

/**
 * A shop's zones. Phone: the list, or one zone with its chart. Wide: the list in a left column
 * beside the selected zone's chart. The list is ordered by risk (wet, close, then the smallest
 * margin first) under a strip counting zones per level. The shop frame around it pins the open
 * alarms above.
 */
export function ZonesScreen({ zoneId, range, onRangeChange }: ZonesScreenProps) {
  const shop = useFrameShop();
  const shopId = shop.id;
  const zones = useZonesQuery(shopId);
  const { isWide } = useBreakpoints();
  const zoneList = zones.data?.zones;
  // A new order on every live reading: the zone that just turned wet moves to the top.
  const ordered = useMemo(() => (zoneList ? orderByRisk(zoneList) : undefined), [zoneList]);
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
  } else if (isWide && ordered) {
    // Without a zone in the address, the riskiest zone is the one shown.
    const shown: Zone = selected ?? ordered[0]!;
    body = (
      <ZoneColumns shopId={shopId} zones={ordered} timeZone={timeZone} selectedZoneId={shown.id}>
        <Text style={type.title} role="heading" aria-level={2}>
          {shown.name}
        </Text>
        <ZoneHistory
          shopId={shopId}
          zone={shown}
          timeZone={timeZone}
          chartHeight={360}
          range={range}
          onRangeChange={onRangeChange}
        />
        <ZoneSurfaces shopId={shopId} zoneId={shown.id} />
      </ZoneColumns>
    );
  } else if (selected) {
    body = (
      <View style={styles.stack} testID="zone-detail">
        <Link href={shopHref(shopId)} style={styles.back}>
          ← All zones
        </Link>
        <ZoneCard zone={selected} timeZone={timeZone} />
        <ZoneHistory
          shopId={shopId}
          zone={selected}
          timeZone={timeZone}
          range={range}
          onRangeChange={onRangeChange}
        />
        <ZoneSurfaces shopId={shopId} zoneId={selected.id} />
      </View>
    );
  } else {
    const list = ordered ?? zoneList;
    body = <ZoneOverview shopId={shopId} zones={list} timeZone={timeZone} />;
  }

  return <SetupChecklist shop={shop}>{body}</SetupChecklist>;
}

const styles = StyleSheet.create({
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
