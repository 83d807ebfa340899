import { isUtf8 } from 'node:buffer';
import { Readable } from 'node:stream';
import { parse } from 'csv-parse';
import { breathe } from '../../../lib/breathe';
import { HttpError, badRequest } from '../../../lib/http-error';

// Reading and writing CSV as spreadsheets save it: UTF-8 with or without BOM, comma or semicolon
// separators, quoted cells, CRLF line ends.

/** Cells that a spreadsheet would run as a formula start with one of these. */
const FORMULA_START = /^'*[=+\-@]/;

/** Guards a cell for export: a `'` in front of anything that a spreadsheet would run as a formula. */
export function guardCell(value: string): string {
  return FORMULA_START.test(value) ? `'${value}` : value;
}

/** Undoes {@link guardCell} on import, so an export imports back exactly. */
export function unguardCell(value: string): string {
  return value.startsWith("'") && FORMULA_START.test(value) ? value.slice(1) : value;
}

/** One CSV line (CRLF-terminated), quoting cells that need it. */
export function csvLine(cells: Array<string | number | null | undefined>): string {
  return (
    cells
      .map((c) => {
        const s = guardCell(c == null ? '' : String(c));
        return /[",;\r\n]|^\s|\s$/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
      })
      .join(',') + '\r\n'
  );
}

/** Refuses bytes that are not UTF-8 text: a clear 415 rather than rows of garbage. */
export function assertCsvText(buffer: Buffer): void {
  if (buffer.length === 0) throw badRequest('The file is empty.');
  if (buffer.includes(0)) throw new HttpError(415, 'unsupported_media_type', 'The file is not a CSV text file (it contains binary data). Save the sheet as CSV and upload that.');
  if (!isUtf8(buffer)) throw new HttpError(415, 'unsupported_media_type', 'The file is not UTF-8 text. Save the sheet as "CSV UTF-8" and upload it again.');
}

/** `;` when the header line has more semicolons than commas (outside quotes), else `,`. */
export function detectDelimiter(buffer: Buffer): ',' | ';' {
  const end = buffer.indexOf(0x0a);
  const header = buffer.subarray(0, end === -1 ? Math.min(buffer.length, 64 * 1024) : end).toString('utf8');
  let commas = 0;
  let semicolons = 0;
  let quoted = false;
  for (const ch of header) {
    if (ch === '"') quoted = !quoted;
    else if (!quoted && ch === ',') commas++;
    else if (!quoted && ch === ';') semicolons++;
  }
  return semicolons > commas ? ';' : ',';
}

export interface CsvRecord {
  /** Row number as a spreadsheet shows it: the header is row 1. */
  row: number;
  /** Cells by lower-case column name, trimmed and un-guarded. */
  cells: Map<string, string>;
}

/**
 * Rows read between pauses for other requests: parsing and checking a 100,000-row file takes
 * seconds, and the stream and its reader only queue microtasks, which starve the event loop.
 */
export const ROWS_PER_BREATH = 1000;

export type CsvEvent = { type: 'record'; record: CsvRecord } | { type: 'error'; row: number; message: string };

/**
 * Streams a CSV buffer as records keyed by header names. Checks the header against `known`
 * columns and `required` ones first (400 naming the column). A row with the wrong number of cells,
 * or a quoting error (which ends the file), comes out as an error event.
 */
export async function* readCsv(buffer: Buffer, columns: { known: readonly string[]; required: readonly string[] }): AsyncGenerator<CsvEvent> {
  assertCsvText(buffer);
  const parser = parse({ delimiter: detectDelimiter(buffer), bom: true, relax_column_count: true, skip_empty_lines: false });
  // Fed in slices with backpressure, so parsed records never pile up ahead of the reader.
  Readable.from(slices(buffer, 64 * 1024)).pipe(parser);
  let header: string[] | null = null;
  let row = 0;
  try {
    // Rows are counted as a spreadsheet shows them (a cell spanning lines is still one row).
    for await (const record of parser as AsyncIterable<string[]>) {
      row++;
      if (row % ROWS_PER_BREATH === 0) await breathe();
      if (!header) {
        header = record.map((h) => unguardCell(h.trim()).toLowerCase());
        checkHeader(header, columns);
        continue;
      }
      if (record.every((c) => c.trim() === '')) continue;
      if (record.length !== header.length) {
        yield { type: 'error', row: row, message: `This row has ${record.length} cells; the header has ${header.length}.` };
        continue;
      }
      const cells = new Map<string, string>();
      header.forEach((name, i) => cells.set(name, unguardCell((record[i] ?? '').trim())));
      yield { type: 'record', record: { row: row, cells } };
    }
  } catch (err) {
    if (err instanceof HttpError) throw err;
    const message = err instanceof Error ? err.message : String(err);
    // The parser may have read ahead of the records handed out; its own count says where it stopped.
    const parsed = (err as { records?: unknown }).records;
    const at = typeof parsed === 'number' ? parsed + 1 : row + 1;
    yield { type: 'error', row: at, message: `The file cannot be read from row ${at} on: ${plainCsvError(message)}` };
    return;
  }
  if (!header) throw badRequest('The file has no header row.');
}

function* slices(buffer: Buffer, size: number): Generator<Buffer> {
  for (let i = 0; i < buffer.length; i += size) yield buffer.subarray(i, i + size);
}

function plainCsvError(message: string): string {
  if (/quote/i.test(message)) return 'a quoted cell is not closed, or a quote sits in the middle of an unquoted cell.';
  return message;
}

function checkHeader(header: string[], columns: { known: readonly string[]; required: readonly string[] }): void {
  const seen = new Set<string>();
  for (const name of header) {
    if (!columns.known.includes(name)) throw badRequest(`Unknown column "${name}". The columns are: ${columns.known.join(', ')}.`, [{ column: name }]);
    if (seen.has(name)) throw badRequest(`The column "${name}" appears twice.`, [{ column: name }]);
    seen.add(name);
  }
  const missing = columns.required.filter((c) => !seen.has(c));
  if (missing.length) throw badRequest(`The file has no "${missing[0]}" column${missing.length > 1 ? ` (also missing: ${missing.slice(1).join(', ')})` : ''}.`, missing.map((column) => ({ column })));
}
