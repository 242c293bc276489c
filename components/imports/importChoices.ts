/**
 * The column choices of a CSV import, kept pure so they are tested without a browser: the first
 * guess from the file's header and rows (or the sensor's saved choices), the checks made before
 * anything is sent (the server makes the same), and where each of the server's refusals is shown.
 */
import type {
  ApiError,
  ImportMapping,
  ImportPreview,
  ImportTimeFormat,
} from '@/components/queries';
import { IMPORT_CHOICE_ERRORS, IMPORT_FIELD_WORDS } from '@/ingest/words';

/** The choices as the form holds them: a column not chosen yet is null. */
export interface ImportChoices {
  timeColumn: string | null;
  airColumn: string | null;
  rhColumn: string | null;
  surfaceColumn: string | null;
  temperatureUnit: ImportMapping['temperatureUnit'];
  timeFormat: ImportTimeFormat;
  timeZone: string;
  remember: boolean;
}

export type ChoiceField = keyof ImportMapping;

export type ChoiceErrors = Partial<Record<ChoiceField, string>>;

/** The fields that name a column, in the order they are shown. */
export const COLUMN_FIELDS = ['timeColumn', 'airColumn', 'rhColumn', 'surfaceColumn'] as const;

// Header words loggers commonly use, in English and a few neighbours; a guess only, shown for
// the person to check before anything is stored.
// Short names count as words only between non-letters, so "air_c" is air and "chair" is not.
const TIME_NAME = /time|date|stamp|zeit|datum|fecha|heure/i;
const RH_NAME = /(^|[^a-z])rh([^a-z]|$)|humid|feuchte|humedad|%/i;
const SURFACE_NAME = /surface|probe|(^|[^a-z])top([^a-z]|$)|iron|metal|steel/i;
const AIR_NAME = /temp|(^|[^a-z])air([^a-z]|$)|°|celsius|fahrenheit|(^|[^a-z])t([^a-z]|$)/i;
const DEW_NAME = /dew|taupunkt/i;
const FAHRENHEIT = /°\s*f\b|\(f\)|\bdeg\s*f\b|fahrenheit|\btemp[_ ]?f\b/i;

function firstMatching(
  columns: readonly string[],
  test: (name: string) => boolean,
  taken: ReadonlySet<string>,
) {
  return columns.find((name) => !taken.has(name) && test(name)) ?? null;
}

/** The column choices a header suggests; columns it cannot place stay null. */
export function guessColumns(
  columns: readonly string[],
): Pick<ImportChoices, 'timeColumn' | 'airColumn' | 'rhColumn' | 'surfaceColumn'> {
  const taken = new Set<string>();
  const take = (name: string | null) => {
    if (name !== null) taken.add(name);
    return name;
  };
  const timeColumn = take(firstMatching(columns, (n) => TIME_NAME.test(n), taken));
  const rhColumn = take(firstMatching(columns, (n) => RH_NAME.test(n) && !DEW_NAME.test(n), taken));
  const surfaceColumn = take(
    firstMatching(columns, (n) => SURFACE_NAME.test(n) && !DEW_NAME.test(n), taken),
  );
  const airColumn = take(
    firstMatching(columns, (n) => AIR_NAME.test(n) && !DEW_NAME.test(n), taken),
  );
  return { timeColumn, airColumn, rhColumn, surfaceColumn };
}

const ISO_TIME = /^\d{4}-\d{2}-\d{2}([ T]\d{2}:\d{2}|$)/;
const DATE_FIRST = /^(\d{1,2})[/.-](\d{1,2})[/.-]\d{2,4}\b/;

/**
 * The time format the first rows' times are written in. Epoch counts by their digits (13 are
 * milliseconds: 10^12 ms is 2001-09-09, 10^13 ms is in 2286; 9–10 are seconds); day or month first
 * by any part above 12. When every date could be either, loggers set up in the Americas are taken
 * to write the month first and all others the day first — a rule of thumb, shown for checking.
 */
export function guessTimeFormat(times: readonly string[], shopTimeZone: string): ImportTimeFormat {
  const cells = times.map((t) => t.trim()).filter((t) => t !== '');
  const first = cells[0];
  if (first === undefined) return 'iso';
  if (/^\d{13}(\.\d+)?$/.test(first)) return 'epoch-ms';
  if (/^\d{9,10}(\.\d+)?$/.test(first)) return 'epoch-s';
  if (ISO_TIME.test(first)) return 'iso';
  const parts = cells.map((c) => DATE_FIRST.exec(c)).filter((m) => m !== null);
  if (parts.some((m) => Number(m[1]) > 12)) return 'day-first';
  if (parts.some((m) => Number(m[2]) > 12)) return 'month-first';
  return shopTimeZone.startsWith('America/') ? 'month-first' : 'day-first';
}

/** °F when the air column's name says so; else °C. */
export function guessUnit(airColumn: string | null): ImportMapping['temperatureUnit'] {
  return airColumn !== null && FAHRENHEIT.test(airColumn) ? 'F' : 'C';
}

/**
 * The form's first state: the sensor's saved choices when the server offers them (their columns
 * are still in the file), else guesses from the header and rows, in the shop's time zone.
 */
