import { Text } from 'react-native';

import type { ShopWeekFigures } from '@/components/queries';
import { type } from '@/components/theme';
import { Panel } from '@/components/ui';
import type { TemperatureUnit } from '@/ingest/units';
import { MISSING, formatMargin, formatPercent } from '@/ingest/words';

import { FigureList, type Figure } from './FigureList';
import { formatAckMinutes, formatHours, reportTime } from './reportFigures';

interface ShopWeekLineProps {
  figures: ShopWeekFigures;
  unit: TemperatureUnit;
  timeZone: string;
  wide: boolean;
}

/** The whole shop's week on top: its verdict, then the few figures that say how it went. */
export function ShopWeekLine({ figures, unit, timeZone, wide }: ShopWeekLineProps) {
  const lowest = figures.lowestMargin;
  const list: Figure[] = [
    {
      key: 'lowestMargin',
      label: `Lowest dew margin (°${unit})`,
      value: lowest
        ? `${formatMargin(lowest.marginK, unit)}, ${lowest.zoneName}, ${reportTime(lowest.at, timeZone)}`
        : MISSING,
    },
    {
      key: 'levels',
      label: 'Hours wet / close (h)',
      value: `${formatHours(figures.wetHours)} / ${formatHours(figures.closeHours)}`,
    },
    {
      key: 'zonesWet',
      label: 'Zones wet at any time',
      value: `${figures.zonesWet} of ${figures.zones}`,
    },
    { key: 'coverage', label: 'Coverage (%)', value: formatPercent(figures.coveragePct) },
    {
      key: 'alarms',
      label: 'Alarms opened / unacknowledged',
      value: `${figures.alarmsOpened} / ${figures.unacknowledged}`,
    },
    {
      key: 'ack',
      label: 'Median time to acknowledge',
      value: formatAckMinutes(figures.medianAckMinutes),
    },
  ];
  return (
    <Panel title="Whole shop" testID="report-shop">
      <Text style={type.body} testID="report-shop-verdict">
        {figures.verdict}
      </Text>
      <FigureList figures={list} columns={wide ? 2 : 1} testID="report-shop-figures" />
    </Panel>
  );
}
