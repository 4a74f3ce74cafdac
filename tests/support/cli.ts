import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { main } from '../../server/cli/index';

const ROOT = resolve(import.meta.dirname, '../..');
const CLI = join(ROOT, 'server/cli/index.ts');

export interface CliRun<T> {
  code: number;
  stdout: string;
  stderr: string;
  /** What it printed when that was JSON, otherwise null. */
  json: T | null;
}

function parsed<T>(code: number, stdout: string, stderr: string): CliRun<T> {
  let json: T | null = null;
  try {
    json = JSON.parse(stdout) as T;
  } catch {
    json = null;
  }
  return { code, stdout, stderr, json };
}

/**
 * Runs the command line (`server/cli`) as the user runs it: a subprocess of node with the tsx
 * loader, its exit code and both streams. Half a second per call for the loader, so the
 * command-by-command checks use {@link runCliInProcess}; a file's contract check uses this.
 */
export function runCliProcess<T = Record<string, unknown>>(...args: string[]): CliRun<T> {
  const r = spawnSync(process.execPath, ['--import', 'tsx', CLI, ...args], { cwd: ROOT, encoding: 'utf8', timeout: 60_000 });
  return parsed<T>(r.status ?? -1, r.stdout, r.stderr);
}

/**
 * Runs the command line's entry point (`main` of `server/cli`, the function the process runs)
 * in this process, with its two streams captured: the same code, exit code and text as
 * {@link runCliProcess} without starting node.
 */
export function runCli<T = Record<string, unknown>>(...args: string[]): CliRun<T> {
  let stdout = '';
  let stderr = '';
  const code = main(args, { stdout: { write: (t: string) => (stdout += t) }, stderr: { write: (t: string) => (stderr += t) } });
  return parsed<T>(code, stdout, stderr);
}

/** A folder of its own under the system's temporary folder, for the files a command reads. */
export function scratchFolder(prefix: string) {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  return {
    dir,
    /** Writes a file into the folder and returns its path. */
    put(name: string, text: string): string {
      const p = join(dir, name);
      writeFileSync(p, text);
      return p;
    },
    remove() {
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
