import { StyleSheet, Text, View } from 'react-native';

import type { ZoneWeekFigures } from '@/components/queries';
import { cardSurface, space, type } from '@/components/theme';
import type { TemperatureUnit } from '@/ingest/units';
import { formatHours } from '@/ingest/words';

import { FigureList } from './FigureList';
import { LevelHoursBar } from './LevelHoursBar';
import { FIGURE_SECTIONS, reportClock, zoneFigure } from './reportFigures';
import { ZoneWeekChart } from './ZoneWeekChart';

interface ZoneWeekCardProps {
  shopId: string;
  zone: ZoneWeekFigures;
  /** The zone's limits; none when the zone is gone from the settings (no bands to draw). */
  limits: { wetK: number; cautionK: number } | undefined;
  week: { from: string; to: string; periodEnd: string };
  timeZone: string;
  unit: TemperatureUnit;
  /** The figures in the card (a phone); on a wide screen the table beside it holds them. */
  showFigures: boolean;
  chartHeight: number;
}

/**
 * One zone's week: its verdict, the hours in each level, its figures and a small chart of the
 * week. A zone that sent nothing says so instead of a row of dashes.
 */
export function ZoneWeekCard({
  shopId,
  zone,
  limits,
  week,
  timeZone,
  unit,
  showFigures,
  chartHeight,
}: ZoneWeekCardProps) {
  const empty = zone.readings === 0;
  return (
    <View style={styles.card} testID="report-zone">
      <Text style={type.heading} role="heading" aria-level={2} testID="report-zone-name">
        {zone.name}
      </Text>
      {empty ? (
        <Text style={type.body} testID="report-zone-empty">
          No readings this week.
        </Text>
      ) : null}
      <Text style={type.body} testID="report-zone-verdict">
        {zone.verdict}
      </Text>
      {empty ? null : (
        <>
          <LevelHoursBar hours={zone.levelHours} testID="report-zone-levels" />
          {showFigures
            ? FIGURE_SECTIONS.map((section) => (
                <View key={section.title} style={styles.section}>
                  <Text style={type.label} role="heading" aria-level={3}>
                    {section.title}
                  </Text>
                  <FigureList
                    // The level hours are the bar's, written under it already.
                    rows={section.rows
                      .filter((row) => !row[0]!.startsWith('hours_'))
                      .map((row) => row.map((key) => zoneFigure(zone, key, unit, timeZone)))}
                    testID="report-zone-figures"
                  />
                </View>
              ))
            : null}
          {showFigures && zone.silentPeriods.length > 0 ? (
            <View style={styles.silent} testID="report-zone-silent">
              <Text style={type.label}>Silent</Text>
              {zone.silentPeriods.map((period) => (
                <Text key={period.from} style={type.small}>
                  {reportClock(period.from, timeZone)} – {reportClock(period.to, timeZone)} (
                  {formatHours(period.hours)})
                </Text>
              ))}
            </View>
          ) : null}
          {limits ? (
            <ZoneWeekChart
              shopId={shopId}
              zone={zone}
              limits={limits}
              week={week}
              timeZone={timeZone}
              unit={unit}
              height={chartHeight}
            />
          ) : null}
        </>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  card: { ...cardSurface, padding: space.lg, gap: space.md },
  silent: { gap: 2 },
  section: { gap: space.sm },
});
