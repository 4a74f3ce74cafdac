import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

const ROOT = resolve(import.meta.dirname, '../..');
const CLI = join(ROOT, 'server/cli/index.ts');

/**
 * Runs the command line (`server/cli`) as the user runs it: a subprocess of node with the tsx
 * loader. `json` is what it printed when that was JSON, otherwise null.
 */
export function runCli<T = Record<string, unknown>>(...args: string[]): { code: number; stdout: string; stderr: string; json: T | null } {
  const r = spawnSync(process.execPath, ['--import', 'tsx', CLI, ...args], { cwd: ROOT, encoding: 'utf8', timeout: 60_000 });
  let json: T | null = null;
  try {
    json = JSON.parse(r.stdout) as T;
  } catch {
    json = null;
  }
  return { code: r.status ?? -1, stdout: r.stdout, stderr: r.stderr, json };
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
