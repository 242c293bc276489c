/**
 * A sensor's CSV imports (the contract: shared/API.md "Imports"), mounted at
 * /shops/:shopId/sensors/:sensorId/imports. Upload checks the file and keeps it in storage
 * with a preview; start checks the chosen columns against the file's header and its first rows
 * and queues the job (server/imports/run.ts) in the same transaction; cancel stops it, and
 * nothing of a cancelled import is stored. Members and owners import; everyone in the shop
 * reads.
 */
import { randomUUID } from 'node:crypto';

import { Router, type Response } from 'express';
import Papa from 'papaparse';
import { z } from 'zod';

import type { Db } from '@/db';
import {
  cancelImport,
  findImport,
  findSensorMapping,
  insertImport,
  listImports,
  listRejects,
  queueImport,
  saveSensorMapping,
  type ImportRow,
} from '@/db/queries/imports';
import { LIVE_CHANNEL, notify } from '@/db/notify';
import { findSensor } from '@/db/queries/sensors';
import { transaction } from '@/db/transaction';
import { planColumns, readImportRow } from '@/ingest/importRows';
import { MAX_FUTURE_MS, MIN_TIME_MS } from '@/ingest/payload';
import { checkTimeZone } from '@/ingest/timeZones';
import {
  IMPORT_TIME_FORMATS,
  type ImportAnswer,
  type ImportMapping,
  type ImportsResponse,
  type ImportUploaded,
} from '@/ingest/wire/imports';
import { IMPORT_ERRORS } from '@/ingest/words/importReasons';
import { RH_MAX_PCT, RH_MIN_PCT, TEMPERATURE_MAX_C, TEMPERATURE_MIN_C } from '@/ingest/payload';

import { isUuid, shopIdOf, userIdOf } from '../auth/middleware';
import { ApiError, RetryLaterError, zodDetails } from '../errors';
import {
  checkImportFile,
  fileStream,
  receiveImportFile,
  removeTemporary,
  type ReceivedFile,
} from '../imports/upload';
import type { ImportJobs } from '../jobs/importJob';
import { neutraliseCell } from '../reports/csv';
import { StorageUnavailableError, type Storage } from '../storage';
import { importMessageJson, toImport } from '../wire/imports';

const mappingSchema = z
  .object({
    timeColumn: z.string().min(1).max(200),
    airColumn: z.string().min(1).max(200),
    rhColumn: z.string().min(1).max(200),
    surfaceColumn: z.string().min(1).max(200).nullable(),
    temperatureUnit: z.enum(['C', 'F']),
    timeFormat: z.enum(IMPORT_TIME_FORMATS),
    timeZone: z.string().min(1).max(64),
  })
  .strict()
  .superRefine((m, ctx) => {
    const check = checkTimeZone(m.timeZone);
    if (!check.ok) {
      ctx.addIssue({
        code: 'custom',
        path: ['timeZone'],
        message: check.suggestion
          ? `Not an IANA time zone; did you mean ${check.suggestion}?`
          : 'Not an IANA time zone (e.g. America/Chicago).',
      });
    }
  });

const startSchema = z.object({ mapping: mappingSchema, remember: z.boolean() }).strict();

const importNotFound = () => new ApiError(404, 'import_not_found', IMPORT_ERRORS.import_not_found);
const sensorNotFound = () => new ApiError(404, 'sensor_not_found', IMPORT_ERRORS.sensor_not_found);
const noStorage = () => new StorageUnavailableError(new Error('no storage configured'));

const inRange = (v: number, min: number, max: number) => v >= min && v <= max;

/** The contract's checks of a mapping against the file's header and its first rows. */
function checkMapping(row: ImportRow, mapping: ImportMapping, nowMs: number): void {
  const chosen = [mapping.timeColumn, mapping.airColumn, mapping.rhColumn, mapping.surfaceColumn]
    .filter((c): c is string => c !== null)
    .map((c) => c.trim());
  if (new Set(chosen).size !== chosen.length) {
    throw new ApiError(400, 'columns_repeated', IMPORT_ERRORS.columns_repeated);
  }
  const planned = planColumns(row.columns, mapping, row.delimiter);
  if (!planned.ok) {
    throw new ApiError(400, 'column_missing', IMPORT_ERRORS.column_missing(planned.missing), [
      { path: 'column', message: planned.missing },
    ]);
  }
  const { plan } = planned;
  const sample = row.sampleRows.filter((cells) => cells.length === plan.columnCount);
  const times = sample.map((cells) => plan.readTime(cells[plan.time]!));
  const read = times.filter((t) => t !== null);
  if (sample.length > 0 && read.length === 0) {
    throw new ApiError(
      400,
      'times_unreadable',
      IMPORT_ERRORS.times_unreadable(sample[0]![plan.time]!.slice(0, 40)),
    );
  }
  // A wrong format or zone puts every sample time out of range; one bad line is that line's.
  if (
    read.length > 0 &&
    read.every((t) => t.atMs < MIN_TIME_MS || t.atMs > nowMs + MAX_FUTURE_MS)
  ) {
    throw new ApiError(400, 'times_out_of_range', IMPORT_ERRORS.times_out_of_range);
  }
  const values = sample
    .map((cells) => readImportRow(cells, plan))
    .filter((v) => v.ok)
    .map((v) => v.reading);
  const plausible = (r: (typeof values)[number]) =>
    inRange(r.airC, TEMPERATURE_MIN_C, TEMPERATURE_MAX_C) &&
    inRange(r.rhPct, RH_MIN_PCT, RH_MAX_PCT);
  if (values.length > 0 && !values.some(plausible)) {
    throw new ApiError(
      400,
      'values_out_of_range',
      IMPORT_ERRORS.values_out_of_range(mapping.temperatureUnit),
    );
  }
}

