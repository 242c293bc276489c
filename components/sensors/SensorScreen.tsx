import { StyleSheet, Text, View } from 'react-native';

import { sensorsHref } from '@/components/hrefs';
import { ImportHistory } from '@/components/imports/ImportHistory';
import { ImportPanel } from '@/components/imports/ImportPanel';
import { BackLink, useBreakpoints } from '@/components/layout';
import {
  useImportsQuery,
  useSensorsQuery,
  type Sensor,
  type ShopSummary,
} from '@/components/queries';
import { useFrameShop } from '@/components/shop/ShopFrame';
import { colors, space, type } from '@/components/theme';
import { Notice, Panel, useDocumentTitle } from '@/components/ui';

import { SensorFacts } from './SensorFacts';

/**
 * One sensor: what the sensors list knows of it, "Import history from a logger file" (owners and
 * members) and its past imports. Phone: one column; wide: the facts and past imports beside the
 * import, which needs the room for the file's columns.
 */
export function SensorScreen({ sensorId }: { sensorId: string }) {
  const shop = useFrameShop();
  const sensors = useSensorsQuery(shop.id);
  const sensor = sensors.data?.sensors.find((s) => s.id === sensorId);
  useDocumentTitle(sensor ? `${sensor.name} · Sensors` : 'Sensors', shop.name);
  if (sensors.isError) {
    return (
      <>
        <BackLink href={sensorsHref(shop.id)} label="All sensors" />
        <Notice title="The sensor could not be loaded" testID="sensor-error">
          {sensors.error.message}
        </Notice>
      </>
    );
  }
  if (!sensors.data) return <Notice title="Loading the sensor…" />;
  if (!sensor) {
    return (
      <>
        <BackLink href={sensorsHref(shop.id)} label="All sensors" />
        <Notice title="Sensor not found" testID="sensor-not-found">
          This sensor is not in the shop, or it has been removed.
        </Notice>
      </>
    );
  }
  return <SensorBody shop={shop} sensor={sensor} />;
}

function SensorBody({ shop, sensor }: { shop: ShopSummary; sensor: Sensor }) {
  const { isWide } = useBreakpoints();
  const imports = useImportsQuery(shop.id, sensor.id);
  const list = imports.data?.imports;
  // Viewers never import: on a wide screen their past imports take the wide column instead.
  const writer = shop.role !== 'viewer';
  const about = (
    <Panel testID="sensor-about">
      <View style={styles.head}>
        <Text
          style={[type.title, styles.grow]}
          role="heading"
          aria-level={2}
          testID="sensor-heading"
        >
          {sensor.name}
        </Text>
        {sensor.revokedAt !== null ? (
          <Text style={[type.label, styles.revoked]}>token revoked</Text>
        ) : null}
      </View>
      <SensorFacts sensor={sensor} timeZone={shop.timeZone} />
    </Panel>
  );
  const importPanel = <ImportPanel shop={shop} sensorId={sensor.id} imports={list} />;
  const history = (
    <ImportHistory
      imports={list}
      error={imports.isError ? imports.error.message : null}
      timeZone={shop.timeZone}
    />
  );
  return (
    <>
      <BackLink href={sensorsHref(shop.id)} label="All sensors" />
      {isWide ? (
        <View style={styles.columns}>
          <View style={styles.side}>
            {about}
            {writer ? history : null}
          </View>
          <View style={styles.main}>
            {importPanel}
            {writer ? null : history}
          </View>
        </View>
      ) : (
        <>
          {about}
          {importPanel}
          {history}
        </>
      )}
    </>
  );
}

const styles = StyleSheet.create({
  head: { flexDirection: 'row', alignItems: 'flex-start', gap: space.md },
  grow: { flex: 1 },
  revoked: { color: colors.wet },
  columns: { flexDirection: 'row', alignItems: 'flex-start', gap: space.xl },
  side: { flex: 2, minWidth: 0, gap: space.lg },
  main: { flex: 3, minWidth: 0, gap: space.lg },
});
