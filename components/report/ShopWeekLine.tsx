import { Text } from 'react-native';

import type { ShopWeekFigures } from '@/components/queries';
import { type } from '@/components/theme';
import { Panel } from '@/components/ui';
import type { TemperatureUnit } from '@/ingest/units';
import { SHOP_WIDE_LABEL } from '@/ingest/words';

import { FigureList } from './FigureList';
import { SHOP_FIGURE_ROWS, shopFigure } from './reportFigures';

interface ShopWeekLineProps {
  figures: ShopWeekFigures;
  unit: TemperatureUnit;
  timeZone: string;
}

/** The whole shop's week on top: its verdict (with its cautions), then its figures. */
export function ShopWeekLine({ figures, unit, timeZone }: ShopWeekLineProps) {
  const rows = SHOP_FIGURE_ROWS.map((row) =>
    row.map((key) => shopFigure(figures, key, unit, timeZone)),
  );
  return (
    <Panel title={SHOP_WIDE_LABEL} testID="report-shop">
      <Text style={type.body} testID="report-shop-verdict">
        {figures.verdict}
      </Text>
      <FigureList rows={rows} testID="report-shop-figures" />
    </Panel>
  );
}
