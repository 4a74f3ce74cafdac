/**
 * Reading several narrowed Stryker JSON reports as one (tests/mutation/score.ts prints it).
 */
import fs from 'node:fs';
import path from 'node:path';
import type { FileResult, MutationTestResult } from 'mutation-testing-report-schema';

/** The files the mutation run names (stryker.config.mjs `mutate`): `dir/**\/*.ts` or a file. */
export function namedFiles(patterns: readonly string[], base: string): string[] {
  const out = new Set<string>();
  const walk = (d: string): string[] =>
    fs.readdirSync(path.join(base, d), { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? walk(path.join(d, e.name)) : [path.join(d, e.name)]));
  for (const p of patterns) {
    const m = /^(.*)\/\*\*\/\*\.ts$/.exec(p);
    if (!m) {
      out.add(p);
      continue;
    }
    for (const f of walk(m[1])) if (f.endsWith('.ts')) out.add(f.split(path.sep).join('/'));
  }
  return [...out].sort();
}

/** The area a file belongs to, in the words of the mutation run's scope. */
const AREAS: [RegExp, string][] = [
  [/^server\/physics\//, 'physics'],
  [/^server\/wear\//, 'wear'],
  [/^server\/inspections\//, 'scheduling'],
  [/^server\/http\//, 'access'],
  [/^server\/trips\//, 'trips'],
  [/^server\/mail\//, 'mail'],
  [/^server\/reliability\//, 'reliability'],
];
export const areaOf = (f: string) => AREAS.find(([re]) => re.test(f))?.[1] ?? 'other';

/** For each source file, its result in the newest report (by modification time) that holds it. */
export function newestResults(reportDir: string, root: string): { files: Record<string, FileResult>; from: Record<string, string> } {
  const reports = fs
    .readdirSync(reportDir)
    .filter((f) => f.endsWith('.json'))
    .map((f) => ({ f, t: fs.statSync(path.join(reportDir, f)).mtimeMs }))
    .sort((a, b) => a.t - b.t);
  const files: Record<string, FileResult> = {};
  const from: Record<string, string> = {};
  for (const { f } of reports) {
    let r: MutationTestResult;
    try {
      r = JSON.parse(fs.readFileSync(path.join(reportDir, f), 'utf8')) as MutationTestResult;
    } catch {
      continue; // a report still being written, or not a Stryker report
    }
    if (!r || typeof r.files !== 'object') continue;
    for (const [name, result] of Object.entries(r.files)) {
      const key = path.isAbsolute(name) ? path.relative(root, name) : name;
      files[key] = result;
      from[key] = f;
    }
  }
  return { files, from };
}

