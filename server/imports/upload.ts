/**
 * Receiving a logger file: multer writes it to a temporary file (up to 50 MB, never whole in
 * memory), the checks read only its head (empty, binary, delimiter, header) and, on a stream,
 * count its lines and look for NUL bytes; only a file that passes is put in object storage.
 * The temporary file is removed whatever happens.
 */
import { createReadStream } from 'node:fs';
import fs from 'node:fs/promises';
import os from 'node:os';

import type { Request, Response } from 'express';
import multer from 'multer';
import Papa from 'papaparse';

import { detectDelimiter, isHeaderLine } from '@/ingest/importRows';
import { IMPORT_ERRORS } from '@/ingest/words/importReasons';

import { ApiError } from '../errors';

/** 50 MB: months of one-minute readings from a logger (~40 bytes a line) fit many times over. */
export const IMPORT_MAX_BYTES = 50 * 1024 * 1024;
export const IMPORT_FILE_FIELD = 'file';
/** Data rows in the preview and in the sample the start checks read. */
export const PREVIEW_ROWS = 20;
// Enough for a header and 20 lines of any logger we know (lines run 20–200 bytes).
const HEAD_BYTES = 64 * 1024;

const upload = multer({
  storage: multer.diskStorage({ destination: os.tmpdir() }),
  limits: { fileSize: IMPORT_MAX_BYTES, files: 1, fields: 2, fieldSize: 200, parts: 3 },
}).single(IMPORT_FILE_FIELD);

function fromMulter(err: unknown): ApiError {
  if (err instanceof multer.MulterError) {
    if (err.code === 'LIMIT_FILE_SIZE') {
      return new ApiError(
        413,
        'file_too_large',
        IMPORT_ERRORS.file_too_large(IMPORT_MAX_BYTES / 1024 / 1024),
      );
    }
    return new ApiError(400, 'file_missing', IMPORT_ERRORS.file_missing, [
      { path: err.field ?? IMPORT_FILE_FIELD, message: err.message },
    ]);
  }
  return new ApiError(400, 'invalid_multipart', 'The multipart body could not be read.');
}

export interface ReceivedFile {
  path: string;
  bytes: number;
  fileName: string;
}

/** Runs multer; resolves with the temporary file, or null when no file was sent. */
export function receiveImportFile(req: Request, res: Response): Promise<ReceivedFile | null> {
  return new Promise((resolve, reject) => {
    upload(req, res, (err: unknown) => {
      if (err) {
        // multer removes a partial file itself on its own errors.
        return reject(fromMulter(err));
      }
      const file = req.file;
      resolve(file ? { path: file.path, bytes: file.size, fileName: file.originalname } : null);
    });
  });
}

export interface FilePreview {
  delimiter: string;
  columns: string[];
  rows: string[][];
  lineCount: number;
}

const refuse = (code: keyof typeof IMPORT_ERRORS, message: string) =>
  new ApiError(400, code, message);

async function readHead(path: string): Promise<Buffer> {
  const handle = await fs.open(path, 'r');
  try {
    const buffer = Buffer.alloc(HEAD_BYTES);
    const { bytesRead } = await handle.read(buffer, 0, HEAD_BYTES, 0);
    return buffer.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
}

/** Lines (a last line without its newline counts) and whether any byte is NUL, in one pass. */
async function scan(path: string): Promise<{ lines: number; nul: boolean }> {
  let lines = 0;
  let last = 0x0a;
  let nul = false;
  for await (const chunk of createReadStream(path, {
    highWaterMark: 1 << 20,
  }) as AsyncIterable<Buffer>) {
    if (!nul && chunk.includes(0)) nul = true;
    let at = chunk.indexOf(0x0a);
    while (at !== -1) {
      lines++;
      at = chunk.indexOf(0x0a, at + 1);
    }
    last = chunk[chunk.length - 1]!;
  }
  if (last !== 0x0a) lines++;
  return { lines, nul };
}

/**
 * The file's checks, in the contract's order, and its preview. `lineCount` is the file's lines
 * (header included) counted as newlines: a quoted cell holding a line break counts twice.
 */
export async function checkImportFile(file: ReceivedFile): Promise<FilePreview> {
  if (file.bytes === 0) throw refuse('file_empty', IMPORT_ERRORS.file_empty);
  const head = await readHead(file.path);
  // Cut at the last line end inside the head, so a character split by the cut is not "binary".
  const end = head.length < file.bytes ? head.lastIndexOf(0x0a) + 1 : head.length;
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(head.subarray(0, end || head.length));
  } catch {
    throw refuse('file_binary', IMPORT_ERRORS.file_binary);
  }
  if (text.includes('\0')) throw refuse('file_binary', IMPORT_ERRORS.file_binary);
  const { lines: lineCount, nul } = await scan(file.path);
  if (nul) throw refuse('file_binary', IMPORT_ERRORS.file_binary);
  // A byte-order mark is how some spreadsheets start UTF-8; it is not part of the first name.
  text = text.replace(/^\uFEFF/, '');
  const lines = text.split(/\r?\n/).filter((l) => l.trim() !== '');
  if (lines.length === 0) throw refuse('file_empty', IMPORT_ERRORS.file_empty);
  const delimiter = detectDelimiter(lines);
  if (delimiter === null) throw refuse('one_column', IMPORT_ERRORS.one_column);
  const parsed = Papa.parse<string[]>(lines.slice(0, PREVIEW_ROWS + 1).join('\n'), {
    delimiter,
    skipEmptyLines: true,
  });
  const [header = [], ...rows] = parsed.data;
  if (!isHeaderLine(header)) throw refuse('no_header', IMPORT_ERRORS.no_header);
  return { delimiter, columns: header.map((h) => h.trim()), rows, lineCount };
}

export function removeTemporary(file: ReceivedFile | null): Promise<void> {
  return file ? fs.rm(file.path, { force: true }) : Promise.resolve();
}

export const fileStream = (file: ReceivedFile) => createReadStream(file.path);
