/**
 * A shop's surfaces and their care log: list and add surfaces, log a coat or an inspection,
 * read a surface's exposure since its last coat, and the shop's coating budgets. Owners and
 * members write, viewers read (server/auth/policy.ts).
 */
import { Router } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import {
  findSurface,
  insertCareEntry,
  insertSurface,
  listCareEntries,
  listCoatingBudgets,
  listSurfaces,
  sensorZone,
  upsertCoatingBudgets,
  zoneInShop,
} from '@/db/queries/surfaces';
import {
  CARE_KINDS,
  COATING_TYPES,
  type CoatingBudgetsResponse,
  type SurfaceDetail,
  type SurfacesResponse,
} from '@/ingest/wire/surfaces';

import { isUuid, shopIdOf, userIdOf } from '../auth/middleware';
import { surfaceExposure } from '../care/exposure';
import { ApiError } from '../errors';
import { photosOfSubjects } from '../photos';
import { parseInput } from '../validate';
import { toCareEntry, toCoatingBudgets, toSurface } from '../wire/surfaces';

import { nameField } from './fields';

const uuidField = (message: string) => z.string().refine(isUuid, message);

const createSurfaceBody = z
  .object({
    name: nameField('Name the surface'),
    zoneId: uuidField('Pick the zone the surface is in'),
    material: nameField('Name the material, or leave it out').optional(),
    sensorId: uuidField('Pick the probe on this surface, or leave it out').optional(),
  })
  .strict();

// Readings are refused before 2000 and more than 5 minutes ahead (the ingest contract); a coat
// logged outside those bounds would be a typo that hides or invents exposure.
const FUTURE_SLACK_MS = 5 * 60 * 1000;
const EARLIEST_MS = Date.UTC(2000, 0, 1);

function careBody(nowMs: number) {
  return z
    .object({
      kind: z.enum(CARE_KINDS, { error: `Choose ${CARE_KINDS.join(' or ')}` }),
      at: z.iso
        .datetime({ offset: true, error: 'Give the time as ISO 8601 with Z or an offset' })
        .refine((at) => Date.parse(at) >= EARLIEST_MS, 'Give a time from 2000 on')
        .refine((at) => Date.parse(at) <= nowMs + FUTURE_SLACK_MS, 'That time is in the future'),
      coating: z
        .object({
          type: z.enum(COATING_TYPES, { error: `Choose ${COATING_TYPES.join(', ')}` }),
          product: nameField('Name the product, or leave it out').optional(),
        })
        .strict()
        .optional(),
      rusting: z
        .number({ error: 'Give the degree of rusting as a whole number, Ri 0 to 5' })
        .int('Give the degree of rusting as a whole number, Ri 0 to 5')
        .min(0, 'Ri 0 is the least rusting')
        .max(5, 'Ri 5 is the most rusting')
        .optional(),
      note: z.string().trim().min(1, 'Write a note, or leave it out').max(2000).optional(),
    })
    .strict()
    .superRefine((body, ctx) => {
      if (body.kind === 'coating' && !body.coating) {
        ctx.addIssue({ code: 'custom', path: ['coating'], message: 'Say which coat was put on' });
      }
      if (body.kind === 'inspection' && body.coating) {
        ctx.addIssue({
          code: 'custom',
          path: ['coating'],
          message: 'An inspection puts no coat on; log the coat as its own entry',
        });
      }
    });
}

const budgetHours = (what: string) =>
  z
    .number({ error: `Give ${what} in hours` })
    .min(0, 'At least 0 h')
    // A year: beyond it a budget is a typo, not a coat.
    .max(8760, 'At most 8760 h (a year)');

const budgetsBody = z
  .object({
    budgets: z
      .array(
        z
          .object({
            coating: z.enum(COATING_TYPES, { error: `Choose ${COATING_TYPES.join(', ')}` }),
            hoursWet: budgetHours('the wet budget'),
            hoursClose: budgetHours('the close budget'),
            towHours: budgetHours('the time-of-wetness budget'),
          })
          .strict(),
      )
      .min(1, 'Send at least one budget')
      .max(COATING_TYPES.length)
      .refine(
        (rows) => new Set(rows.map((r) => r.coating)).size === rows.length,
        'Each coating type once',
      ),
  })
  .strict();

