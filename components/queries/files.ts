/**
 * Files the API makes (a week report's or a trial's CSV and PDF), fetched with the session
 * cookie as bytes with the name the server gave them. A failure becomes an ApiError with the
 * server's sentence, as every other request does.
 */
import { ApiError, NETWORK_ERROR_STATUS, parseErrorBody } from './api';

/** A downloaded file: its bytes and the name the server gave it. */
export interface DownloadedFile {
  blob: Blob;
  /** From Content-Disposition; null when the server named none. */
  filename: string | null;
}

export type FileFormat = 'csv' | 'pdf';

export async function fetchFile(path: string, format: FileFormat): Promise<DownloadedFile> {
  let response: Response;
  try {
    response = await fetch(path, {
      credentials: 'same-origin',
      headers: { Accept: format === 'csv' ? 'text/csv' : 'application/pdf' },
    });
  } catch {
    throw new ApiError(
      NETWORK_ERROR_STATUS,
      'network',
      'Drybench cannot be reached. Check the connection and try again.',
    );
  }
  if (!response.ok) {
    let body: unknown = undefined;
    try {
      body = JSON.parse(await response.text());
    } catch {
      body = undefined;
    }
    throw parseErrorBody(response.status, body);
  }
  return {
    blob: await response.blob(),
    filename: filenameFromDisposition(response.headers.get('Content-Disposition')),
  };
}

/**
 * The file name in a Content-Disposition header (RFC 6266): the UTF-8 `filename*` when given,
 * else the plain `filename`, quoted or not. Any path is cut off, so a name never climbs folders.
 */
export function filenameFromDisposition(header: string | null): string | null {
  if (!header) return null;
  let name: string | null = null;
  const extended = /filename\*\s*=\s*([^']*)'[^']*'([^;]+)/i.exec(header);
  if (extended) {
    try {
      name = decodeURIComponent(extended[2]!.trim().replace(/^"|"$/g, ''));
    } catch {
      name = null;
    }
  }
  if (name === null) {
    const plain = /filename\s*=\s*(?:"((?:[^"\\]|\\.)*)"|([^;]+))/i.exec(header);
    if (plain) name = plain[1] !== undefined ? plain[1].replace(/\\(.)/g, '$1') : plain[2]!.trim();
  }
  const base = name?.split(/[\\/]/).pop()?.trim();
  return base ? base : null;
}
