// The column choices of a CSV import before anything is sent: the first guess from a logger's
// header and rows, the checks the server also makes (required columns, one column per field),
// and where each of the server's refusals (the import contract's codes) is shown.
import { describe, expect, it } from 'vitest';

import {
  checkChoices,
  guessColumns,
  guessTimeFormat,
  guessUnit,
  initialChoices,
  mappingOf,
  placeStartError,
  type ImportChoices,
} from '@/components/imports/importChoices';
import { ApiError, type ImportMapping, type ImportPreview } from '@/components/queries';
import { IMPORT_TIME_FORMAT_WORDS } from '@/ingest/words';

const preview = (columns: string[], rows: string[][]): ImportPreview => ({
  delimiter: ',',
  columns,
  rows,
  lineCount: rows.length + 1,
});

const CHOSEN: ImportChoices = {
  timeColumn: 'Timestamp',
  airColumn: 'Temp °C',
  rhColumn: 'RH %',
  surfaceColumn: null,
  temperatureUnit: 'C',
  timeFormat: 'iso',
  timeZone: 'America/Chicago',
  remember: true,
};

describe('guessing from the header', () => {
  it.each([
    // Headers of the kind stand-alone loggers write (invented here, our own shop's files).
    [
      ['Timestamp', 'Temp °C', 'RH %'],
      { timeColumn: 'Timestamp', airColumn: 'Temp °C', rhColumn: 'RH %', surfaceColumn: null },
    ],
    [
      ['No.', 'Date Time', 'Temperature (F)', 'Humidity', 'Dew point'],
      {
        timeColumn: 'Date Time',
        airColumn: 'Temperature (F)',
        rhColumn: 'Humidity',
        surfaceColumn: null,
      },
    ],
    [
      ['time', 'air_c', 'rh', 'surface_c'],
      { timeColumn: 'time', airColumn: 'air_c', rhColumn: 'rh', surfaceColumn: 'surface_c' },
    ],
    [['a', 'b', 'c'], { timeColumn: null, airColumn: null, rhColumn: null, surfaceColumn: null }],
  ])('%j', (columns, expected) => {
    expect(guessColumns(columns)).toEqual(expected);
  });

  it('never takes a dew point column for the air or the RH', () => {
    const guess = guessColumns(['Time', 'Dew point °C', 'Air °C', 'RH']);
    expect(guess.airColumn).toBe('Air °C');
    expect(guess.rhColumn).toBe('RH');
  });

  it.each([
    ['Temperature (F)', 'F'],
    ['Temp °F', 'F'],
    ['Temp °C', 'C'],
    ['air', 'C'],
  ] as const)('reads the unit of %s as °%s', (name, unit) => {
    expect(guessUnit(name)).toBe(unit);
  });
});

describe('guessing the time format', () => {
  // The epoch counts are checked against the ECMAScript Date (ECMA-262 §21.4.1: ms since
  // 1970-01-01T00:00:00Z), not against numbers typed here.
  const moment = Date.UTC(2025, 11, 31, 18, 30);

  it('shows every format’s example as the same moment (the epochs in UTC)', () => {
    expect(Number(IMPORT_TIME_FORMAT_WORDS['epoch-ms'].example)).toBe(moment);
    expect(Number(IMPORT_TIME_FORMAT_WORDS['epoch-s'].example)).toBe(moment / 1000);
    expect(Date.parse(`${IMPORT_TIME_FORMAT_WORDS.iso.example}Z`)).toBe(moment);
    expect(IMPORT_TIME_FORMAT_WORDS['day-first'].example).toBe('31/12/2025 18:30');
    expect(IMPORT_TIME_FORMAT_WORDS['month-first'].example).toBe('12/31/2025 18:30');
  });

  it.each([
    [[String(moment)], 'epoch-ms'],
    [[String(moment / 1000)], 'epoch-s'],
    [['2025-12-31T18:30:00Z'], 'iso'],
    [['2025-12-31 18:30'], 'iso'],
    // 31 cannot be a month: day first.
    [['30/12/2025 18:30', '31/12/2025 18:30'], 'day-first'],
    // 31 in the second place: month first.
    [['12/30/2025 18:30', '12/31/2025 18:30'], 'month-first'],
    [['31.12.2025 18:30'], 'day-first'],
  ] as const)('%j → %s', (times, format) => {
    expect(guessTimeFormat(times, 'Europe/Berlin')).toBe(format);
  });

  it('leaves dates that read both ways to the shop’s region (a rule of thumb)', () => {
    const times = ['03/02/2026 06:10', '03/02/2026 06:20'];
    expect(guessTimeFormat(times, 'America/Chicago')).toBe('month-first');
    expect(guessTimeFormat(times, 'Europe/Berlin')).toBe('day-first');
  });
});