export function initialChoices(
  preview: ImportPreview,
  suggested: ImportMapping | null,
  shopTimeZone: string,
): ImportChoices {
  if (suggested) return { ...suggested, remember: true };
  const columns = guessColumns(preview.columns);
  const timeIndex = columns.timeColumn === null ? -1 : preview.columns.indexOf(columns.timeColumn);
  const times = timeIndex === -1 ? [] : preview.rows.map((row) => row[timeIndex] ?? '');
  return {
    ...columns,
    temperatureUnit: guessUnit(columns.airColumn),
    timeFormat: guessTimeFormat(times, shopTimeZone),
    timeZone: shopTimeZone,
    remember: true,
  };
}

/** The problems the server would refuse, found before sending; empty when there are none. */
export function checkChoices(choices: ImportChoices): ChoiceErrors {
  const errors: ChoiceErrors = {};
  for (const field of ['timeColumn', 'airColumn', 'rhColumn'] as const) {
    if (choices[field] === null) {
      errors[field] = IMPORT_CHOICE_ERRORS.required(IMPORT_FIELD_WORDS[field]);
    }
  }
  const seen = new Map<string, ChoiceField>();
  for (const field of COLUMN_FIELDS) {
    const column = choices[field];
    if (column === null) continue;
    const earlier = seen.get(column);
    if (earlier) {
      errors[earlier] ??= IMPORT_CHOICE_ERRORS.repeated(column);
      errors[field] ??= IMPORT_CHOICE_ERRORS.repeated(column);
    } else {
      seen.set(column, field);
    }
  }
  if (choices.timeZone.trim() === '') errors.timeZone = IMPORT_CHOICE_ERRORS.timeZone;
  return errors;
}

/** The mapping the start route takes, or null while a required column is not chosen. */
export function mappingOf(choices: ImportChoices): ImportMapping | null {
  const { timeColumn, airColumn, rhColumn, remember: _remember, ...rest } = choices;
  if (timeColumn === null || airColumn === null || rhColumn === null) return null;
  return { ...rest, timeColumn, airColumn, rhColumn };
}

const MAPPING_FIELDS: readonly ChoiceField[] = [
  ...COLUMN_FIELDS,
  'temperatureUnit',
  'timeFormat',
  'timeZone',
];

/** The field a detail's path names ("mapping.airColumn", "airColumn"), if any. */
function fieldOfPath(path: string): ChoiceField | null {
  const last = path.split('.').pop() ?? '';
  return MAPPING_FIELDS.find((field) => field === last) ?? null;
}

/** The field whose chosen column a message names, quoted or by its details. */
function fieldNamingColumn(error: ApiError, choices: ImportChoices): ChoiceField | null {
  const named = error.details.map((d) => d.message);
  for (const field of COLUMN_FIELDS) {
    const column = choices[field];
    if (column === null) continue;
    if (named.includes(column)) return field;
    if (error.message.includes(`“${column}”`) || error.message.includes(`"${column}"`)) {
      return field;
    }
  }
  return null;
}

/** The value fields a detail or message names: "rh" → the RH column, and so on. */
function fieldOfValue(text: string): ChoiceField | null {
  if (/surface/i.test(text)) return 'surfaceColumn';
  if (/\brh\b|humid/i.test(text)) return 'rhColumn';
  if (/\bair\b/i.test(text)) return 'airColumn';
  return null;
}

/**
 * Where a refusal of the start request is shown: beside the field it concerns (a missing column
 * at that column's choice, unreadable times at the time format), or under the form (`form`) when
 * it names no field.
 */
export function placeStartError(
  error: ApiError,
  choices: ImportChoices,
): { fields: ChoiceErrors; form: string | null } {
  const at = (field: ChoiceField | null) =>
    field ? { fields: { [field]: error.message }, form: null } : null;
  switch (error.code) {
    case 'column_missing':
      return (
        at(error.details.map((d) => fieldOfPath(d.path)).find((f) => f !== null) ?? null) ??
        at(fieldNamingColumn(error, choices)) ?? { fields: {}, form: error.message }
      );
    case 'columns_repeated': {
      const local = checkChoices(choices);
      const repeated = COLUMN_FIELDS.filter((f) => local[f] !== undefined);
      return repeated.length > 0
        ? { fields: Object.fromEntries(repeated.map((f) => [f, error.message])), form: null }
        : { fields: {}, form: error.message };
    }
    case 'times_unreadable':
    case 'times_out_of_range':
      return { fields: { timeFormat: error.message }, form: null };
    case 'values_out_of_range': {
      const named = [...error.details.map((d) => `${d.path} ${d.message}`), error.message];
      const field = named.map(fieldOfValue).find((f) => f !== null) ?? 'temperatureUnit';
      return { fields: { [field]: error.message }, form: null };
    }
    case 'invalid_body': {
      const fields: ChoiceErrors = {};
      for (const detail of error.details) {
        const field = fieldOfPath(detail.path);
        if (field) fields[field] ??= detail.message;
      }
      return Object.keys(fields).length > 0
        ? { fields, form: null }
        : { fields: {}, form: error.message };
    }
    default:
      return { fields: {}, form: error.message };
  }
}
