/**
 * Rows as JSON text for SQLite's `jsonb_each` (see `raw.ts` {@link fromJsonRows}). No database
 * here, so the duty worker threads can pack their results without loading Sequelize.
 */

/**
 * One value as JSON text that SQLite reads back as exactly the value sqlite3 would have bound:
 * integers (up to 2^53) in plain digits, other numbers with 17 significant digits. The shortest
 * form JavaScript writes is not always read back to the same double by SQLite's number parser
 * (one unit in the last place off, now and then); 17 digits are.
 */
export function jsonValue(v: unknown): string {
  if (v === null || v === undefined) return 'null';
  if (typeof v === 'number') {
    if (!Number.isFinite(v)) throw new Error(`not a finite number: ${v}`);
    return Number.isInteger(v) && Math.abs(v) <= Number.MAX_SAFE_INTEGER ? String(v) : v.toPrecision(17);
  }
  if (typeof v === 'string') return JSON.stringify(v);
  if (typeof v === 'boolean') return v ? '1' : '0';
  throw new Error(`not a number, text or null: ${typeof v}`);
}

/** Rows as one JSON array of arrays, for {@link fromJsonRows}. */
export function jsonRows(rows: readonly (readonly unknown[])[]): string {
  let s = '[';
  for (let r = 0; r < rows.length; r++) {
    const row = rows[r];
    s += r ? ',[' : '[';
    for (let k = 0; k < row.length; k++) s += k ? ',' + jsonValue(row[k]) : jsonValue(row[k]);
    s += ']';
  }
  return s + ']';
}

/**
 * One JSON array of the rows of several {@link jsonRows} texts, in order (a cheap string join,
 * so rows packed on a worker thread are not parsed again).
 */
export function joinJsonRows(texts: readonly string[]): string {
  const inner = texts.filter((t) => t.length > 2).map((t) => t.slice(1, -1));
  return `[${inner.join(',')}]`;
}
