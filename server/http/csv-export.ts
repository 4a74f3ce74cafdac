import type { Response } from 'express';

/**
 * The CSV download of a whole list: every row that matches the list's filters, in its sort order,
 * read from the repository a chunk at a time and written as it is read, so a long list never sits
 * in memory and the first rows reach the browser at once.
 *
 * Quoting is RFC 4180 (a cell holding a comma, a quote or a line break is quoted, quotes doubled),
 * lines end in CRLF, and the file starts with a byte-order mark so spreadsheet programs read the
 * units (`m/km`, `km/h`) and accented names as UTF-8.
 */

export type CsvValue = string | number | boolean | null | undefined;

export interface CsvColumn<T> {
  /** The column's name as the table on screen shows it. */
  header: string;
  /** Unit, written after the name: `Length (km)`. */
  unit?: string;
  value: (row: T) => CsvValue;
}

/** Rows per repository query. */
export const CSV_CHUNK_ROWS = 500;

const PLAIN_NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/**
 * One cell. A text starting with `=`, `+`, `-` or `@` (or a tab or carriage return) would run as a
 * formula when the file is opened in a spreadsheet: it gets a leading apostrophe, unless it is a
 * plain number such as `-12.5`.
 */
export function csvCell(value: CsvValue): string {
  if (value === null || value === undefined) return '';
  let s = String(value);
  if (typeof value === 'string' && /^[=+\-@\t\r]/.test(s) && !PLAIN_NUMBER.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function csvLine(cells: CsvValue[]): string {
  return cells.map(csvCell).join(',') + '\r\n';
}

export function csvHeader<T>(columns: CsvColumn<T>[]): string {
  return csvLine(columns.map((c) => (c.unit ? `${c.header} (${c.unit})` : c.header)));
}

/**
 * Streams `list` as `reboundry-<name>-<day>.csv`. `fetch(offset, limit)` returns the list's rows
 * from `offset` with the same filters and sort as the list on screen (its order must be total, so
 * that chunks neither repeat nor skip a row). The first chunk is read before anything is sent, so a
 * failing query still answers with a JSON error; after that a failure cuts the download short
 * (the browser reports it as failed rather than saving half a file as if it were whole).
 * Writing waits while the connection's buffer is full, and stops when the browser goes away.
 */
export async function sendCsv<T>(
  res: Response,
  opts: { name: string; day: string; columns: CsvColumn<T>[]; fetch: (offset: number, limit: number) => Promise<T[]>; chunkRows?: number },
): Promise<void> {
  const chunkRows = opts.chunkRows ?? CSV_CHUNK_ROWS;
  let rows = await opts.fetch(0, chunkRows);

  let closed = false;
  let wake: (() => void) | null = null;
  // One listener each for the whole download (compression hands `drain` listeners to its own stream).
  res.on('drain', () => wake?.());
  res.on('close', () => {
    closed = true;
    wake?.();
  });
  const write = async (text: string) => {
    if (res.write(text) || closed) return;
    await new Promise<void>((resolve) => (wake = resolve));
    wake = null;
  };

  res.status(200);
  res.setHeader('content-type', 'text/csv; charset=utf-8');
  res.setHeader('content-disposition', `attachment; filename="reboundry-${opts.name}-${opts.day}.csv"`);
  try {
    await write('\ufeff' + csvHeader(opts.columns));
    let offset = 0;
    for (;;) {
      if (rows.length) await write(rows.map((r) => csvLine(opts.columns.map((c) => c.value(r)))).join(''));
      if (closed || rows.length < chunkRows) break;
      offset += rows.length;
      rows = await opts.fetch(offset, chunkRows);
    }
  } catch (err) {
    // the error handler logs it; the connection is cut so the browser does not keep half a file
    res.destroy();
    throw err;
  }
  if (!closed) res.end();
}
