import http from 'node:http';
import type { AddressInfo } from 'node:net';
import express from 'express';
import { parse } from 'csv-parse/sync';
import { afterEach, describe, expect, it } from 'vitest';
import { csvCell, csvLine, sendCsv, type CsvColumn } from '../../../server/http/csv-export';

describe('CSV cells', () => {
  it('when a cell holds a comma, a quote or a line break, then it is quoted with quotes doubled (RFC 4180)', () => {
    expect(csvLine(['a,b', 'say "hi"', 'two\nlines', 'plain'])).toBe('"a,b","say ""hi""","two\nlines",plain\r\n');
    const [row] = parse(csvLine(['a,b', 'say "hi"', 'two\r\nlines'])) as string[][];
    expect(row).toEqual(['a,b', 'say "hi"', 'two\r\nlines']);
  });

  it('when a text starts with = + - or @, then it gets a leading apostrophe so a spreadsheet shows it instead of running it', () => {
    expect(csvCell('=HYPERLINK("http://x")')).toBe(`"'=HYPERLINK(""http://x"")"`);
    expect(csvCell('+1-2')).toBe("'+1-2");
    expect(csvCell('-cmd')).toBe("'-cmd");
    expect(csvCell('@SUM(A1)')).toBe("'@SUM(A1)");
    expect(csvCell('\tx')).toBe("'\tx");
  });

  it('when a value is a plain number (as a number or as text), then it is written as it is', () => {
    expect(csvCell(-12.5)).toBe('-12.5');
    expect(csvCell('-12.5')).toBe('-12.5');
    expect(csvCell('+3')).toBe('+3');
    expect(csvCell('-1e-3')).toBe('-1e-3');
    expect(csvCell(null)).toBe('');
    expect(csvCell(undefined)).toBe('');
    expect(csvCell(true)).toBe('true');
  });
});

/** A list of `n` numbered rows (endless when `n` is Infinity), counting the queries made of it. */
function numbered(n: number) {
  const calls: { offset: number; limit: number }[] = [];
  return {
    calls,
    fetch: async (offset: number, limit: number) => {
      calls.push({ offset, limit });
      // a query goes out to the database and back: the event loop turns meanwhile
      await new Promise((r) => setImmediate(r));
      return Array.from({ length: Math.max(0, Math.min(limit, n - offset)) }, (_, i) => ({ i: offset + i, text: 'x'.repeat(200) }));
    },
  };
}
const COLUMNS: CsvColumn<{ i: number; text: string }>[] = [
  { header: 'Row', value: (r) => r.i },
  { header: 'Length', unit: 'km', value: (r) => r.text },
];

let server: http.Server | null = null;
afterEach(async () => {
  server?.closeAllConnections();
  await new Promise<void>((r) => (server ? server.close(() => r()) : r()));
  server = null;
});

/** Serves `sendCsv` of `source` on a free port; `done` settles when the handler returns. */
async function serve(source: ReturnType<typeof numbered>, chunkRows: number) {
  let settle!: (v: unknown) => void;
  const done = new Promise((r) => (settle = r));
  const app = express();
  app.get('/export', (_req, res) => {
    sendCsv(res, { name: 'rows', day: '2026-11-30', columns: COLUMNS, fetch: source.fetch, chunkRows }).then(settle, settle);
  });
  server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server!.once('listening', r));
  return { url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/export`, done };
}

const wait = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('streaming a list as CSV', () => {
  it('when the list is longer than one chunk, then every row is written once, in order, after the header with its units', async () => {
    const source = numbered(23);
    const { url } = await serve(source, 5);
    const res = await fetch(url);
    expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
    expect(res.headers.get('content-disposition')).toBe('attachment; filename="reboundry-rows-2026-11-30.csv"');
    const rows = parse(await res.text(), { bom: true }) as string[][];
    expect(rows[0]).toEqual(['Row', 'Length (km)']);
    expect(rows.slice(1).map((r) => Number(r[0]))).toEqual(Array.from({ length: 23 }, (_, i) => i));
    expect(source.calls.map((c) => c.offset)).toEqual([0, 5, 10, 15, 20]);
  });

  it('when the browser stops reading, then no more chunks are read until it reads again (the connection buffer is not outrun)', async () => {
    const source = numbered(Infinity);
    const { url } = await serve(source, 50);
    const controller = new AbortController();
    const res = await fetch(url, { signal: controller.signal });
    // wait for the buffers between the two to fill: the count stops moving
    let stalled = -1;
    for (const until = Date.now() + 4000; source.calls.length !== stalled && Date.now() < until; ) {
      stalled = source.calls.length;
      await wait(250);
    }
    await wait(300);
    // 50 rows of ~200 bytes a chunk: what stalled is the socket's and the fetch client's buffers
    // (a few MB), where an endless list read without waiting would go on growing.
    expect(source.calls.length).toBe(stalled);
    expect(stalled).toBeLessThan(1000);
    const reader = res.body!.getReader();
    const until = Date.now() + 5000;
    while (source.calls.length === stalled && Date.now() < until) await reader.read();
    expect(source.calls.length).toBeGreaterThan(stalled);
    controller.abort();
    await reader.cancel().catch(() => {});
  });

  it('when the browser goes away mid-download, then the export stops reading the list', async () => {
    const source = numbered(Infinity);
    const { url, done } = await serve(source, 50);
    const controller = new AbortController();
    const res = await fetch(url, { signal: controller.signal });
    const reader = res.body!.getReader();
    await reader.read();
    controller.abort();
    await reader.cancel().catch(() => {});
    await Promise.race([done, wait(2000)]);
    const after = source.calls.length;
    await wait(300);
    expect(source.calls.length).toBe(after);
    await expect(Promise.race([done.then(() => 'returned'), wait(100).then(() => 'still running')])).resolves.toBe('returned');
  });

  it('when reading a later chunk fails, then the download is cut short (the browser sees a failed download, not a shorter file)', async () => {
    const source = numbered(Infinity);
    const failing = {
      calls: source.calls,
      fetch: async (offset: number, limit: number) => {
        if (offset > 0) throw new Error('database gone');
        return source.fetch(offset, limit);
      },
    };
    const { url, done } = await serve(failing, 5);
    // the connection closes without the end of the answer (before or after its head reached the browser)
    const read = fetch(url)
      .then((res) => res.text())
      .then(
        () => 'whole',
        () => 'cut short',
      );
    await expect(Promise.race([read, wait(2000).then(() => 'still open')])).resolves.toBe('cut short');
    await expect(done).resolves.toMatchObject({ message: 'database gone' });
  });
});
