/**
 * The rejected rows file (GET …/imports/:id/rejected.csv, header `line,reason,row`) read back for
 * the list under an import's summary. Fields follow RFC 4180: a quoted field may hold commas,
 * doubled quotes and line breaks — the `row` column is the logger's own line, so it often does.
 */

export interface RejectedRow {
  /** The line of the logger's file, 1 being its header. */
  line: number;
  reason: string;
  /** The line as the file had it. */
  row: string;
}

/** Splits CSV text into records of fields (RFC 4180; CRLF or LF). */
export function parseCsvRecords(text: string): string[][] {
  const records: string[][] = [];
  let record: string[] = [];
  let field = '';
  let quoted = false;
  let i = 0;
  const endField = () => {
    record.push(field);
    field = '';
  };
  const endRecord = () => {
    endField();
    records.push(record);
    record = [];
  };
  while (i < text.length) {
    const c = text[i]!;
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        field += '"';
        i += 2;
        continue;
      }
      if (c === '"') quoted = false;
      else field += c;
      i += 1;
      continue;
    }
    if (c === '"' && field === '') quoted = true;
    else if (c === ',') endField();
    else if (c === '\n') endRecord();
    else if (c === '\r' && text[i + 1] === '\n') {
      endRecord();
      i += 1;
    } else field += c;
    i += 1;
  }
  if (field !== '' || record.length > 0) endRecord();
  return records;
}

/** The first `limit` rejected rows of the file; a header or a malformed record is skipped. */
export function readRejectedRows(text: string, limit: number): RejectedRow[] {
  const rows: RejectedRow[] = [];
  for (const record of parseCsvRecords(text)) {
    if (rows.length >= limit) break;
    const [line, reason, row] = record;
    const lineNumber = Number(line);
    if (reason === undefined || !Number.isInteger(lineNumber) || lineNumber < 1) continue;
    rows.push({ line: lineNumber, reason, row: row ?? '' });
  }
  return rows;
}
