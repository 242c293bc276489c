/**
 * A shop's photos. Uploads (multipart, field `photo`) go through one pipeline whatever path
 * names their subject: POST …/surfaces/:surfaceId/care/:entryId/photos, POST
 * …/trials/:trialId/tests/:testId/photos, or the generic POST …/photos with optional
 * `subjectKind` and `subjectId` fields. The subject is checked against this shop before any
 * object is put. GET …/photos/:photoId[/thumb] is the checked proxy that streams from storage to
 * the shop's people only — the bucket is never public and its URLs never leave the server.
 * DELETE …/photos/:photoId: an owner, or the member who added it.
 */
import { pipeline } from 'node:stream/promises';

import { Router, type Request, type Response } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import { deleteShopPhoto, findShopPhoto, subjectInShop } from '@/db/queries/photos';
import { transaction } from '@/db/transaction';
import {
  PHOTO_SUBJECT_KINDS,
  type CreatedPhoto,
  type PhotoSubjectKind,
} from '@/ingest/wire/photos';

import { isUuid, roleOf, shopIdOf, userIdOf } from '../auth/middleware';
import { ApiError } from '../errors';
import { preparePhoto, receivePhoto, storePhoto } from '../photos';
import { StorageUnavailableError, type Storage } from '../storage';
import { parseInput } from '../validate';
import { toPhoto } from '../wire/photos';

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

// The subject paths name it in the path: the form carries the photo alone.
const noFields = z.object({}).strict();

const photoParams = z.object({ photoId: z.uuid() });

const photoNotFound = () => new ApiError(404, 'photo_not_found', 'No such photo in this shop.');

const SUBJECT_NOT_FOUND: Record<PhotoSubjectKind, () => ApiError> = {
  care_entry: () =>
    new ApiError(404, 'care_entry_not_found', 'No such care entry on this surface of this shop.'),
  trial_test: () =>
    new ApiError(404, 'trial_test_not_found', 'No such test in this trial of this shop.'),
};

interface Subject {
  kind: PhotoSubjectKind;
  id: string;
  /** The surface or trial the path names, which the subject must belong to. */
  parentId?: string;
}

const noStorage = () => new StorageUnavailableError(new Error('no photo storage configured'));

/** Mounted at /shops/:shopId. Members add photos; everyone in the shop sees them. */
export function photosRouter(db: Db, storage: Storage | undefined): Router {
  const router = Router({ mergeParams: true });

  /**
   * The one upload pipeline: receive, check the subject, decode and re-encode, store. The
   * subject is checked before the photo is decoded or any object put, so a wrong id costs
   * neither work nor storage.
   */
  async function upload(
    req: Request,
    res: Response,
    subjectOf: (fields: Record<string, unknown>) => Subject | null,
  ) {
    const received = await receivePhoto(req, res);
    if (!received) {
      throw new ApiError(400, 'invalid_input', 'Attach the photo as the "photo" file field.', [
        { path: 'photo', message: 'Required' },
      ]);
    }
    const shopId = shopIdOf(res);
    const subject = subjectOf(received.fields);
    if (subject && !(await subjectInShop(db, shopId, subject))) {
      throw SUBJECT_NOT_FOUND[subject.kind]();
    }
    const photo = await preparePhoto(received.bytes);
    if (!storage) throw noStorage();
    const row = await storePhoto(db, storage, {
      shopId,
      userId: userIdOf(res),
      subject: subject ? { kind: subject.kind, id: subject.id } : null,
      photo,
    });
    res.status(201).json(toPhoto(row) satisfies CreatedPhoto);
  }

  /** A subject named by the path; an id that is not a UUID names nothing (404, as a missing one). */
  const pathSubject =
    (kind: PhotoSubjectKind, parentId: string | undefined, id: string | undefined) =>
    (fields: Record<string, unknown>): Subject => {
      parseInput(noFields, fields);
      if (!parentId || !id || !isUuid(parentId) || !isUuid(id)) throw SUBJECT_NOT_FOUND[kind]();
      return { kind, id, parentId };
    };

  router.post('/photos', (req, res) =>
    upload(req, res, (fields) => {
      const f = parseInput(subjectFields, fields);
      return f.subjectKind ? { kind: f.subjectKind, id: f.subjectId! } : null;
    }),
  );

  router.post('/surfaces/:surfaceId/care/:entryId/photos', (req, res) =>
    upload(req, res, pathSubject('care_entry', req.params.surfaceId, req.params.entryId)),
  );

  router.post('/trials/:trialId/tests/:testId/photos', (req, res) =>
    upload(req, res, pathSubject('trial_test', req.params.trialId, req.params.testId)),
  );

  const send = async (res: Response, photoIdText: unknown, which: 'objectKey' | 'thumbKey') => {
    const parsed = photoParams.safeParse({ photoId: photoIdText });
    // A malformed id names no photo: the same 404 as a missing one.
    if (!parsed.success) throw photoNotFound();
    const row = await findShopPhoto(db, shopIdOf(res), parsed.data.photoId);
    if (!row) throw photoNotFound();
    if (!storage) throw noStorage();
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

  router.get('/photos/:photoId', (req, res) => send(res, req.params.photoId, 'objectKey'));
  router.get('/photos/:photoId/thumb', (req, res) => send(res, req.params.photoId, 'thumbKey'));

  router.delete('/photos/:photoId', async (req, res) => {
    const parsed = photoParams.safeParse({ photoId: req.params.photoId });
    if (!parsed.success) throw photoNotFound();
    const shopId = shopIdOf(res);
    const photo = await findShopPhoto(db, shopId, parsed.data.photoId);
    if (!photo) throw photoNotFound();
    // Members remove their own photos; someone else's is the owner's call.
    if (roleOf(res) !== 'owner' && photo.createdBy !== userIdOf(res)) {
      throw new ApiError(
        403,
        'not_your_photo',
        'Only the person who added this photo or an owner of the shop may delete it.',
      );
    }
    if (!storage) throw noStorage();
    // The row goes only if both objects went: a store that is away answers 503 and the photo
    // stays whole enough to delete again, instead of a row gone and its bytes left behind.
    // (Deleting a key that is already gone succeeds, so the retry finishes the job.)
    await transaction(db, async (tx) => {
      const row = await deleteShopPhoto(tx, shopId, photo.id);
      if (!row) throw photoNotFound();
      await storage.delete(row.objectKey);
      await storage.delete(row.thumbKey);
    });
    res.status(204).end();
  });

  return router;
}
