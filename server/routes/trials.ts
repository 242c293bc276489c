/**
 * Protection trials: create a trial with its treatments, add tests, rank the treatments in each
 * test, and read the standings (ingest/trials/standings.ts) as JSON, or the whole trial as a CSV
 * or PDF file (server/trials/trialCsv.ts, trialPdf.ts). Owners and members write, viewers read
 * (server/auth/policy.ts).
 */
import { Router } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import {
  findTest,
  findTrial,
  insertTest,
  insertTrial,
  listTrials,
  ranksOf,
  replaceRanks,
  testsOf,
  treatmentsOf,
} from '@/db/queries/trials';
import { reportShop, reportZones } from '@/db/queries/reports';
import { findUserById } from '@/db/queries/users';
import { findZone } from '@/db/queries/zones';
import { transaction } from '@/db/transaction';
import {
  TRIAL_MAX_TREATMENTS,
  TRIAL_MIN_TREATMENTS,
  TRIAL_TEST_KINDS,
  type Trial,
  type TrialsResponse,
} from '@/ingest/wire';

import { isUuid, shopIdOf, userIdOf } from '../auth/middleware';
import { ApiError } from '../errors';
import { photosOfSubjects } from '../photos';
import { trialConditions } from '../trials/conditions';
import { trialCsv } from '../trials/trialCsv';
import { TRIAL_EXPORT_FORMATS, trialExportFileName, type TrialExport } from '../trials/trialExport';
import { renderTrialPdf } from '../trials/trialPdf';
import { parseInput } from '../validate';
import { toTrial, toTrialSummary, toTrialTest } from '../wire/trials';

import { nameField } from './fields';

const sameName = (a: string, b: string) => a.toLocaleLowerCase() === b.toLocaleLowerCase();

const createTrialBody = z
  .object({
    name: nameField('Name the trial'),
    treatments: z
      .array(nameField('Name each treatment'))
      .min(TRIAL_MIN_TREATMENTS, `Compare at least ${TRIAL_MIN_TREATMENTS} treatments`)
      .max(TRIAL_MAX_TREATMENTS, `Compare at most ${TRIAL_MAX_TREATMENTS} treatments`)
      // Two treatments of one name could not be told apart in the standings.
      .refine(
        (names) => names.every((name, i) => names.findIndex((n) => sameName(n, name)) === i),
        'Give each treatment a different name',
      ),
  })
  .strict();

// Readings are refused before 2000 (the ingest contract), so a test's window starts after it.
const testTime = z.iso
  .datetime({ offset: true, error: 'Give the time in ISO 8601 with its offset' })
  .refine((at) => Date.parse(at) >= Date.UTC(2000, 0, 1), 'Give a time from 2000 on');

const createTestBody = z
  .object({
    name: nameField('Name the test'),
    kind: z.enum(TRIAL_TEST_KINDS, {
      error: `Choose the kind of test: ${TRIAL_TEST_KINDS.join(', ')}`,
    }),
    from: testTime,
    to: testTime,
    zoneId: z.uuid('Give a zone id').optional(),
    notes: z.string().trim().max(2000, 'At most 2000 characters').optional(),
  })
  .strict()
  .refine((b) => Date.parse(b.from) < Date.parse(b.to), {
    message: 'The test must end after it starts',
    path: ['to'],
  });

const ranksBody = z
  .object({
    ranks: z
      .array(
        z
          .object({
            treatmentId: z.uuid('Give a treatment id'),
            // Whole ranks, or halves for a tie entered as a shared rank (1.5 for two firsts).
            rank: z
              .number()
              .min(1, 'Ranks start at 1 (best)')
              .refine((r) => Number.isInteger(r * 2), 'Give a whole rank (or a half for a tie)'),
          })
          .strict(),
      )
      .min(TRIAL_MIN_TREATMENTS, 'Rank every treatment')
      .max(TRIAL_MAX_TREATMENTS, 'Rank every treatment once'),
  })
  .strict();

/** GET …/trials/:trialId answers JSON unless a file is asked for. */
const trialQuery = z.object({ format: z.enum(TRIAL_EXPORT_FORMATS).default('json') }).strict();

const noTrial = () => new ApiError(404, 'not_found', 'No such trial in this shop.');
const noTest = () => new ApiError(404, 'not_found', 'No such test in this trial.');
const badRanks = (message: string) =>
  new ApiError(400, 'invalid_input', 'The request body is not valid.', [
    { path: 'ranks', message },
  ]);