const noSurface = () => new ApiError(404, 'not_found', 'No such surface in this shop.');

/** Mounted at /shops/:shopId. */
export function surfacesRouter(db: Db, now: () => number): Router {
  const router = Router({ mergeParams: true });

  async function surfaceOf(shopId: string, surfaceId: string | undefined) {
    const surface =
      surfaceId && isUuid(surfaceId) ? await findSurface(db, shopId, surfaceId) : null;
    if (!surface) throw noSurface();
    return surface;
  }

  router.get('/surfaces', async (_req, res) => {
    const rows = await listSurfaces(db, shopIdOf(res));
    res.json({ surfaces: rows.map(toSurface) } satisfies SurfacesResponse);
  });

  router.post('/surfaces', async (req, res) => {
    const body = parseInput(createSurfaceBody, req.body);
    const shopId = shopIdOf(res);
    if (!(await zoneInShop(db, shopId, body.zoneId))) {
      throw new ApiError(400, 'invalid_input', 'The request body is not valid.', [
        { path: 'zoneId', message: 'No such zone in this shop' },
      ]);
    }
    if (body.sensorId) {
      const zoneId = await sensorZone(db, shopId, body.sensorId);
      if (zoneId !== body.zoneId) {
        throw new ApiError(400, 'invalid_input', 'The request body is not valid.', [
          {
            path: 'sensorId',
            message: zoneId ? 'That probe is in another zone' : 'No such sensor in this shop',
          },
        ]);
      }
    }
    const row = await insertSurface(db, {
      shopId,
      zoneId: body.zoneId,
      name: body.name,
      material: body.material ?? null,
      sensorId: body.sensorId ?? null,
    });
    res.status(201).json(toSurface(row));
  });

  router.get('/surfaces/:surfaceId', async (req, res) => {
    const shopId = shopIdOf(res);
    const surface = await surfaceOf(shopId, req.params.surfaceId);
    const care = await listCareEntries(db, shopId, surface.id);
    const photos = await photosOfSubjects(
      db,
      shopId,
      'care_entry',
      care.map((c) => c.id),
    );
    res.json({
      ...toSurface(surface),
      care: care.map((c) => toCareEntry(c, photos.get(c.id))),
    } satisfies SurfaceDetail);
  });

  router.post('/surfaces/:surfaceId/care', async (req, res) => {
    const body = parseInput(careBody(now()), req.body);
    const shopId = shopIdOf(res);
    const surface = await surfaceOf(shopId, req.params.surfaceId);
    const row = await insertCareEntry(db, {
      shopId,
      surfaceId: surface.id,
      kind: body.kind,
      at: new Date(body.at),
      byUserId: userIdOf(res),
      coatingType: body.coating?.type ?? null,
      product: body.coating?.product ?? null,
      rusting: body.rusting ?? null,
      note: body.note ?? null,
    });
    res.status(201).json(toCareEntry(row));
  });

  router.get('/surfaces/:surfaceId/exposure', async (req, res) => {
    const shopId = shopIdOf(res);
    const surface = await surfaceOf(shopId, req.params.surfaceId);
    res.json(await surfaceExposure(db, shopId, surface, now()));
  });

  router.get('/coating-budgets', async (_req, res) => {
    const rows = await listCoatingBudgets(db, shopIdOf(res));
    res.json({ budgets: toCoatingBudgets(rows) } satisfies CoatingBudgetsResponse);
  });

  router.put('/coating-budgets', async (req, res) => {
    const body = parseInput(budgetsBody, req.body);
    const shopId = shopIdOf(res);
    await upsertCoatingBudgets(db, shopId, body.budgets);
    const rows = await listCoatingBudgets(db, shopId);
    res.json({ budgets: toCoatingBudgets(rows) } satisfies CoatingBudgetsResponse);
  });

  return router;
}
