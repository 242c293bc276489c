import { StyleSheet, Text, View } from 'react-native';

import type { ZoneWeekFigures } from '@/components/queries';
import { colors, space, tabular, type } from '@/components/theme';
import { Panel } from '@/components/ui';
import type { TemperatureUnit } from '@/ingest/units';

import { zoneFigureRows, type FigureKey } from './reportFigures';
import { REPORT_FIGURE_LABELS } from './reportLabels';

interface ZoneWeekTableProps {
  zones: ZoneWeekFigures[];
  unit: TemperatureUnit;
  timeZone: string;
}

/** The wide screen's figures: zones as rows, each column headed by its figure and unit. */
export function ZoneWeekTable({ zones, unit, timeZone }: ZoneWeekTableProps) {
  const labels = Object.entries(REPORT_FIGURE_LABELS(unit)) as [FigureKey, string][];
  return (
    <Panel title="Figures by zone">
      <View role="table" aria-label={`Week figures by zone, in °${unit}`} testID="report-table">
        <View role="row" style={[styles.row, styles.head]}>
          <Text role="columnheader" style={[type.label, styles.cell, styles.name]}>
            Zone
          </Text>
          {labels.map(([key, label]) => (
            <Text
              key={key}
              role="columnheader"
              style={[type.label, styles.cell, { flex: COLUMN_FLEX[key] }]}
            >
              {label}
            </Text>
          ))}
        </View>
        {zones.map((zone) => (
          <View key={zone.zoneId} role="row" style={styles.row} testID="report-table-row">
            <Text role="rowheader" style={[type.body, styles.cell, styles.name, styles.strong]}>
              {zone.name}
            </Text>
            {zoneFigureRows(zone, unit, timeZone).map((row) => (
              <Text
                key={row.key}
                role="cell"
                style={[type.body, tabular, styles.cell, { flex: COLUMN_FLEX[row.key] }]}
              >
                {row.value}
              </Text>
            ))}
          </View>
        ))}
      </View>
    </Panel>
  );
}

/** Room by what a column holds: three values with units get more than a count. */
const COLUMN_FLEX: Record<FigureKey, number> = {
  coverage: 0.8,
  lowestMargin: 1.2,
  air: 1.5,
  rh: 1.2,
  emc: 1.3,
  timeOfWetness: 1,
  alarmsOpened: 1.2,
  ackTimes: 1.1,
  // "acknowledged" is 12 characters: room for the word on one line at 1,440 px.
  unacknowledged: 1.3,
  silent: 0.9,
};

const styles = StyleSheet.create({
  row: {
    flexDirection: 'row',
    columnGap: space.sm,
    paddingVertical: space.sm,
    borderBottomWidth: 1,
    borderBottomColor: colors.border,
  },
  head: { alignItems: 'flex-end' },
  cell: { flex: 1, minWidth: 0, fontSize: 12, lineHeight: 16 },
  name: { flex: 1.1 },
  strong: { fontWeight: '600' },
});
