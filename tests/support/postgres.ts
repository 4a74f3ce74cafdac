/**
 * A private PostgreSQL server for the tests: a new cluster in a temporary folder, listening on
 * a free port of 127.0.0.1 only, stopped and removed by {@link PrivatePostgres.stop}. It runs
 * Debian's server binaries (package `postgresql`); as root (CI, the dev machines) the server
 * runs as the `postgres` user, since initdb and postgres refuse to run as root.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';

export interface PrivatePostgres {
  /** `postgres://postgres@127.0.0.1:PORT/` — add a database name. */
  baseUrl: string;
  /** Runs one SQL statement through psql on the maintenance database. */
  sql(statement: string): string;
  stop(): void;
}

/** Where Debian puts the server binaries: /usr/lib/postgresql/<major>/bin (newest first). */
export function findPostgresBin(): string {
  const root = '/usr/lib/postgresql';
  const majors = fs.existsSync(root) ? fs.readdirSync(root).filter((d) => /^\d+$/.test(d)).sort((a, b) => Number(b) - Number(a)) : [];
  for (const m of majors) {
    const bin = path.join(root, m, 'bin');
    if (fs.existsSync(path.join(bin, 'initdb')) && fs.existsSync(path.join(bin, 'pg_ctl'))) return bin;
  }
  throw new Error(
    "PostgreSQL's server binaries (initdb, pg_ctl) are not installed: the PostgreSQL tests need Debian's `postgresql` package (apt-get install postgresql).",
  );
}

const freePort = () =>
  new Promise<number>((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });

/** Starts a new, empty cluster (trust authentication on the loopback address only). */
export async function startPrivatePostgres(): Promise<PrivatePostgres> {
  const bin = findPostgresBin();
  const asRoot = process.getuid?.() === 0;
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-pg-'));
  const data = path.join(dir, 'data');
  const run = (cmd: string, args: string[]) => {
    const argv = asRoot ? ['-u', 'postgres', '--', path.join(bin, cmd), ...args] : args;
    const r = spawnSync(asRoot ? 'runuser' : path.join(bin, cmd), argv, { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`${cmd} failed (${r.status}): ${r.stderr || r.stdout || r.error?.message}`);
    return r.stdout;
  };
  if (asRoot) execFileSync('chown', ['postgres', dir]);
  run('initdb', ['-D', data, '-A', 'trust', '-U', 'postgres', '-E', 'UTF8', '--locale=C', '--no-sync']);
  const port = await freePort();
  // no durability needed for a throwaway cluster: no fsync, no full-page writes
  const options = `-p ${port} -k ${dir} -c listen_addresses=127.0.0.1 -c fsync=off -c synchronous_commit=off -c full_page_writes=off -c max_connections=200`;
  run('pg_ctl', ['-D', data, '-o', options, '-l', path.join(dir, 'server.log'), '-w', '-t', '60', 'start']);
  const psql = path.join(bin, 'psql');
  const psqlBin = fs.existsSync(psql) ? psql : 'psql';
  let stopped = false;
  return {
    baseUrl: `postgres://postgres@127.0.0.1:${port}/`,
    sql: (statement) => execFileSync(psqlBin, ['-h', '127.0.0.1', '-p', String(port), '-U', 'postgres', '-d', 'postgres', '-qAtc', statement], { encoding: 'utf8' }),
    stop() {
      if (stopped) return;
      stopped = true;
      try {
        run('pg_ctl', ['-D', data, '-m', 'immediate', '-w', 'stop']);
      } finally {
        fs.rmSync(dir, { recursive: true, force: true });
      }
    },
  };
}
