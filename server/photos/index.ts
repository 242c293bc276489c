/**
 * The photo pipeline: receive one multipart file in memory (size-capped), decide its type from
 * its bytes (never from its name or the client's Content-Type), re-encode it with sharp (which
 * drops EXIF, GPS included, and bakes in the orientation), make a thumbnail, store both objects
 * and only then record the row. A failed store leaves nothing behind.
 */
import { randomUUID } from 'node:crypto';

import type { Request, Response } from 'express';
import { fileTypeFromBuffer } from 'file-type';
import multer from 'multer';
import type Sharp from 'sharp';

import type { Db } from '@/db';
import { insertPhoto, subjectPhotos, type PhotoRow } from '@/db/queries/photos';
import type { Photo, PhotoSubjectKind } from '@/ingest/wire/photos';

import { ApiError } from '../errors';
import type { Storage } from '../storage';
import { photosBySubject } from '../wire/photos';

/** Phone cameras write 3–8 MB JPEGs; 10 MiB leaves room without inviting huge uploads. */
export const PHOTO_MAX_BYTES = 10 * 1024 * 1024;
/** Longest side kept: enough to read a rust spot on a table saw top, not a print master. */
export const PHOTO_LONG_SIDE_PX = 2048;
export const THUMB_LONG_SIDE_PX = 320;
// sharp's own default (268 Mpx) would let a small, highly compressed file unpack into gigabytes.
const MAX_INPUT_PIXELS = 50_000_000;

/**
 * sharp (libvips, ~27 MB resident once loaded) is loaded on the first photo, not at start: most
 * minutes of a server's life have no upload (README, issue 13's memory row). HEIC only where
 * this sharp build decodes it: the prebuilt libvips reads HEIF with AV1 inside (.avif) but not
 * HEVC, which is what phones write. (Phone browsers mostly hand a JPEG to an upload field anyway.)
 */
let codec: Promise<PhotoCodec> | undefined;
interface PhotoCodec {
  sharp: typeof Sharp;
  /** Types accepted, as file-type names them. */
  acceptedMime: Set<string>;
  acceptedNames: string;
}
export const loadPhotoCodec = (): Promise<PhotoCodec> =>
  (codec ??= import('sharp').then(({ default: sharp }) => {
    const heic = sharp.format.heif.input.fileSuffix?.includes('.heic') ?? false;
    return {
      sharp,
      acceptedMime: new Set([
        'image/jpeg',
        'image/png',
        'image/webp',
        ...(heic ? ['image/heic'] : []),
      ]),
      acceptedNames: heic ? 'JPEG, PNG, WebP or HEIC' : 'JPEG, PNG or WebP',
    };
  }));

export const PHOTO_FIELD = 'photo';

const upload = multer({
  storage: multer.memoryStorage(),
  limits: {
    fileSize: PHOTO_MAX_BYTES,
    files: 1,
    fields: 4,
    fieldSize: 200,
    parts: 5,
  },
}).single(PHOTO_FIELD);

function fromMulter(err: unknown): ApiError {
  if (err instanceof multer.MulterError) {
    if (err.code === 'LIMIT_FILE_SIZE') {
      return new ApiError(
        413,
        'photo_too_large',
        `The photo is larger than ${PHOTO_MAX_BYTES / 1024 / 1024} MiB; send a smaller one.`,
      );
    }
    return new ApiError(
      400,
      'invalid_input',
      `Send one file in the "${PHOTO_FIELD}" field and at most the subject fields.`,
      [{ path: err.field ?? PHOTO_FIELD, message: err.message }],
    );
  }
  // busboy's parse errors (a cut-off or malformed multipart body) are the client's.
  return new ApiError(400, 'invalid_multipart', 'The multipart body could not be read.');
}

/** Runs multer for one request; resolves with the file, or null when none was sent. */
export function receivePhoto(
  req: Request,
  res: Response,
): Promise<{ bytes: Buffer; fields: Record<string, unknown> } | null> {
  return new Promise((resolve, reject) => {
    upload(req, res, (err: unknown) => {
      if (err) return reject(fromMulter(err));
      const file = req.file;
      const fields = (req.body ?? {}) as Record<string, unknown>;
      resolve(file ? { bytes: file.buffer, fields } : null);
    });
  });
}

export interface PreparedPhoto {
  full: { bytes: Buffer; widthPx: number; heightPx: number };
  thumb: { bytes: Buffer; widthPx: number; heightPx: number };
}

const unsupported = (acceptedNames: string) =>
  new ApiError(
    415,
    'unsupported_media_type',
    `Send a ${acceptedNames} photo; the file is not one (its name does not count).`,
  );

// At most this many photos decode at once on one server: each decode holds its full-size
// pixels (12 Mpx × 3 bytes ≈ 36 MB for a phone photo), and more at once than cores only adds
// memory, not speed. The rest wait their turn in order.
const MAX_PARALLEL_DECODES = 2;
let decoding = 0;
const waiting: (() => void)[] = [];

