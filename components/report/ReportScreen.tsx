import { router } from 'expo-router';
import { StyleSheet, Text, View } from 'react-native';

import { Button } from '@/components/forms';
import { useBreakpoints } from '@/components/layout';
import {
  fetchWeekReportFile,
  useUnitPref,
  useWeekReportQuery,
  useZonesQuery,
  type WeekReport,
  type Zone,
} from '@/components/queries';
import { useFrameShop } from '@/components/shop/ShopFrame';
import { space, type } from '@/components/theme';
import { DownloadButton, Notice, useDocumentTitle, useNow } from '@/components/ui';

import { isLatestWeek, isPartialWeek, weekLabel } from './reportWeek';
import { ShopWeekLine } from './ShopWeekLine';
import { WeekPicker } from './WeekPicker';
import { ZoneWeekCard } from './ZoneWeekCard';
import { ZoneWeekTables } from './ZoneWeekTable';

interface ReportScreenProps {
  /** The week's Monday from the URL (`?week=`); null: the week the server picks. */
  week: string | null;
}

/**
 * A shop's week: the week picker, the whole shop's line, then each zone's figures and chart, and
 * the CSV and PDF of the same report. Phone: one column of cards; wide: the figures as a table
 * with zones as rows, and the charts two to a row. The week lives in the URL, so a reload or a
 * shared link shows the same week.
 */
export function ReportScreen({ week }: ReportScreenProps) {
  const shop = useFrameShop();
  const unit = useUnitPref();
  const { isWide } = useBreakpoints();
  const nowMs = useNow(60_000);
  const report = useWeekReportQuery(shop.id, week, unit);
  const zones = useZonesQuery(shop.id).data?.zones;
  const start = week ?? report.data?.week.start ?? null;
  useDocumentTitle(start ? `Week report ${weekLabel(start)}` : 'Week report', shop.name);

  const goTo = (next: string) => router.setParams({ week: next });

  return (
    <View style={styles.stack}>
      {start ? (
        <WeekPicker
          start={start}
          latest={isLatestWeek(start, nowMs, shop.timeZone)}
          soFar={report.data ? isPartialWeek(report.data.week) : false}
          onChange={goTo}
        />
      ) : null}
      {report.isError ? (
        <Notice title="The week report could not be loaded" testID="report-error">
          <Text style={type.body}>{report.error.message}</Text>
          <View style={styles.retry}>
            <Button label="Try again" variant="quiet" onPress={() => void report.refetch()} />
          </View>
        </Notice>
      ) : !report.data ? (
        <Notice title="Loading the week report…" testID="report-loading" />
      ) : (
        <WeekBody report={report.data} zones={zones} wide={isWide} shopId={shop.id} />
      )}
    </View>
  );
}

interface WeekBodyProps {
  report: WeekReport;
  zones: Zone[] | undefined;
  wide: boolean;
  shopId: string;
}

function WeekBody({ report, zones, wide, shopId }: WeekBodyProps) {
  const { week, unit } = report;
  const timeZone = report.shop.timeZone;
  const limitsOf = (zoneId: string) => zones?.find((zone) => zone.id === zoneId);
  return (
    <>
      {week.note ? (
        <Text style={type.body} testID="report-week-note">
          {week.note}
        </Text>
      ) : null}
      <View style={styles.downloads}>
        {(['csv', 'pdf'] as const).map((format) => (
          <DownloadButton
            key={format}
            format={format}
            fetchFile={() => fetchWeekReportFile(shopId, week.start, format)}
            fallbackName={`drybench-week-${week.start}.${format}`}
            testID="report-download"
          />
        ))}
      </View>
      <ShopWeekLine figures={report.shopWide} unit={unit} timeZone={timeZone} />
      {report.zones.length === 0 ? (
        <Notice title="This shop has no zones yet" testID="report-no-zones">
          Add a zone and a sensor in the shop settings; its week shows here.
        </Notice>
      ) : null}
      {wide && report.zones.length > 0 ? (
        <ZoneWeekTables zones={report.zones} unit={unit} timeZone={timeZone} />
      ) : null}
      <View style={[styles.zones, wide && styles.grid]}>
        {report.zones.map((zone) => (
          <View key={zone.zoneId} style={wide ? styles.gridItem : undefined}>
            <ZoneWeekCard
              shopId={shopId}
              zone={zone}
              limits={limitsOf(zone.zoneId)}
              week={week}
              timeZone={timeZone}
              unit={unit}
              showFigures={!wide}
              chartHeight={wide ? 220 : 200}
            />
          </View>
        ))}
      </View>
    </>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  retry: { alignSelf: 'flex-start' },
  downloads: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  zones: { gap: space.lg },
  grid: { flexDirection: 'row', flexWrap: 'wrap' },
  gridItem: { flexBasis: '48%', flexGrow: 1, minWidth: 0 },
});
