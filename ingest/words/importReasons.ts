/**
 * The words of a CSV import that people read, the same in the app and in rejected.csv: why a
 * line of the file was not stored, and why a file or a choice of columns was refused before
 * anything was stored (the API's error messages).
 */
import {
  MAX_FUTURE_MS,
  RH_MAX_PCT,
  RH_MIN_PCT,
  TEMPERATURE_MAX_C,
  TEMPERATURE_MIN_C,
} from '../readingFields';

/** Why one line was left out; each is a `reason` of rejected.csv. */
export const IMPORT_ROW_REASON_CODES = [
  'column_count',
  'time_unreadable',
  'time_too_early',
  'time_in_future',
  'air_unreadable',
  'rh_unreadable',
  'surface_unreadable',
  'air_out_of_range',
  'rh_out_of_range',
  'surface_out_of_range',
  'not_computable',
] as const;
export type ImportRowReason = (typeof IMPORT_ROW_REASON_CODES)[number];

const futureMin = MAX_FUTURE_MS / 60_000;

export const IMPORT_ROW_REASONS: Record<ImportRowReason, string> = {
  column_count: 'This line has a different number of columns than the header.',
  time_unreadable: 'The time cannot be read with the chosen time format.',
  time_too_early: 'The time is before 2000-01-01; check the logger clock.',
  time_in_future: `The time is more than ${futureMin} minutes ahead of now; check the logger clock and time zone.`,
  air_unreadable: 'The air temperature is not a number.',
  rh_unreadable: 'The relative humidity is not a number.',
  surface_unreadable: 'The surface temperature is not a number.',
  air_out_of_range: `The air temperature is outside ${TEMPERATURE_MIN_C}…${TEMPERATURE_MAX_C} °C (is the unit right?).`,
  rh_out_of_range: `The relative humidity is outside ${RH_MIN_PCT}…${RH_MAX_PCT} %.`,
  surface_out_of_range: `The surface temperature is outside ${TEMPERATURE_MIN_C}…${TEMPERATURE_MAX_C} °C (is the unit right?).`,
  not_computable: 'The dew point cannot be computed from this line (relative humidity near 0 %).',
};

/** The refusals of the upload, start and cancel answers, by their API error code. */
export const IMPORT_ERRORS = {
  file_missing: 'Attach the logger file as the "file" field.',
  file_too_large: (maxMb: number) =>
    `The file is larger than ${maxMb} MB; split it into smaller files and import each.`,
  file_empty: 'The file is empty.',
  file_binary:
    'The file is not text (it holds NUL bytes or is not UTF-8): export the logger data as CSV.',
  no_header:
    'The first line has no column names; add a header line naming the columns (e.g. time,air,rh).',
  one_column:
    'No delimiter found: the lines are not split by commas, semicolons, tabs or | — export as CSV.',
  column_missing: (column: string) => `The file has no column named "${column}".`,
  columns_repeated: 'Each column can be chosen once: pick different columns for each value.',
  times_unreadable: (example: string) =>
    `None of the first rows' times can be read with this time format (the first reads "${example}"); choose another format.`,
  times_out_of_range:
    'The sample times lie in the future or before 2000: check the time format and the time zone.',
  values_out_of_range: (unit: string) =>
    `The sample values lie outside what a sensor can read (air −60…85 °C, RH 0…100 %): check the columns and the unit (°${unit} chosen).`,
  import_not_pending: 'This import has already been started.',
  import_finished: 'This import has already finished; there is nothing to cancel.',
  import_not_found: 'No such import for this sensor.',
  sensor_not_found: 'No such sensor in this shop.',
  // Why a running import stopped (the import's `error`); nothing of it was stored.
  file_gone: 'The uploaded file is no longer in storage; upload it again.',
  import_storage:
    'The file could not be read from storage; start the import again with a new upload.',
  import_database: 'The database could not take the import; upload the file again later.',
  import_failed: 'The import stopped on an unexpected problem; nothing of it was stored.',
  upload_expired: (hours: number) =>
    `The file was uploaded but not started within ${hours} hours, so it was let go; upload it again to import it.`,
} as const;