async function inTurn<T>(work: () => Promise<T>): Promise<T> {
  if (decoding >= MAX_PARALLEL_DECODES) {
    await new Promise<void>((resolve) => waiting.push(resolve));
  } else {
    decoding += 1;
  }
  try {
    return await work();
  } finally {
    // Hand the slot straight to the next in line, or give it back.
    const next = waiting.shift();
    if (next) next();
    else decoding -= 1;
  }
}

/** Sniff, decode and re-encode; the output carries no metadata (sharp's default). */
export function preparePhoto(input: Buffer): Promise<PreparedPhoto> {
  return inTurn(() => decodeAndEncode(input));
}

async function decodeAndEncode(input: Buffer): Promise<PreparedPhoto> {
  const { sharp, acceptedMime, acceptedNames } = await loadPhotoCodec();
  const type = await fileTypeFromBuffer(input);
  if (!type || !acceptedMime.has(type.mime)) throw unsupported(acceptedNames);
  const encode = async (longSidePx: number, quality: number) => {
    const { data, info } = await sharp(input, { limitInputPixels: MAX_INPUT_PIXELS })
      // Orientation lives in EXIF, which is dropped below: apply it to the pixels first.
      .rotate()
      .resize({
        width: longSidePx,
        height: longSidePx,
        fit: 'inside',
        withoutEnlargement: true,
      })
      .jpeg({ quality })
      .toBuffer({ resolveWithObject: true });
    return { bytes: data, widthPx: info.width, heightPx: info.height };
  };
  try {
    const full = await encode(PHOTO_LONG_SIDE_PX, 85);
    const thumb = await encode(THUMB_LONG_SIDE_PX, 75);
    return { full, thumb };
  } catch {
    // The right magic bytes but no image sharp can decode (truncated, corrupt, too many
    // pixels): still not something we can store.
    throw new ApiError(
      415,
      'unsupported_media_type',
      `The photo could not be read as an image; send a ${acceptedNames}.`,
    );
  }
}

export function photoKeys(shopId: string, photoId: string) {
  const base = `shops/${shopId}/photos/${photoId}`;
  return { objectKey: `${base}.jpg`, thumbKey: `${base}-thumb.jpg` };
}

export interface StorePhotoInput {
  shopId: string;
  userId: string;
  subject: { kind: string; id: string } | null;
  photo: PreparedPhoto;
}

/**
 * Objects first, then the row: a row never names a missing object. If either put or the insert
 * fails, what was put is deleted (best effort: a store that is down for the delete too leaves an
 * object no row names, which nobody can reach through the API).
 */
export async function storePhoto(
  db: Db,
  storage: Storage,
  input: StorePhotoInput,
): Promise<PhotoRow> {
  const id = randomUUID();
  const keys = photoKeys(input.shopId, id);
  try {
    await storage.put(keys.objectKey, input.photo.full.bytes, 'image/jpeg');
    await storage.put(keys.thumbKey, input.photo.thumb.bytes, 'image/jpeg');
    return await insertPhoto(db, {
      id,
      shopId: input.shopId,
      ownerKind: input.subject?.kind ?? null,
      ownerId: input.subject?.id ?? null,
      ...keys,
      widthPx: input.photo.full.widthPx,
      heightPx: input.photo.full.heightPx,
      thumbWidthPx: input.photo.thumb.widthPx,
      thumbHeightPx: input.photo.thumb.heightPx,
      bytes: input.photo.full.bytes.length,
      thumbBytes: input.photo.thumb.bytes.length,
      createdBy: input.userId,
    });
  } catch (err) {
    // Both keys, not only those whose put returned: a put can land and still time out.
    await Promise.allSettled([keys.objectKey, keys.thumbKey].map((k) => storage.delete(k)));
    throw err;
  }
}

/**
 * Removes objects a few at a time, best effort: they are already unreachable (their rows are
 * gone), so a store that is down leaves them behind rather than failing the caller.
 */
export async function deleteObjects(storage: Storage, keys: readonly string[]): Promise<number> {
  let failed = 0;
  for (let i = 0; i < keys.length; i += 8) {
    const results = await Promise.allSettled(keys.slice(i, i + 8).map((k) => storage.delete(k)));
    failed += results.filter((r) => r.status === 'rejected').length;
  }
  return failed;
}

/**
 * The photos of many subjects of one kind (a surface's care entries, a trial's tests) by subject
 * id, oldest first: one query for the whole list, never one per entry.
 */
export async function photosOfSubjects(
  db: Db,
  shopId: string,
  kind: PhotoSubjectKind,
  subjectIds: readonly string[],
): Promise<Map<string, Photo[]>> {
  return photosBySubject(await subjectPhotos(db, shopId, kind, subjectIds));
}
