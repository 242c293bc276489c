import { useQuery } from '@tanstack/react-query';
import { Link, Redirect } from 'expo-router';
import { createContext, useContext, type ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { AlarmBanner } from '@/components/alarms/AlarmBanner';
import { AlarmNotifier } from '@/components/alarms/AlarmNotifier';
import { Button } from '@/components/forms';
import type { ShopSection } from '@/components/hrefs';
import {
  CONTENT_MAX_WIDTH,
  Content,
  SINGLE_COLUMN_MAX_WIDTH,
  Screen,
  ScreenTitle,
  ShopNav,
  useBreakpoints,
} from '@/components/layout';
import {
  alarmsQueryOptions,
  findShop,
  isSignedOut,
  useMeQuery,
  type ShopSummary,
} from '@/components/queries';
import { colors, space, type } from '@/components/theme';
import { Notice, Splash, useDocumentTitle } from '@/components/ui';

import { ShopHeader } from './ShopHeader';
import { ZONES_HEADING } from './zonesHeading';

/** How the frame dresses one page of a shop. */
export interface ShopFramePage {
  /** The navigation entry lit for it. */
  active: ShopSection;
  /** Names the browser tab while the shop is not shown yet; the page names it once it is. */
  title?: string;
  /** The page's one h1, at the top of its column ("Alarms"). */
  heading: string;
  /** On a wide screen the column takes the content width (list beside detail); else one phone column. */
  wide: boolean;
  /** Pins the open alarms under the header. */
  banner: boolean;
}

const ZONES_PAGE: ShopFramePage = {
  active: 'zones',
  heading: ZONES_HEADING,
  wide: true,
  banner: true,
};

/** The pages under app/shops/[shopId]/, by their first path segment after the shop id. */
const SHOP_PAGES: Record<string, ShopFramePage> = {
  index: ZONES_PAGE,
  zones: ZONES_PAGE,
  alarms: { active: 'alarms', title: 'Alarms', heading: 'Alarms', wide: true, banner: false },
  report: {
    active: 'report',
    title: 'Week report',
    heading: 'Week report',
    wide: true,
    banner: false,
  },
  sensors: { active: 'sensors', title: 'Sensors', heading: 'Sensors', wide: true, banner: false },
  settings: {
    active: 'shop',
    title: 'Shop settings',
    heading: 'Shop settings',
    wide: false,
    banner: false,
  },
  members: { active: 'shop', title: 'Members', heading: 'Members', wide: false, banner: false },
  care: { active: 'shop', title: 'Care', heading: 'Care', wide: true, banner: false },
  trials: { active: 'shop', title: 'Trials', heading: 'Trials', wide: true, banner: false },
  profile: { active: 'profile', title: 'Profile', heading: 'Profile', wide: false, banner: false },
};

/** One sensor's page (sensors/[sensorId]): its import takes the content width on a wide screen. */
const SENSOR_PAGE: ShopFramePage = {
  active: 'sensors',
  title: 'Sensor',
  heading: 'Sensors',
  wide: true,
  banner: false,
};

/**
 * The frame's settings for the page whose path segment follows the shop id (none: the overview);
 * `detail`, the segment after it, tells one sensor's page from the list.
 */
export function shopFramePageOf(segment: string | undefined, detail?: string): ShopFramePage {
  if (segment === 'sensors' && detail !== undefined && detail !== 'index') return SENSOR_PAGE;
  return SHOP_PAGES[segment ?? 'index'] ?? ZONES_PAGE;
}

const ShopContext = createContext<ShopSummary | undefined>(undefined);

/** The shop the surrounding frame shows; the frame renders its pages only once it has one. */
export function useFrameShop(): ShopSummary {
  const shop = useContext(ShopContext);
  if (!shop) throw new Error('useFrameShop is called outside the shop frame');
  return shop;
}

/** The page column's width for a page: the content width for wide pages on a wide screen. */
export function useShopColumnWidth(page: ShopFramePage): number {
  const { isWide } = useBreakpoints();
  return page.wide && isWide ? CONTENT_MAX_WIDTH : SINGLE_COLUMN_MAX_WIDTH;
}

interface ShopFrameProps {
  shopId: string;
  page: ShopFramePage;
  /** The path, so the page scrolls back to the top when it changes, as a new page would. */
  path: string;
  children: ReactNode;
}

/**
 * Every page of a shop (app/shops/[shopId]/_layout.tsx): waits for /me, sends the signed-out to
 * sign in, shows an error with a retry when /me fails otherwise, and "Shop not found" when the
 * shop is not one of the person's; else the header with the shop switcher, the navigation (bar
 * or rail) and a column around the page, which reads the shop with useFrameShop().
 */
export function ShopFrame({ shopId, page, path, children }: ShopFrameProps) {
  const me = useMeQuery();
  const shop = findShop(me.data, shopId);

  if (me.isPending) return <Unready title={page.title} body={<Splash />} />;
  if (isSignedOut(me.error)) return <Redirect href="/sign-in" />;
  if (!shop) {
    return (
      <Unready
        title={page.title}
        body={
          <Screen>
            <Content>
              {me.isError ? (
                <Notice title="Drybench cannot load right now" level={1} testID="shop-error">
                  <Text style={type.body}>{me.error.message}</Text>
                  <Button label="Try again" variant="quiet" onPress={() => void me.refetch()} />
                </Notice>
              ) : (
                <Notice title="Shop not found" level={1} testID="shop-not-found">
                  <Text style={type.body}>
                    This shop does not exist or you are not one of its members.{' '}
                    <Link href="/" style={styles.link}>
                      Go to your shops
                    </Link>
                  </Text>
                </Notice>
              )}
            </Content>
          </Screen>
        }
      />
    );
  }

  return (
    <ShopFrameLayout shop={shop} page={page} path={path}>
      {children}
    </ShopFrameLayout>
  );
}

interface ShopFrameLayoutProps {
  shop: ShopSummary;
  page: ShopFramePage;
  path: string;
  children: ReactNode;
}

/**
 * The frame once its shop is known: header, alarm banner, navigation (bar or rail) and the page's
 * column. The app's frame (ShopFrame) and the server's first screen (FirstScreen.tsx) both render
 * it, so the server's page has the app's frame and its cards stand where the app's will.
 */
export function ShopFrameLayout({ shop, page, path, children }: ShopFrameLayoutProps) {
  const maxWidth = useShopColumnWidth(page);
  const { isWide } = useBreakpoints();
  // The same query the banner reads (patched live), so the count and the banner agree.
  const openAlarms = useQuery(alarmsQueryOptions(shop.id, 'open')).data?.alarms.length ?? 0;
  return (
    <ShopContext.Provider value={shop}>
      <AlarmNotifier shopId={shop.id} shopName={shop.name} timeZone={shop.timeZone} />
      <Screen
        scrollKey={path}
        header={
          <>
            <ShopHeader shopName={shop.name} shopId={shop.id} maxWidth={maxWidth} />
            {page.banner ? (
              <AlarmBanner
                shopId={shop.id}
                timeZone={shop.timeZone}
                canAcknowledge={shop.role !== 'viewer'}
                maxWidth={maxWidth}
              />
            ) : null}
          </>
        }
        rail={
          isWide ? (
            <ShopNav shopId={shop.id} active={page.active} variant="rail" openAlarms={openAlarms} />
          ) : undefined
        }
        footer={
          isWide ? undefined : (
            <ShopNav shopId={shop.id} active={page.active} variant="bar" openAlarms={openAlarms} />
          )
        }
      >
        <Content maxWidth={maxWidth}>
          <View style={styles.stack}>
            <ScreenTitle>{page.heading}</ScreenTitle>
            {children}
          </View>
        </Content>
      </Screen>
    </ShopContext.Provider>
  );
}

/** A frame without its shop still names the tab after the page ("Sensors · Drybench"). */
function Unready({ title, body }: { title: string | undefined; body: ReactNode }) {
  useDocumentTitle(title);
  return body;
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  link: { color: colors.air, textDecorationLine: 'underline' },
});
