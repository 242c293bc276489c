/** A shop's week report: GET /shops/:shopId/reports/week as JSON, CSV or PDF. */
import { Router } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import { reportShop } from '@/db/queries/reports';
import { findUserById } from '@/db/queries/users';
import { isCalendarDate, isMonday, lastCompleteWeekStart, weekStartOf } from '@/ingest/reportWeek';
import { REPORT_FORMATS, type WeekReport } from '@/ingest/wire/reports';

import { shopIdOf, userIdOf } from '../auth/middleware';
import { ApiError } from '../errors';
import { weekReportCsv } from '../reports/csv';
import { renderWeekReportPdf } from '../reports/pdf';
import { buildWeekReport, weekReportSeries } from '../reports/weekReport';
import { parseInput } from '../validate';

const weekQuery = z
  .object({
    start: z
      .string()
      .refine(isCalendarDate, 'Give the date as YYYY-MM-DD (a real date)')
      .refine(isMonday, 'A week starts on a Monday: give that Monday')
      // Readings are refused before 2000 (the ingest contract), so no earlier week has any.
      .refine((d) => d >= '2000-01-03', 'Give a week from 2000 on (the first Monday: 2000-01-03)')
      .optional(),
    format: z.enum(REPORT_FORMATS).default('json'),
  })
  .strict();

/** Mounted at /shops/:shopId/reports. Owners, members and viewers read (server/auth/policy.ts). */
export function reportsRouter(db: Db, now: () => number): Router {
  const router = Router({ mergeParams: true });

  router.get('/week', async (req, res) => {
    const q = parseInput(weekQuery, req.query, 'query');
    const shopId = shopIdOf(res);
    const shop = await reportShop(db, shopId);
    if (!shop) throw new ApiError(404, 'shop_not_found', 'No such shop.');
    const nowMs = now();
    const start = q.start ?? lastCompleteWeekStart(nowMs, shop.timeZone);
    if (start > weekStartOf(nowMs, shop.timeZone)) {
      throw new ApiError(400, 'invalid_input', 'That week has not begun yet.', [
        { path: 'start', message: 'After the current week' },
      ]);
    }
    const user = await findUserById(db, userIdOf(res));
    const report = await buildWeekReport(db, {
      shopId,
      start,
      unit: user?.unitPref ?? 'C',
      now: new Date(nowMs),
    });
    if (!report) throw new ApiError(404, 'shop_not_found', 'No such shop.');

    // `start` is a checked date, so the name needs no escaping; quoted as the contract shows it.
    const disposition = `attachment; filename="drybench-week-${start}.${q.format}"`;
    if (q.format === 'csv') {
      res.type('text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', disposition);
      return void res.send(weekReportCsv(report));
    }
    if (q.format === 'pdf') {
      const series = await weekReportSeries(db, report);
      const pdf = await renderWeekReportPdf({ report, series });
      res.type('application/pdf');
      res.setHeader('Content-Disposition', disposition);
      return void res.send(pdf);
    }
    res.json(report satisfies WeekReport);
  });

  return router;
}
