import { Link, Redirect } from 'expo-router';
import type { ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import type { ShopSection } from '@/components/hrefs';
import {
  Content,
  Screen,
  ShopNav,
  SINGLE_COLUMN_MAX_WIDTH,
  useBreakpoints,
} from '@/components/layout';
import { findShop, isSignedOut, useMeQuery, type ShopSummary } from '@/components/queries';
import { colors, space, type } from '@/components/theme';
import { Notice, Splash, useDocumentTitle } from '@/components/ui';

import { ShopHeader } from './ShopHeader';

interface ShopPageProps {
  shop: ShopSummary;
  active: ShopSection;
  /** The page column's width; one phone column by default. */
  maxWidth?: number;
  /** Pinned under the header (the alarm banner). */
  banner?: ReactNode;
  children: ReactNode;
}

/** A shop's page: the header with the shop switcher, the navigation (bar or rail), a column. */
export function ShopPage({
  shop,
  active,
  maxWidth = SINGLE_COLUMN_MAX_WIDTH,
  banner,
  children,
}: ShopPageProps) {
  const { isWide } = useBreakpoints();
  return (
    <Screen
      header={
        <>
          <ShopHeader shopName={shop.name} shopId={shop.id} maxWidth={maxWidth} />
          {banner}
        </>
      }
      rail={isWide ? <ShopNav shopId={shop.id} active={active} variant="rail" /> : undefined}
      footer={isWide ? undefined : <ShopNav shopId={shop.id} active={active} variant="bar" />}
    >
      <Content maxWidth={maxWidth}>{children}</Content>
    </Screen>
  );
}

interface ShopFrameProps {
  shopId: string;
  active: ShopSection;
  /** Names the browser tab: "Sensors · Shop name · Drybench". */
  title: string;
  maxWidth?: number;
  children: (shop: ShopSummary) => ReactNode;
}

/** A ShopPage for a shop id from the route: waits for /me, sends the signed-out to sign in. */
export function ShopFrame({ shopId, active, title, maxWidth, children }: ShopFrameProps) {
  const me = useMeQuery();
  const shop = findShop(me.data, shopId);
  useDocumentTitle(title, shop?.name);
  if (me.isPending) return <Splash />;
  if (isSignedOut(me.error)) return <Redirect href="/sign-in" />;
  if (!shop) {
    return (
      <Screen>
        <Content>
          <Notice title="Shop not found" testID="shop-not-found">
            <Text style={type.body}>
              {me.isError
                ? me.error.message
                : 'This shop does not exist or you are not one of its members. '}
              <Link href="/" style={styles.link}>
                Go to your shops
              </Link>
            </Text>
          </Notice>
        </Content>
      </Screen>
    );
  }
  return (
    <ShopPage shop={shop} active={active} maxWidth={maxWidth}>
      <View style={styles.stack}>{children(shop)}</View>
    </ShopPage>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  link: { color: colors.air, textDecorationLine: 'underline' },
});
