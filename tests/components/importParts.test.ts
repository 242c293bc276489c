// The import screen's pure parts, rendered to HTML by react-dom/server through react-native-web
// as the web bundle renders them, fed with data shaped as the import contract says: the progress
// bar (a WAI-ARIA 1.2 progressbar: aria-valuenow within aria-valuemin..aria-valuemax, and
// aria-valuetext in words), the column choices (each field's refusal tied to its group by
// aria-describedby), the rejected rows file read back (RFC 4180 quoting), and the live `import`
// message patching the cache without stepping back.
import { QueryClient } from '@tanstack/react-query';
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';

import { ImportChoicesForm, NO_COLUMN } from '@/components/imports/ImportChoicesForm';
import type { ImportChoices } from '@/components/imports/importChoices';
import { ProgressBar } from '@/components/imports/ImportProgress';
import { importShare } from '@/components/imports/importText';
import { parseCsvRecords, readRejectedRows } from '@/components/imports/rejectedRows';
import { RejectedList } from '@/components/imports/RejectedList';
import { applyLiveMessage, parseLiveMessage } from '@/components/live';
import {
  importKeys,
  importPollMs,
  type Import,
  type ImportAnswer,
  type ImportPreview,
  type ImportsResponse,
} from '@/components/queries';
import { formatFileSize, importProgressText } from '@/ingest/words';

const shopId = '4a8f7c2e-1d3b-4e5f-9a6b-7c8d9e0f1a2b';
const sensorId = '7d1e2f3a-0000-4000-8000-00000000000a';

const running = (rowsRead: number, status: Import['status'] = 'running'): Import => ({
  id: '0c0c0c0c-0000-4000-8000-000000000001',
  sensorId,
  fileName: 'tamarack-basement-logger.csv',
  bytes: 412_000,
  status,
  rowsRead,
  rowsStored: status === 'done' ? rowsRead - 3 : 0,
  rowsDuplicate: 0,
  rowsRejected: 3,
  firstAt: '2025-10-01T05:00:00.000Z',
  lastAt: '2025-11-30T05:50:00.000Z',
  error: null,
  createdAt: '2025-12-01T15:00:00.000Z',
  finishedAt: status === 'done' ? '2025-12-01T15:01:00.000Z' : null,
});

const attr = (html: string, name: string) => new RegExp(`\\b${name}="([^"]*)"`).exec(html)?.[1];

describe('progress bar', () => {
  it('is a progressbar of rows read out of the data rows, in words too', () => {
    const html = renderToStaticMarkup(
      createElement(ProgressBar, { rowsRead: 1200, dataRows: 5000, label: 'Importing a.csv' }),
    );
    expect(attr(html, 'role')).toBe('progressbar');
    expect(attr(html, 'aria-valuemin')).toBe('0');
    expect(attr(html, 'aria-valuemax')).toBe('5000');
    expect(attr(html, 'aria-valuenow')).toBe('1200');
    expect(attr(html, 'aria-valuetext')).toBe('1,200 of 5,000 rows read');
    // The fill is the share read: 1200 / 5000 = 24 %.
    expect(html).toMatch(/width:\s*24%/);
  });

  it('has no value without a row count (indeterminate), and says the rows read', () => {
    const html = renderToStaticMarkup(
      createElement(ProgressBar, { rowsRead: 830, dataRows: null, label: 'Importing a.csv' }),
    );
    expect(attr(html, 'aria-valuenow')).toBeUndefined();
    expect(attr(html, 'aria-valuetext')).toBe('830 rows read');
  });

  it.each([
    [0, 100, 0],
    [50, 100, 0.5],
    [150, 100, 1],
    [10, 0, null],
    [10, null, null],
  ])('share of %d rows of %s is %s', (read, rows, share) => {
    expect(importShare(read, rows)).toBe(share);
  });

  it('writes counts with thousands separators and sizes in SI units (kB = 1000 B)', () => {
    expect(importProgressText(1_234_567, null)).toBe('1,234,567 rows read');
    expect(formatFileSize(999)).toBe('999 B');
    expect(formatFileSize(2_400)).toBe('2.4 kB');
    expect(formatFileSize(52_428_800)).toBe('52 MB');
  });
});

