/**
 * A shop's photos: POST /shops/:shopId/photos (multipart, field `photo`) and the checked proxy
 * GET /shops/:shopId/photos/:photoId[/thumb], which streams from storage to the shop's people
 * only — the bucket is never public and its URLs never leave the server.
 */
import { pipeline } from 'node:stream/promises';

import { Router, type Response } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import { findShopPhoto } from '@/db/queries/photos';
import { PHOTO_SUBJECT_KINDS, type CreatedPhoto } from '@/ingest/wire/photos';

import { shopIdOf, userIdOf } from '../auth/middleware';
import { ApiError } from '../errors';
import { preparePhoto, receivePhoto, storePhoto } from '../photos';
import { StorageUnavailableError, type Storage } from '../storage';
import { parseInput } from '../validate';

const subjectFields = z
  .object({
    subjectKind: z.enum(PHOTO_SUBJECT_KINDS).optional(),
    subjectId: z.uuid().optional(),
  })
  .strict()
  .refine((f) => (f.subjectKind === undefined) === (f.subjectId === undefined), {
    path: ['subjectId'],
    message: 'Give subjectKind and subjectId together, or neither',
  });

const photoParams = z.object({ photoId: z.uuid() });

const photoNotFound = () => new ApiError(404, 'photo_not_found', 'No such photo in this shop.');

function photoUrls(shopId: string, photoId: string) {
  const url = `/api/v1/shops/${shopId}/photos/${photoId}`;
  return { url, thumbUrl: `${url}/thumb` };
}

/** Mounted at /shops/:shopId/photos. Members add photos; everyone in the shop sees them. */
export function photosRouter(db: Db, storage: Storage | undefined): Router {
  const router = Router({ mergeParams: true });

  router.post('/', async (req, res) => {
    const received = await receivePhoto(req, res);
    if (!received) {
      throw new ApiError(400, 'invalid_input', 'Attach the photo as the "photo" file field.', [
        { path: 'photo', message: 'Required' },
      ]);
    }
    const fields = parseInput(subjectFields, received.fields);
    const photo = await preparePhoto(received.bytes);
    if (!storage) throw new StorageUnavailableError(new Error('no photo storage configured'));
    const shopId = shopIdOf(res);
    const row = await storePhoto(db, storage, {
      shopId,
      userId: userIdOf(res),
      subject: fields.subjectKind ? { kind: fields.subjectKind, id: fields.subjectId! } : null,
      photo,
    });
    res.status(201).json({
      id: row.id,
      ...photoUrls(shopId, row.id),
      widthPx: row.widthPx,
      heightPx: row.heightPx,
    } satisfies CreatedPhoto);
  });

  const send = async (res: Response, photoIdText: unknown, which: 'objectKey' | 'thumbKey') => {
    const parsed = photoParams.safeParse({ photoId: photoIdText });
    // A malformed id names no photo: the same 404 as a missing one.
    if (!parsed.success) throw photoNotFound();
    const row = await findShopPhoto(db, shopIdOf(res), parsed.data.photoId);
    if (!row) throw photoNotFound();
    if (!storage) throw new StorageUnavailableError(new Error('no photo storage configured'));
    const object = await storage.get(row[which]);
    // The row is written only after its objects: a missing object is the store's fault.
    if (!object) throw new StorageUnavailableError(new Error(`object ${row[which]} missing`));
    res.status(200);
    res.type('image/jpeg');
    if (object.bytes !== undefined) res.setHeader('Content-Length', String(object.bytes));
    // Only the shop's people may see it: no shared cache may keep a copy. The id never names
    // other bytes, so the browser may keep its own for a day.
    res.setHeader('Cache-Control', 'private, max-age=86400');
    await pipeline(object.body, res);
  };

  router.get('/:photoId', (req, res) => send(res, req.params.photoId, 'objectKey'));
  router.get('/:photoId/thumb', (req, res) => send(res, req.params.photoId, 'thumbKey'));

  return router;
}
