/**
 * Reading a made PDF back in tests: pdf-parse (Mozilla's pdf.js inside) for its text, pages and
 * info, and a superagent parser that collects a binary body.
 */
import type { Response } from 'superagent';

export interface ParsedPdf {
  /** All pages' text with runs of white space made one space (wrapped lines join up). */
  flat: string;
  pages: { width: number; height: number }[];
  info: Record<string, unknown>;
  total: number;
}

export async function parsePdf(data: Buffer): Promise<ParsedPdf> {
  const { PDFParse } = await import('pdf-parse');
  const parser = new PDFParse({ data: new Uint8Array(data) });
  try {
    const text = await parser.getText();
    const info = await parser.getInfo({ parsePageInfo: true });
    return {
      flat: text.text.replace(/\s+/g, ' '),
      pages: info.pages.map((p) => ({ width: p.width, height: p.height })),
      info: info.info as Record<string, unknown>,
      total: text.total,
    };
  } finally {
    await parser.destroy();
  }
}

/** superagent leaves an application/pdf body unread unless given a parser that collects it. */
export function binary(res: Response, done: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (chunk: Buffer) => chunks.push(chunk));
  res.on('end', () => done(null, Buffer.concat(chunks)));
}