describe('column choices', () => {
  const preview: ImportPreview = {
    delimiter: ';',
    columns: ['Datum', 'Temp °C', 'RH %'],
    rows: [['31.12.2025 18:30', '7,5', '81']],
    lineCount: 2,
  };
  const choices: ImportChoices = {
    timeColumn: 'Datum',
    airColumn: 'Temp °C',
    rhColumn: 'RH %',
    surfaceColumn: null,
    temperatureUnit: 'C',
    timeFormat: 'day-first',
    timeZone: 'Europe/Berlin',
    remember: true,
  };
  const render = (errors = {}, formError: string | null = null) =>
    renderToStaticMarkup(
      createElement(ImportChoicesForm, {
        preview,
        choices,
        onChange: () => undefined,
        errors,
        formError,
        sending: false,
        onStart: () => undefined,
        remembered: false,
      }),
    );

  it('offers each column for each field and "None" for the surface, chosen as given', () => {
    const html = render();
    // The option pressed in a field's group, found by the group's test id.
    const chosen = (field: string) =>
      new RegExp(`aria-checked="true" aria-label="([^"]*)"[^>]*data-testid="import-${field}-`).exec(
        html,
      )?.[1];
    expect(chosen('timeColumn')).toBe('Datum');
    expect(chosen('rhColumn')).toBe('RH %');
    expect(chosen('surfaceColumn')).toBe('None');
    expect(html).toContain(`data-testid="import-surfaceColumn-${NO_COLUMN}"`);
    // The file's first time beside the five examples.
    expect(html).toContain('31.12.2025 18:30');
    expect(html.match(/aria-label="[^"]*, for example [^"]*" role="radio"/g)).toHaveLength(5);
    expect(html).toMatch(/aria-checked="true"[^>]*role="checkbox"/);
  });

  it('ties a refusal to the field it concerns', () => {
    const html = render({ rhColumn: 'The file has no column “RH %”.' });
    const id = /<div aria-describedby="([^"]*)"[^>]*data-testid="import-rhColumn"/.exec(html)?.[1];
    expect(id).toBeTruthy();
    expect(html).toMatch(new RegExp(`id="${id}"[^>]*>The file has no column “RH %”.<`));
  });

  it('shows a refusal that names no field under the form, as an alert', () => {
    expect(render({}, 'This import has already started.')).toMatch(
      /role="alert"[^>]*>This import has already started.</,
    );
  });
});

describe('rejected rows', () => {
  // RFC 4180 §2: fields with commas, quotes or line breaks are quoted; a quote inside is doubled.
  const csv =
    'line,reason,row\r\n' +
    '4,The time cannot be read as day first,"32/10/2025 01:00,12.5,80"\r\n' +
    '9,RH is above 100 %,"02/10/2025 02:00,12.1,""104"""\r\n' +
    '12,"The row has 2 cells, 3 are needed","02/10/2025 02:30,11.9"\r\n';

  it('reads each record with its quoted commas and doubled quotes', () => {
    expect(parseCsvRecords('a,"b,c","d""e"\nf,,\n')).toEqual([
      ['a', 'b,c', 'd"e'],
      ['f', '', ''],
    ]);
    expect(readRejectedRows(csv, 10)).toEqual([
      { line: 4, reason: 'The time cannot be read as day first', row: '32/10/2025 01:00,12.5,80' },
      { line: 9, reason: 'RH is above 100 %', row: '02/10/2025 02:00,12.1,"104"' },
      { line: 12, reason: 'The row has 2 cells, 3 are needed', row: '02/10/2025 02:30,11.9' },
    ]);
    expect(readRejectedRows(csv, 2)).toHaveLength(2);
  });

  it('lists the line, reason and row, and says how many more the CSV has', () => {
    const html = renderToStaticMarkup(
      createElement(RejectedList, { rows: readRejectedRows(csv, 2), total: 3 }),
    );
    expect(html.match(/role="listitem"/g)).toHaveLength(2);
    expect(html).toContain('Line 4');
    expect(html).toContain('RH is above 100 %');
    expect(html).toContain('The first 2 of 3; the CSV lists them all.');
  });
});

describe('live import messages', () => {
  const message = (imp: Import) => JSON.stringify({ type: 'import', shopId, import: imp });

  it('parses a contract-shaped message and drops a malformed one', () => {
    expect(parseLiveMessage(message(running(10)))).toEqual({
      type: 'import',
      shopId,
      import: running(10),
    });
    expect(parseLiveMessage(message({ ...running(10), status: 'paused' as never }))).toBeNull();
    expect(parseLiveMessage(message({ ...running(10), rowsRead: -1 }))).toBeNull();
  });

  it('patches the import and the list, never stepping back', () => {
    const client = new QueryClient();
    client.setQueryData<ImportsResponse>(importKeys.list(shopId, sensorId), { imports: [] });
    const one = importKeys.one(shopId, sensorId, running(0).id);
    const apply = (imp: Import) => applyLiveMessage(client, parseLiveMessage(message(imp))!);

    apply(running(500));
    apply(running(1000));
    apply(running(700)); // an older message arriving late
    expect(client.getQueryData<ImportAnswer>(one)?.import.rowsRead).toBe(1000);
    apply(running(1500, 'done'));
    apply(running(1400, 'running')); // a poll answer sent before the end
    expect(client.getQueryData<ImportAnswer>(one)?.import.status).toBe('done');
    const list = client.getQueryData<ImportsResponse>(importKeys.list(shopId, sensorId));
    expect(list?.imports.map((i) => [i.status, i.rowsRead])).toEqual([['done', 1500]]);
  });

  it('polls a moving import often only while the socket is down', () => {
    expect(importPollMs('running', false)).toBe(2_000);
    expect(importPollMs('queued', true)).toBe(15_000);
    expect(importPollMs('done', false)).toBe(false);
    expect(importPollMs('uploaded', false)).toBe(false);
  });
});
