/**
 * PostgreSQL array literals for array parameters (`$1::float8[]`), built directly. node-postgres
 * turns a JavaScript array into one too, but quotes and escapes every element through two regular
 * expressions; the group writer sends 13 such arrays of up to thousands of rows per statement, and
 * that was a measurable share of the server's CPU per reading. Only for elements that need no
 * quoting inside a literal: numbers, uuids, enum labels and ISO-8601 times (no braces, commas,
 * quotes, backslashes or spaces; none of them spells NULL).
 */

/** `{1.5,NULL,-2}`: String(n) is what node-postgres sends for a number, and float8 reads it. */
export function numberArray(values: readonly (number | null)[]): string {
  let out = '{';
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    out += (i === 0 ? '' : ',') + (v === null || v === undefined ? 'NULL' : String(v));
  }
  return out + '}';
}

/** `{a,NULL,b}` for uuids, enum labels and ISO times, which need no quoting. */
export function plainArray(values: readonly (string | null)[]): string {
  let out = '{';
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    out += (i === 0 ? '' : ',') + (v === null || v === undefined ? 'NULL' : v);
  }
  return out + '}';
}
