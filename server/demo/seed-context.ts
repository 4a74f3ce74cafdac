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
}

export const day = (d: Date) => formatISO(d, { representation: 'date' });
