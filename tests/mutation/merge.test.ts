import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { calculateMetrics } from 'mutation-testing-metrics';
import { areaOf, namedFiles, newestResults } from './merge';

const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-mutation-merge-'));
afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));

const mutant = (id: string, status: string) => ({ id, mutatorName: 'ArithmeticOperator', replacement: '-', status, location: { start: { line: 1, column: 1 }, end: { line: 1, column: 2 } } });
const report = (files: Record<string, string[]>) => ({
  schemaVersion: '2',
  thresholds: { high: 80, low: 60 },
  files: Object.fromEntries(Object.entries(files).map(([f, st]) => [f, { language: 'typescript', source: 'a+b', mutants: st.map((s, i) => mutant(String(i), s)) }])),
});
const write = (name: string, body: object, mtime: number) => {
  const f = path.join(tmp, name);
  fs.writeFileSync(f, JSON.stringify(body));
  fs.utimesSync(f, mtime, mtime);
};

describe('merging narrowed mutation reports', () => {
  it('keeps, for each file, the newest report that holds it, and skips what is not a report', () => {
    write('old.json', report({ 'server/a.ts': ['Survived', 'Survived'], 'server/b.ts': ['Killed'] }), 1_000);
    write('new.json', report({ 'server/a.ts': ['Killed', 'Survived'] }), 2_000);
    write('broken.json', { not: 'a report' }, 3_000);
    fs.writeFileSync(path.join(tmp, 'half.json'), '{"files": {');
    const { files, from } = newestResults(tmp, '/nowhere');
    expect(from).toEqual({ 'server/a.ts': 'new.json', 'server/b.ts': 'old.json' });
    // Stryker's arithmetic over the merged files: detected / valid = (1 + 1) / 3
    expect(calculateMetrics(files).metrics.mutationScore).toBeCloseTo((2 / 3) * 100, 10);
  });

  it('lists the files a `dir/**/*.ts` pattern names, and a file named as it is', () => {
    const base = path.join(tmp, 'tree');
    fs.mkdirSync(path.join(base, 'server/physics/deep'), { recursive: true });
    for (const f of ['server/physics/a.ts', 'server/physics/deep/b.ts', 'server/physics/notes.md']) fs.writeFileSync(path.join(base, f), '');
    expect(namedFiles(['server/physics/**/*.ts', 'server/http/access.ts'], base)).toEqual(['server/http/access.ts', 'server/physics/a.ts', 'server/physics/deep/b.ts']);
    expect([areaOf('server/physics/a.ts'), areaOf('server/inspections/schedule.ts'), areaOf('server/http/access.ts')]).toEqual(['physics', 'scheduling', 'access']);
  });
});