describe('the form’s first state', () => {
  it('takes the sensor’s saved choices when the server suggests them', () => {
    const suggested: ImportMapping = {
      timeColumn: 'b',
      airColumn: 'c',
      rhColumn: 'd',
      surfaceColumn: 'e',
      temperatureUnit: 'F',
      timeFormat: 'month-first',
      timeZone: 'America/Denver',
    };
    expect(initialChoices(preview(['b', 'c', 'd', 'e'], []), suggested, 'UTC')).toEqual({
      ...suggested,
      remember: true,
    });
  });

  it('guesses from the header and rows, in the shop’s zone, remembering by default', () => {
    const choices = initialChoices(
      preview(
        ['Date Time', 'Temperature (F)', 'Humidity'],
        [
          ['11/03/2025 01:30', '41.2', '88'],
          ['11/13/2025 01:40', '41.0', '89'],
        ],
      ),
      null,
      'America/Chicago',
    );
    expect(choices).toEqual({
      timeColumn: 'Date Time',
      airColumn: 'Temperature (F)',
      rhColumn: 'Humidity',
      surfaceColumn: null,
      temperatureUnit: 'F',
      timeFormat: 'month-first',
      timeZone: 'America/Chicago',
      remember: true,
    });
  });
});

describe('checks before sending', () => {
  it('passes a full set of distinct columns and sends it without the remember box', () => {
    expect(checkChoices(CHOSEN)).toEqual({});
    expect(mappingOf(CHOSEN)).toEqual({
      timeColumn: 'Timestamp',
      airColumn: 'Temp °C',
      rhColumn: 'RH %',
      surfaceColumn: null,
      temperatureUnit: 'C',
      timeFormat: 'iso',
      timeZone: 'America/Chicago',
    });
  });

  it('asks for each required column not chosen, beside its field', () => {
    const errors = checkChoices({ ...CHOSEN, airColumn: null, rhColumn: null });
    expect(Object.keys(errors).sort()).toEqual(['airColumn', 'rhColumn']);
    expect(errors.airColumn).toBe('Choose the column that holds the air temperature.');
    expect(mappingOf({ ...CHOSEN, airColumn: null })).toBeNull();
  });

  it('marks both fields that share a column', () => {
    const errors = checkChoices({ ...CHOSEN, surfaceColumn: 'Temp °C' });
    expect(Object.keys(errors).sort()).toEqual(['airColumn', 'surfaceColumn']);
    expect(errors.surfaceColumn).toContain('“Temp °C” is chosen twice');
  });
});

describe('where the server’s refusals are shown', () => {
  const refusal = (
    code: string,
    message: string,
    details: { path: string; message: string }[] = [],
  ) => new ApiError(400, code, message, details);

  it('puts a missing column beside the field that chose it (by detail path)', () => {
    const placed = placeStartError(
      refusal('column_missing', 'The file has no column “RH %”.', [
        { path: 'mapping.rhColumn', message: 'RH %' },
      ]),
      CHOSEN,
    );
    expect(placed).toEqual({ fields: { rhColumn: 'The file has no column “RH %”.' }, form: null });
  });

  it('puts a missing column beside its field when only the message names it', () => {
    const placed = placeStartError(refusal('column_missing', 'No column “Temp °C”.'), CHOSEN);
    expect(placed.fields).toEqual({ airColumn: 'No column “Temp °C”.' });
  });

  it.each(['times_unreadable', 'times_out_of_range'])('puts %s at the time format', (code) => {
    expect(placeStartError(refusal(code, 'Times cannot be read.'), CHOSEN)).toEqual({
      fields: { timeFormat: 'Times cannot be read.' },
      form: null,
    });
  });

  it('puts values out of range at the column they name, else at the unit', () => {
    expect(
      placeStartError(refusal('values_out_of_range', 'RH above 100 % in row 3.'), CHOSEN).fields,
    ).toEqual({ rhColumn: 'RH above 100 % in row 3.' });
    expect(
      placeStartError(refusal('values_out_of_range', 'Temperatures above 85 °C.'), CHOSEN).fields,
    ).toEqual({ temperatureUnit: 'Temperatures above 85 °C.' });
  });

  it('puts invalid_body details at their fields, and an unknown code under the form', () => {
    expect(
      placeStartError(
        refusal('invalid_body', 'Check the choices.', [
          { path: 'mapping.timeZone', message: 'Unknown time zone' },
        ]),
        CHOSEN,
      ),
    ).toEqual({ fields: { timeZone: 'Unknown time zone' }, form: null });
    expect(
      placeStartError(new ApiError(409, 'import_not_pending', 'Already started.'), CHOSEN),
    ).toEqual({
      fields: {},
      form: 'Already started.',
    });
  });
});
