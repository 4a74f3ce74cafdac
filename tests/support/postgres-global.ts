/**
 * Vitest global setup of the `pg` project: one private PostgreSQL server for the whole run
 * (tests/support/postgres.ts) with the demo fleet seeded once into a template database, which
 * every test file's server copies (`CREATE DATABASE … TEMPLATE`, a file copy inside the server).
 * A test file of another project that needs PostgreSQL starts its own with
 * {@link startPostgresTarget} and hands it to startTestServer (`postgres`).
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { startPrivatePostgres } from './postgres';
import type { PostgresTarget } from './server';

declare module 'vitest' {
  export interface ProvidedContext {
    reboundryPostgres: PostgresTarget;
  }
}

/** A private PostgreSQL server with the demo fleet seeded into its template database; `stop` removes both. */
export async function startPostgresTarget(): Promise<{ target: PostgresTarget; stop(): void }> {
  const pg = await startPrivatePostgres();
  try {
    const templateDb = 'reboundry_demo_template';
    const templateDataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'reboundry-pg-demo-'));
    pg.sql(`CREATE DATABASE ${templateDb}`);
    // the app's own start-up seeds it, as for a SQLite template (tests/support/server.ts)
    const { seedPostgresTemplate } = await import('./server');
    await seedPostgresTemplate(`${pg.baseUrl}${templateDb}`, templateDataDir);
    return {
      target: { baseUrl: pg.baseUrl, templateDb, templateDataDir },
      stop() {
        pg.stop();
        fs.rmSync(templateDataDir, { recursive: true, force: true });
      },
    };
  } catch (e) {
    pg.stop();
    throw e;
  }
}

export default async function setup(project: TestProject) {
  const pg = await startPostgresTarget();
  project.provide('reboundryPostgres', pg.target);
  return () => pg.stop();
}
