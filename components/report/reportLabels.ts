/**
 * The names of a zone's week figures, with their units. Until the shared report words land in
 * ingest/words these are the screen's own; the CSV and PDF columns will name the same figures.
 */
import type { TemperatureUnit } from '@/ingest/units';

export function REPORT_FIGURE_LABELS(unit: TemperatureUnit) {
  return {
    coverage: 'Coverage (%)',
    lowestMargin: `Lowest dew margin (°${unit}) and when`,
    air: `Air min / mean / max (°${unit})`,
    rh: 'RH min / mean / max (%)',
    emc: 'Wood EMC min / mean / max (%)',
    timeOfWetness: 'Time of wetness, ISO 9223 (h, category)',
    alarmsOpened: 'Alarms opened',
    ackTimes: 'Time to acknowledge, median / longest',
    unacknowledged: 'Alarms not acknowledged',
    silent: 'Silent periods (count, h)',
  } as const;
}
