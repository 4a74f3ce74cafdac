/**
 * Vitest global setup of the `pg` project: one private PostgreSQL server for the whole run
 * (tests/support/postgres.ts) with the demo fleet and its small cut each seeded once into a
 * template database, which every test file's server copies (`CREATE DATABASE … TEMPLATE`, a file copy inside the server).
 * A test file of another project that needs PostgreSQL starts its own with
 * {@link startPostgresTarget} and hands it to startTestServer (`postgres`).
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { startPrivatePostgres } from './postgres';
import type { PostgresTarget, TestFleet } from './server';

declare module 'vitest' {
  export interface ProvidedContext {
    reboundryPostgres: PostgresTarget;
  }
}

/**
 * A private PostgreSQL server with the fleets asked for (the demo fleet and its small cut unless
 * told) seeded into template databases; `stop` removes them all.
 */
export async function startPostgresTarget(fleets: readonly TestFleet[] = ['demo', 'small']): Promise<{ target: PostgresTarget; stop(): void }> {
  const pg = await startPrivatePostgres();
  const dataDirs: string[] = [];
  try {
    // the app's own start-up seeds them, as for a SQLite template (tests/support/server.ts)
    const { seedPostgresTemplate } = await import('./server');
    const templates: PostgresTarget['templates'] = {};
    for (const fleet of fleets) {
      const db = `reboundry_${fleet}_template`;
      const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), `reboundry-pg-${fleet}-`));
      dataDirs.push(dataDir);
      pg.sql(`CREATE DATABASE ${db}`);
      await seedPostgresTemplate(`${pg.baseUrl}${db}`, dataDir, fleet);
      templates[fleet] = { db, dataDir };
    }
    return {
      target: { baseUrl: pg.baseUrl, templates },
      stop() {
        pg.stop();
        for (const d of dataDirs) fs.rmSync(d, { recursive: true, force: true });
      },
    };
  } catch (e) {
    pg.stop();
    for (const d of dataDirs) fs.rmSync(d, { recursive: true, force: true });
    throw e;
  }
}

export default async function setup(project: TestProject) {
  const pg = await startPostgresTarget();
  project.provide('reboundryPostgres', pg.target);
  return () => pg.stop();
}
