/**
 * One mutation score over the whole named code from several narrowed Stryker runs.
 *
 * A run over every file at once takes hours on two cores, so each area is run on its own with
 * the tests that exercise it (`MUTATION_REPORT=<dir>/<name> MUTATION_TESTS=… npm run mutation --
 * --mutate <files>`, DEVELOPERS.md). This reads every JSON report in the folder, keeps for each
 * source file the newest report that holds it, and prints killed, timed out, survived and
 * uncovered mutants with the score per file, per area and over all — Stryker's own arithmetic
 * (mutation-testing-metrics: detected / valid). A file of the named code that no report holds
 * is named under "not measured", so a total over fewer files than the run names says so.
 *
 *     npx tsx tests/mutation/score.ts [reports folder, default reports/mutation] [--json]
 *
 * A file scored only with its own area's tests may score lower than under the whole suite: the
 * figure is a lower bound of a single full run's.
 */
import path from 'node:path';
import { calculateMetrics } from 'mutation-testing-metrics';
import { areaOf, namedFiles, newestResults } from './merge';
import { pathToFileURL } from 'node:url';

const args = process.argv.slice(2);
const asJson = args.includes('--json');
const dir = args.find((a) => !a.startsWith('--')) ?? 'reports/mutation';
const root = path.resolve(import.meta.dirname, '../..');

// the scope is read from the Stryker configuration, so the two cannot drift apart
const strykerConfig = (await import(pathToFileURL(path.join(root, 'stryker.config.mjs')).href)) as { default: { mutate: string[] } };
const named = namedFiles(strykerConfig.default.mutate, root);
const { files, from } = newestResults(path.resolve(dir), root);
const pct = (x: number) => (Number.isFinite(x) ? x.toFixed(1) : '–');

type Row = { file: string; area: string; killed: number; timeout: number; survived: number; noCoverage: number; valid: number; score: number; report: string | null };
const rows: Row[] = named.map((file) => {
  const r = files[file];
  if (!r) return { file, area: areaOf(file), killed: 0, timeout: 0, survived: 0, noCoverage: 0, valid: 0, score: NaN, report: null };
  const m = calculateMetrics({ [file]: r }).metrics;
  return { file, area: areaOf(file), killed: m.killed, timeout: m.timeout, survived: m.survived, noCoverage: m.noCoverage, valid: m.totalValid, score: m.mutationScore, report: from[file] };
});
const measured = Object.fromEntries(named.filter((f) => files[f]).map((f) => [f, files[f]]));
const total = (sel: (r: Row) => boolean) => {
  const sub = Object.fromEntries(Object.entries(measured).filter(([f]) => sel(rows.find((r) => r.file === f)!)));
  return calculateMetrics(sub).metrics;
};
const areas = [...new Set(rows.map((r) => r.area))];
const summary = {
  overall: total(() => true),
  areas: Object.fromEntries(areas.map((a) => [a, total((r) => r.area === a)])),
  notMeasured: rows.filter((r) => !r.report).map((r) => r.file),
};

if (asJson) {
  console.log(JSON.stringify({ rows, summary }, null, 2));
} else {
  const line = (cols: (string | number)[]) => console.log(cols.map((c, i) => (i === 0 ? String(c).padEnd(44) : String(c).padStart(8))).join(''));
  line(['file', 'killed', 'timeout', 'survived', 'no cov', 'score']);
  for (const r of rows) line([r.file, r.killed, r.timeout, r.survived, r.noCoverage, r.report ? pct(r.score) : 'not run']);
  console.log('');
  for (const a of areas) {
    const m = summary.areas[a];
    line([`area ${a}`, m.killed, m.timeout, m.survived, m.noCoverage, pct(m.mutationScore)]);
  }
  const m = summary.overall;
  line(['all named code', m.killed, m.timeout, m.survived, m.noCoverage, pct(m.mutationScore)]);
  if (summary.notMeasured.length) console.log(`\nnot measured (left out of the totals above): ${summary.notMeasured.join(', ')}`);
}
