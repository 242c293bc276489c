import { StyleSheet, View } from 'react-native';

import { Content, ScreenTitle } from '@/components/layout';
import { findShop } from '@/components/queries';
import { colors, space } from '@/components/theme';
import { orderByRisk } from '@/components/zones/zoneOrder';
import { ZoneOverview } from '@/components/zones/ZoneOverview';
import type { FirstScreenInput } from '@/ingest/wire/firstScreen';

import { ZONES_HEADING } from './zonesHeading';
import { ShopHeader } from './ShopHeader';

/**
 * A shop's overview as the server renders it into the page, shown until the app's own overview
 * has its cards (scripts/webpage/boot.ts removes it then): the shop's header, the page heading
 * and the same ZoneOverview the app shows on a phone, laid out as ShopFrame and Screen lay it.
 * Rendered once to a string, so nothing here may depend on effects or the window's size.
 */
export function FirstScreen({ me, shopId, zones }: FirstScreenInput) {
  const shop = findShop(me, shopId);
  if (!shop) return null;
  return (
    <View style={styles.page}>
      <ShopHeader shopName={shop.name} />
      <View style={styles.main} role="main">
        <Content>
          <View style={styles.stack}>
            <ScreenTitle>{ZONES_HEADING}</ScreenTitle>
            <ZoneOverview shopId={shop.id} zones={orderByRisk(zones)} timeZone={shop.timeZone} />
          </View>
        </Content>
      </View>
    </View>
  );
}

// Screen's page, scroll padding and ShopFrame's stack, so the cards sit where the app's will.
const styles = StyleSheet.create({
  page: { flexGrow: 1, backgroundColor: colors.paper },
  main: { paddingTop: space.lg, paddingBottom: space.xxl },
  stack: { gap: space.lg },
});
