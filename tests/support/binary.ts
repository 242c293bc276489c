// supertest buffers only text types by itself: this parser collects a binary answer (a photo, a
// PDF) whole, for `.buffer(true).parse(binaryBody)`.
import type { Response } from 'supertest';

export function binaryBody(res: Response, done: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => done(null, Buffer.concat(chunks)));
}
