// The shared CSV reader against RFC 4180's quoting rules (RFC 4180 §2, rules 5–7: a quoted field
// may hold commas, line breaks and doubled quotes) and the layouts the imports document.
import { describe, expect, it } from 'vitest';
import { CsvSyntaxError, readCsv } from '../../../server/lib/csv';
import { parseCsvLine, LineInputError } from '../../../server/roads/line-input';
import { parseLifeCsv, WeibullInputError } from '../../../server/reliability/weibull';

describe('readCsv', () => {
  it('keeps a quoted comma, a doubled quote and a quoted line break inside one cell (RFC 4180 §2)', () => {
    const rows = readCsv('name,note\n"Depot, north","said ""slow"""\n"two\nlines",x\n');
    expect(rows.map((r) => r.cells)).toEqual([
      ['name', 'note'],
      ['Depot, north', 'said "slow"'],
      ['two\nlines', 'x'],
    ]);
  });

  it('numbers each row by its line in the file, past blank and comment lines', () => {
    const rows = readCsv('\uFEFFa,b\n\n# a note\n1,2\n   \n3,4\n');
    expect(rows).toEqual([
      { line: 1, cells: ['a', 'b'] },
      { line: 4, cells: ['1', '2'] },
      { line: 6, cells: ['3', '4'] },
    ]);
  });

  it('keeps a # that is not at the start of a line, and a quote inside an unquoted cell', () => {
    expect(readCsv('a,b\n1,#7\n2,5" wheel\n').map((r) => r.cells)).toEqual([
      ['a', 'b'],
      ['1', '#7'],
      ['2', '5" wheel'],
    ]);
  });

  it('reads semicolons and tabs when asked', () => {
    expect(readCsv('lat;lon\n52.1\t-1.2\n', { delimiters: [',', ';', '\t'] }).map((r) => r.cells)).toEqual([
      ['lat', 'lon'],
      ['52.1', '-1.2'],
    ]);
  });

  it('refuses a quote never closed, naming the line', () => {
    let err: unknown;
    try {
      readCsv('a,b\n1,2\n3,"open\n4,5\n');
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(CsvSyntaxError);
    expect((err as CsvSyntaxError).message).toMatch(/never closed/);
    expect((err as CsvSyntaxError).line).toBeGreaterThanOrEqual(3);
  });
});

describe('the readers built on it', () => {
  it('a route line file with a quoted name holding a comma reads its points (it broke on the comma before)', () => {
    const pts = parseCsvLine('name,lat,lon\n"Mill Lane, east",52.10,-1.20\n"Mill Lane, west",52.11,-1.21\n');
    expect(pts).toHaveLength(2);
    expect(pts[0]).toEqual([-1.2, 52.1]);
  });

  it('a route line file with an unclosed quote is refused with its row', () => {
    expect(() => parseCsvLine('lat,lon\n"52.1,-1.2\n')).toThrow(LineInputError);
  });

  it('the life CSV names the file line of a bad value', () => {
    expect(() => parseLifeCsv('life,failed\n# fleet A\n1000,1\nabc,0\n')).toThrow(/row 4/);
    expect(() => parseLifeCsv('life,failed\n,1\n')).toThrow(WeibullInputError);
  });
});