/** Mounted at /shops/:shopId/sensors/:sensorId/imports. */
export function importsRouter(
  db: Db,
  storage: Storage | undefined,
  jobs: ImportJobs | undefined,
  now: () => number,
): Router {
  const router = Router({ mergeParams: true });

  /** The sensor named by the path, of this shop (removed ones are history: no imports). */
  async function sensorOf(res: Response, sensorIdText: unknown): Promise<string> {
    const sensorId = typeof sensorIdText === 'string' ? sensorIdText : '';
    if (!isUuid(sensorId) || !(await findSensor(db, shopIdOf(res), sensorId))) {
      throw sensorNotFound();
    }
    return sensorId;
  }

  async function importOf(res: Response, params: Record<string, string | undefined>) {
    const sensorId = await sensorOf(res, params.sensorId);
    const importId = params.importId ?? '';
    if (!isUuid(importId)) throw importNotFound();
    const row = await findImport(db, shopIdOf(res), sensorId, importId);
    if (!row) throw importNotFound();
    return row;
  }

  router.post('/', async (req, res) => {
    const sensorId = await sensorOf(res, (req.params as Record<string, string>).sensorId);
    let file: ReceivedFile | null = null;
    try {
      file = await receiveImportFile(req, res);
      if (!file) {
        throw new ApiError(400, 'file_missing', IMPORT_ERRORS.file_missing, [
          { path: 'file', message: 'Required' },
        ]);
      }
      const preview = await checkImportFile(file);
      if (!storage) throw noStorage();
      const shopId = shopIdOf(res);
      const id = randomUUID();
      const objectKey = `shops/${shopId}/imports/${id}.csv`;
      await storage.put(objectKey, fileStream(file), 'text/csv', file.bytes);
      let row: ImportRow;
      try {
        row = await insertImport(db, {
          id,
          shopId,
          sensorId,
          fileName: file.fileName.slice(0, 255) || 'logger.csv',
          bytes: file.bytes,
          objectKey,
          delimiter: preview.delimiter,
          columns: preview.columns,
          sampleRows: preview.rows,
          createdBy: userIdOf(res),
        });
      } catch (err) {
        await storage.delete(objectKey).catch(() => {});
        throw err;
      }
      const saved = await findSensorMapping(db, sensorId);
      const suggested =
        saved && planColumns(preview.columns, saved, preview.delimiter).ok ? saved : null;
      res.status(201).json({
        import: toImport(row),
        preview: {
          delimiter: preview.delimiter,
          columns: preview.columns,
          rows: preview.rows,
          lineCount: preview.lineCount,
        },
        suggested,
      } satisfies ImportUploaded);
    } finally {
      await removeTemporary(file);
    }
  });

  router.get('/', async (req, res) => {
    const sensorId = await sensorOf(res, (req.params as Record<string, string>).sensorId);
    const rows = await listImports(db, shopIdOf(res), sensorId);
    res.json({ imports: rows.map(toImport) } satisfies ImportsResponse);
  });

  router.get('/:importId', async (req, res) => {
    const row = await importOf(res, req.params);
    res.json({ import: toImport(row) } satisfies ImportAnswer);
  });

  router.post('/:importId/start', async (req, res) => {
    const parsed = startSchema.safeParse(req.body);
    const row = await importOf(res, req.params);
    if (!parsed.success) {
      throw new ApiError(
        400,
        'invalid_body',
        'The choices are not valid.',
        zodDetails(parsed.error),
      );
    }
    if (row.status !== 'uploaded') {
      throw new ApiError(409, 'import_not_pending', IMPORT_ERRORS.import_not_pending);
    }
    const { mapping, remember } = parsed.data;
    checkMapping(row, mapping, now());
    if (!jobs) {
      throw new RetryLaterError(
        'imports_unavailable',
        'Imports cannot run on this server right now; try again shortly.',
        30,
      );
    }
    const queued = await transaction(db, async (tx) => {
      const updated = await queueImport(tx, row.id, mapping);
      if (!updated) return null;
      if (remember) await saveSensorMapping(tx, row.sensorId, mapping);
      await jobs.queue(tx, row.id);
      await notify(tx, LIVE_CHANNEL, importMessageJson(updated));
      return updated;
    });
    if (!queued) throw new ApiError(409, 'import_not_pending', IMPORT_ERRORS.import_not_pending);
    res.status(202).json({ import: toImport(queued) } satisfies ImportAnswer);
  });

  router.post('/:importId/cancel', async (req, res) => {
    const row = await importOf(res, req.params);
    if (row.status === 'cancelled') {
      res.json({ import: toImport(row) } satisfies ImportAnswer);
      return;
    }
    const cancelled = await transaction(db, async (tx) => {
      const updated = await cancelImport(tx, row.id);
      if (updated) await notify(tx, LIVE_CHANNEL, importMessageJson(updated));
      return updated;
    });
    if (!cancelled) throw new ApiError(409, 'import_finished', IMPORT_ERRORS.import_finished);
    // Never started: no job will come to let go of the file. A queued or running one's job does.
    if (row.status === 'uploaded' && storage) {
      await storage.delete(row.objectKey).catch(() => {});
    }
    res.json({ import: toImport(cancelled) } satisfies ImportAnswer);
  });

  router.get('/:importId/rejected.csv', async (req, res) => {
    const row = await importOf(res, req.params);
    const rejects = await listRejects(db, row.id);
    const csv = Papa.unparse(
      {
        fields: ['line', 'reason', 'row'],
        data: rejects.map((r) => [String(r.line), r.reason, neutraliseCell(r.row)]),
      },
      { newline: '\r\n' },
    );
    res.type('text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="rejected-${row.id}.csv"`);
    res.send(`${csv}\r\n`);
  });

  return router;
}
