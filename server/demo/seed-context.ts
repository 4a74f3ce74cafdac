/** What every step of seeding the demo fleet shares: one transaction, one random sequence, one "today". */
import { formatISO } from 'date-fns';
import type { Transaction } from 'sequelize';
import type { Db } from '../db/index';

export interface SeedContext {
  db: Db;
  transaction: Transaction;
  opts: { transaction: Transaction };
  /** The demo's one seeded random sequence: the steps draw from it in a fixed order, so the fleet is the same for a given "today". */
  rand: () => number;
  /** Midnight starting "today". */
  today: Date;
  now: Date;
  dataDir: string;
  /** How much of the fleet to seed. */
  demo: DemoOptions;
}

/**
 * How much of the demo fleet to seed: all of it by default, or only the first `vehiclesPerSpec`
 * vehicles of each spec (with their trips and histories) — a fleet small enough that the nightly
 * job over it takes a few seconds, for the tests that run the job several times.
 */
export interface DemoOptions {
  vehiclesPerSpec?: number;
}

export const day = (d: Date) => formatISO(d, { representation: 'date' });
