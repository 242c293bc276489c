// pg-copy-streams 7 ships no types; only what server/imports/ and the bench use.
declare module 'pg-copy-streams' {
  import type { Writable } from 'node:stream';

  import type { Submittable } from 'pg';

  /** A COPY … FROM STDIN statement: write the rows, end it, and it settles with the count. */
  export interface CopyStreamQuery extends Writable, Submittable {
    rowCount: number;
  }
  export function from(text: string): CopyStreamQuery;
}
