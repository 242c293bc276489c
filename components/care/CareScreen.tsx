import { StyleSheet, Text, View } from 'react-native';

import { Columns } from '@/components/layout';
import {
  useCoatingBudgetsQuery,
  useExposureQueries,
  useSurfacesQuery,
  useZonesQuery,
} from '@/components/queries';
import { useFrameShop } from '@/components/shop/ShopFrame';
import { ShopTabs } from '@/components/shop/ShopTabs';
import { space, type } from '@/components/theme';
import { Notice, useDocumentTitle, useNow } from '@/components/ui';

import { AddSurfaceForm } from './AddSurfaceForm';
import { BudgetsPanel } from './BudgetsPanel';
import { groupByZone } from './careText';
import { SurfaceCard } from './SurfaceCard';

/**
 * The shop's care page (Shop → Care): every surface under its zone with its last coat, the
 * exposure since and whether a re-coat is due; the form that adds a surface and the coating
 * budgets beside them on a wide screen, under them on a phone.
 */
export function CareScreen() {
  const shop = useFrameShop();
  useDocumentTitle('Care', shop.name);
  const nowMs = useNow();
  const zones = useZonesQuery(shop.id);
  const surfaces = useSurfacesQuery(shop.id);
  const budgets = useCoatingBudgetsQuery(shop.id);
  const surfaceList = surfaces.data?.surfaces ?? [];
  const exposures = useExposureQueries(shop.id, surfaceList);
  const exposureOf = new Map(surfaceList.map((s, i) => [s.id, exposures[i]]));
  const writer = shop.role !== 'viewer';

  const error = zones.error ?? surfaces.error;
  const list = error ? (
    <Notice title="Surfaces could not be loaded">{error.message}</Notice>
  ) : !zones.data || !surfaces.data ? (
    <Notice title="Loading surfaces…" />
  ) : surfaceList.length === 0 ? (
    <Notice title="No surfaces yet" testID="surfaces-empty">
      A surface is a machine top, a bed or a shelf of tools you protect. Log each coat and
      inspection on it, and Drybench counts the damp hours since the last coat.
    </Notice>
  ) : (
    <View style={styles.groups} testID="surface-groups">
      {groupByZone(zones.data.zones, surfaceList).map(({ zone, surfaces: inZone }) => (
        <View key={zone.id} style={styles.group} testID="surface-group">
          <Text style={type.title} role="heading" aria-level={2}>
            {zone.name}
          </Text>
          {inZone.map((surface) => {
            const exposure = exposureOf.get(surface.id);
            return (
              <SurfaceCard
                key={surface.id}
                shopId={shop.id}
                surface={surface}
                exposure={exposure?.data}
                exposureError={exposure?.error?.message ?? null}
                nowMs={nowMs}
              />
            );
          })}
        </View>
      ))}
    </View>
  );
  const side = (
    <>
      {writer && zones.data && zones.data.zones.length > 0 ? (
        <AddSurfaceForm shop={shop} zones={zones.data.zones} />
      ) : null}
      {budgets.data ? (
        <BudgetsPanel shop={shop} budgets={budgets.data.budgets} />
      ) : budgets.isError ? (
        <Notice title="Budgets could not be loaded">{budgets.error.message}</Notice>
      ) : null}
    </>
  );
  return (
    <>
      <ShopTabs shop={shop} current="care" />
      <Columns first={list} second={side} />
    </>
  );
}

const styles = StyleSheet.create({
  groups: { gap: space.xl },
  group: { gap: space.md },
});
