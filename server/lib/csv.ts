/**
 * The one CSV reader of the server and the command line (csv-parse): RFC 4180 quoting (a quoted
 * cell may hold the delimiter, a doubled quote or a line break), a leading byte-order mark
 * dropped, cells trimmed, blank lines and lines starting with `#` skipped. Rows keep their line
 * number in the file so every import report can name the row it means. Column counts are left
 * to the caller, which says what it expected.
 */
import { CsvError, parse } from 'csv-parse/sync';

export interface CsvRow {
  /** Line of the file on which the row ends (1-based; a row with a quoted line break spans several). */
  line: number;
  cells: string[];
}

/** The text is not CSV (a quoted cell never closed, text after a closing quote); the message says which, without the line. */
export class CsvSyntaxError extends Error {
  constructor(
    message: string,
    /** Line of the file where reading stopped, when known. */
    public readonly line: number | null,
  ) {
    super(message);
    this.name = 'CsvSyntaxError';
  }
}

const PLAIN: Record<string, string> = {
  CSV_QUOTE_NOT_CLOSED: 'a quoted cell is never closed (a " without its closing ")',
  CSV_INVALID_CLOSING_QUOTE: 'a quote inside a cell must be doubled ("") or the whole cell quoted',
  INVALID_OPENING_QUOTE: 'a quote inside an unquoted cell must be doubled ("") or the whole cell quoted',
};

/**
 * Reads CSV text into rows of trimmed cells.
 * @param opts.delimiters cell separators (default a comma)
 * @throws CsvSyntaxError naming the line where the text stops being CSV
 */
export function readCsv(text: string, opts: { delimiters?: string[] } = {}): CsvRow[] {
  try {
    const records = parse(text, {
      bom: true,
      delimiter: opts.delimiters ?? [','],
      comment: '#',
      comment_no_infix: true,
      skip_empty_lines: true,
      skip_records_with_empty_values: true,
      trim: true,
      relax_column_count: true,
      // a quote inside an unquoted cell is kept as it is (inches, nicknames)
      relax_quotes: true,
      info: true,
    }) as unknown as { record: string[]; info: { lines: number } }[];
    return records.map((r) => ({ line: r.info.lines, cells: r.record }));
  } catch (e) {
    if (e instanceof CsvError) {
      const line = typeof (e as CsvError & { lines?: number }).lines === 'number' ? (e as CsvError & { lines: number }).lines : null;
      throw new CsvSyntaxError(PLAIN[e.code] ?? 'the text is not valid CSV', line);
    }
    throw e;
  }
}
