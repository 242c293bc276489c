import { Text } from 'react-native';

import { useBreakpoints } from '@/components/layout';
import { findShop } from '@/components/queries';
import { type } from '@/components/theme';
import { ZoneColumns } from '@/components/zones/ZoneColumns';
import { orderByRisk } from '@/components/zones/zoneOrder';
import { ZoneOverview } from '@/components/zones/ZoneOverview';
import type { FirstScreenInput } from '@/ingest/wire/firstScreen';

import { SetupChecklist } from './SetupChecklist';
import { ShopFrameLayout, shopFramePageOf } from './ShopFrame';

/**
 * A shop's overview as the server renders it into the page, shown until the app's own overview
 * has its cards (scripts/webpage/firstScreenHandover.ts removes it then): the app's shop frame
 * (header, alarm banner, bar or rail) around the overview ZonesScreen shows at this width — the
 * phone list, or on a wide screen the list beside the riskiest zone's column, which holds only
 * its name until the app brings the chart — under the setup checklist while a new shop's owner has
 * steps left, as in the app. Rendered once to a string per breakpoint
 * (scripts/webpage/firstScreenEntry.tsx), so nothing here may depend on effects; the queries it
 * reads (/me, zones, open alarms, sensors) are filled in before the render.
 */
export function FirstScreen({ me, shopId, zones }: FirstScreenInput) {
  const { isWide } = useBreakpoints();
  const shop = findShop(me, shopId);
  if (!shop || zones.length === 0) return null;
  const ordered = orderByRisk(zones);
  const shown = ordered[0]!;
  return (
    <ShopFrameLayout shop={shop} page={shopFramePageOf(undefined)} path={`/shops/${shop.id}`}>
      <SetupChecklist shop={shop}>
        {isWide ? (
          <ZoneColumns
            shopId={shop.id}
            zones={ordered}
            timeZone={shop.timeZone}
            selectedZoneId={shown.id}
          >
            <Text style={type.title} role="heading" aria-level={2}>
              {shown.name}
            </Text>
          </ZoneColumns>
        ) : (
          <ZoneOverview shopId={shop.id} zones={ordered} timeZone={shop.timeZone} />
        )}
      </SetupChecklist>
    </ShopFrameLayout>
  );
}
