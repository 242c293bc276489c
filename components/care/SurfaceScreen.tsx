import { formatInTimeZone } from 'date-fns-tz';
import { StyleSheet, Text, View } from 'react-native';

import { careHref } from '@/components/hrefs';
import { BackLink, useBreakpoints } from '@/components/layout';
import { SubjectPhotos } from '@/components/photos/SubjectPhotos';
import {
  photoPaths,
  surfaceKeys,
  useExposureQuery,
  useSensorsQuery,
  useSurfaceQuery,
  useZonesQuery,
  type ShopSummary,
  type SurfaceDetail,
} from '@/components/queries';
import { useFrameShop } from '@/components/shop/ShopFrame';
import { space, type } from '@/components/theme';
import { Notice, useDocumentTitle, useNow } from '@/components/ui';
import { CARE_KIND_WORDS, SURFACE_SOURCE_WORDS } from '@/ingest/words';

import { CoatForm, InspectionForm } from './CareForms';
import { CareTimeline } from './CareTimeline';
import { ExposurePanel } from './ExposurePanel';
import { SurfaceChart } from './SurfaceChart';

/**
 * One surface: what it is and where its temperature comes from, the exposure since its last coat
 * with the re-coat suggestion, its care log over the zone's margin chart, and (for owners and
 * members) the forms that log a coat or an inspection. Phone: one column; wide: the chart and the
 * log beside the exposure and the forms.
 */
export function SurfaceScreen({ surfaceId }: { surfaceId: string }) {
  const shop = useFrameShop();
  const surface = useSurfaceQuery(shop.id, surfaceId);
  useDocumentTitle(surface.data ? `${surface.data.name} · Care` : 'Care', shop.name);
  if (surface.isError) {
    return (
      <>
        <BackLink href={careHref(shop.id)} label="All surfaces" />
        <Notice title="The surface could not be loaded" testID="surface-error">
          {surface.error.message}
        </Notice>
      </>
    );
  }
  if (!surface.data) return <Notice title="Loading the surface…" />;
  return <SurfaceBody shop={shop} surface={surface.data} />;
}

function SurfaceBody({ shop, surface }: { shop: ShopSummary; surface: SurfaceDetail }) {
  const { isWide } = useBreakpoints();
  const nowMs = useNow();
  const exposure = useExposureQuery(shop.id, surface);
  const zones = useZonesQuery(shop.id);
  const sensors = useSensorsQuery(shop.id);
  const zone = zones.data?.zones.find((z) => z.id === surface.zoneId);
  const probe = surface.sensorId
    ? sensors.data?.sensors.find((s) => s.id === surface.sensorId)
    : undefined;
  const writer = shop.role !== 'viewer';
  const facts = [
    zone?.name,
    surface.material,
    surface.sensorId
      ? SURFACE_SOURCE_WORDS.probe(probe?.name ?? 'a sensor')
      : SURFACE_SOURCE_WORDS.estimate,
  ].filter(Boolean);

  const exposurePanel = (
    <ExposurePanel exposure={exposure.data} error={exposure.error?.message ?? null} nowMs={nowMs} />
  );
  const chart = zone ? (
    <SurfaceChart
      shopId={shop.id}
      zone={zone}
      care={surface.care}
      timeZone={shop.timeZone}
      nowMs={nowMs}
    />
  ) : null;
  const timeline = (
    <CareTimeline
      care={surface.care}
      timeZone={shop.timeZone}
      renderExtra={(entry) => (
        <SubjectPhotos
          shop={shop}
          photos={entry.photos}
          uploadPath={photoPaths.careEntry(shop.id, surface.id, entry.id)}
          refresh={surfaceKeys.one(shop.id, surface.id)}
          subjectName={`${surface.name}, ${CARE_KIND_WORDS[entry.kind].toLowerCase()} of ${formatInTimeZone(entry.at, shop.timeZone, 'd MMMM yyyy')}`}
          testID="care-entry"
        />
      )}
    />
  );
  const forms = writer ? (
    <>
      <CoatForm shop={shop} surface={surface} />
      <InspectionForm shop={shop} surface={surface} />
    </>
  ) : null;
  return (
    <>
      <BackLink href={careHref(shop.id)} label="All surfaces" />
      <View style={styles.head}>
        <Text style={type.title} role="heading" aria-level={2} testID="surface-name-heading">
          {surface.name}
        </Text>
        <Text style={type.small} testID="surface-facts">
          {facts.join(' · ')}
        </Text>
      </View>
      {isWide ? (
        <View style={styles.columns}>
          <View style={styles.wideColumn}>
            {chart}
            {timeline}
          </View>
          <View style={styles.column}>
            {exposurePanel}
            {forms}
          </View>
        </View>
      ) : (
        <>
          {exposurePanel}
          {chart}
          {timeline}
          {forms}
        </>
      )}
    </>
  );
}

const styles = StyleSheet.create({
  head: { gap: space.xs },
  columns: { flexDirection: 'row', alignItems: 'flex-start', gap: space.xl },
  wideColumn: { flex: 3, minWidth: 0, gap: space.lg },
  column: { flex: 2, minWidth: 0, gap: space.lg },
});
