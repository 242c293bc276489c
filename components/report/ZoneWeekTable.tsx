import { StyleSheet, Text, View } from 'react-native';

import type { ZoneWeekFigures } from '@/components/queries';
import { colors, space, tabular, type } from '@/components/theme';
import { Panel } from '@/components/ui';
import type { TemperatureUnit } from '@/ingest/units';

import { FIGURE_SECTIONS, figureLabel, zoneFigure, type FigureSection } from './reportFigures';

interface ZoneWeekTableProps {
  zones: ZoneWeekFigures[];
  unit: TemperatureUnit;
  timeZone: string;
}

/**
 * The wide screen's figures: a table per section, zones as rows, each column headed by the
 * report's own label with its unit (the CSV's header). Two tables rather than one of twenty-odd
 * columns, so no header is squeezed to a letter a line.
 */
export function ZoneWeekTables({ zones, unit, timeZone }: ZoneWeekTableProps) {
  return (
    <>
      {FIGURE_SECTIONS.map((section) => (
        <SectionTable
          key={section.title}
          section={section}
          zones={zones}
          unit={unit}
          timeZone={timeZone}
        />
      ))}
    </>
  );
}

function SectionTable({
  section,
  zones,
  unit,
  timeZone,
}: ZoneWeekTableProps & { section: FigureSection }) {
  const keys = section.rows.flat();
  return (
    <Panel title={section.title}>
      <View
        role="table"
        aria-label={`${section.title}, by zone, in °${unit}`}
        testID="report-table"
      >
        <View role="row" style={[styles.row, styles.head]}>
          <Text role="columnheader" style={[type.label, styles.cell, styles.name]}>
            {figureLabel('zone', unit)}
          </Text>
          {keys.map((key) => (
            <Text key={key} role="columnheader" style={[type.label, styles.cell]}>
              {figureLabel(key, unit)}
            </Text>
          ))}
        </View>
        {zones.map((zone) => (
          <View key={zone.zoneId} role="row" style={styles.row} testID="report-table-row">
            <Text role="rowheader" style={[type.body, styles.cell, styles.name, styles.strong]}>
              {zone.name}
            </Text>
            {keys.map((key) => (
              <Text
                key={key}
                role="cell"
                style={[type.body, tabular, styles.cell]}
                testID={`report-table-${key}`}
              >
                {zoneFigure(zone, key, unit, timeZone).value}
              </Text>
            ))}
          </View>
        ))}
      </View>
    </Panel>
  );
}

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
  name: { flex: 1.3 },
  strong: { fontWeight: '600' },
});