/** Mounted at /shops/:shopId/trials. */
export function trialsRouter(db: Db, now: () => number): Router {
  const router = Router({ mergeParams: true });

  async function trialOf(shopId: string, trialId: string | undefined) {
    const trial = trialId && isUuid(trialId) ? await findTrial(db, shopId, trialId) : null;
    if (!trial) throw noTrial();
    return trial;
  }

  router.get('/', async (_req, res) => {
    const shopId = shopIdOf(res);
    const rows = await listTrials(db, shopId);
    const treatments = await treatmentsOf(
      db,
      shopId,
      rows.map((r) => r.id),
    );
    res.json({
      trials: rows.map((r) => toTrialSummary(r, treatments)),
    } satisfies TrialsResponse);
  });

  router.post('/', async (req, res) => {
    const body = parseInput(createTrialBody, req.body);
    const shopId = shopIdOf(res);
    const trial = await transaction(db, (tx) =>
      insertTrial(tx, shopId, { ...body, createdBy: userIdOf(res) }),
    );
    res.status(201).json(toTrial(trial, trial.treatments, [], []) satisfies Trial);
  });

  router.get('/:trialId', async (req, res) => {
    const shopId = shopIdOf(res);
    const trial = await trialOf(shopId, req.params.trialId);
    const { format } = parseInput(trialQuery, req.query, 'query');
    const treatments = await treatmentsOf(db, shopId, [trial.id]);
    const tests = await testsOf(db, shopId, trial.id);
    const ranks = await ranksOf(
      db,
      shopId,
      tests.map((t) => t.id),
    );
    const nowMs = now();
    const conditions = await trialConditions(db, tests, nowMs);
    const photos = await photosOfSubjects(
      db,
      shopId,
      'trial_test',
      tests.map((t) => t.id),
    );
    const answer = toTrial(trial, treatments, tests, ranks, conditions, photos) satisfies Trial;
    if (format === 'json') return void res.json(answer);

    const shop = await reportShop(db, shopId);
    if (!shop) throw noTrial();
    const user = await findUserById(db, userIdOf(res));
    const zoneNames = new Map((await reportZones(db, shopId)).map((z) => [z.id, z.name]));
    const file: TrialExport = {
      trial: answer,
      shop,
      unit: user?.unitPref ?? 'C',
      zoneNames,
      generatedAt: new Date(nowMs).toISOString(),
    };
    // The name keeps only ASCII letters, digits and hyphens (trialFileName): no escaping needed.
    res.setHeader(
      'Content-Disposition',
      `attachment; filename="${trialExportFileName(file, format)}"`,
    );
    if (format === 'csv') {
      res.type('text/csv; charset=utf-8');
      return void res.send(trialCsv(file));
    }
    const pdf = await renderTrialPdf(file);
    res.type('application/pdf');
    res.send(pdf);
  });

  router.post('/:trialId/tests', async (req, res) => {
    const shopId = shopIdOf(res);
    const trial = await trialOf(shopId, req.params.trialId);
    const body = parseInput(createTestBody, req.body);
    if (body.zoneId && !(await findZone(db, shopId, body.zoneId))) {
      throw new ApiError(400, 'invalid_input', 'The request body is not valid.', [
        { path: 'zoneId', message: 'No such zone in this shop' },
      ]);
    }
    const test = await insertTest(db, shopId, trial.id, {
      name: body.name,
      kind: body.kind,
      from: new Date(body.from),
      to: new Date(body.to),
      zoneId: body.zoneId ?? null,
      sensorId: null,
      notes: body.notes || null,
    });
    res.status(201).json(toTrialTest(test, []));
  });

  router.put('/:trialId/tests/:testId/ranks', async (req, res) => {
    const shopId = shopIdOf(res);
    const trial = await trialOf(shopId, req.params.trialId);
    const testId = req.params.testId;
    const test = isUuid(testId) ? await findTest(db, shopId, trial.id, testId) : null;
    if (!test) throw noTest();
    const body = parseInput(ranksBody, req.body);
    const treatments = await treatmentsOf(db, shopId, [trial.id]);
    const known = new Set(treatments.map((t) => t.id));
    const given = body.ranks.map((r) => r.treatmentId);
    if (given.some((id) => !known.has(id))) throw badRanks('A treatment is not in this trial');
    if (new Set(given).size !== given.length) throw badRanks('Rank each treatment once');
    if (given.length !== known.size) throw badRanks('Rank every treatment of the trial');
    const n = treatments.length;
    if (body.ranks.some((r) => r.rank > n)) {
      throw badRanks(`Ranks go from 1 (best) to ${n} (the number of treatments)`);
    }
    await transaction(db, (tx) => replaceRanks(tx, shopId, test.id, body.ranks));
    const ranks = await ranksOf(db, shopId, [test.id]);
    const photos = await photosOfSubjects(db, shopId, 'trial_test', [test.id]);
    res.json(toTrialTest(test, ranks, undefined, photos.get(test.id)));
  });

  return router;
}
