import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import type { Options } from 'express-rate-limit';
import { DatabaseLimitStore } from '../../server/auth/limit-store';
import { freshDb } from '../support/fresh-db';

/** The sign-in failure counts kept in the database: a window per key, counted up and down, swept when ended. */

let db: Awaited<ReturnType<typeof freshDb>>;
beforeAll(async () => {
  db = await freshDb();
});
afterAll(() => db?.dispose());

let now = 1_000_000;
const store = (prefix: string) => {
  const s = new DatabaseLimitStore(() => db.sequelize, prefix, () => now);
  s.init({ windowMs: 60_000 } as Options);
  return s;
};

describe('sign-in failure counts in the database', () => {
  it('when a key is counted, then its hits grow within the window and start again at one after it; its window end stays put meanwhile', async () => {
    const s = store('a/');
    expect(await s.increment('k')).toEqual({ totalHits: 1, resetTime: new Date(now + 60_000) });
    now += 59_999;
    expect(await s.increment('k')).toEqual({ totalHits: 2, resetTime: new Date(1_000_000 + 60_000) });
    expect((await s.get('k'))?.totalHits).toBe(2);
    now += 1; // the window has ended
    expect(await s.get('k')).toBeUndefined();
    expect(await s.increment('k')).toEqual({ totalHits: 1, resetTime: new Date(now + 60_000) });
  });

  it('when a counted request succeeds, then decrement takes it off (never below zero); resetKey forgets the key; prefixes keep two limiters apart', async () => {
    const a = store('a/');
    const b = store('b/');
    await a.increment('x');
    await a.increment('x');
    expect((await b.increment('x')).totalHits).toBe(1);
    await a.decrement('x');
    expect((await a.get('x'))?.totalHits).toBe(1);
    await a.decrement('x');
    await a.decrement('x');
    expect((await a.get('x'))?.totalHits).toBe(0);
    await b.resetKey('x');
    expect(await b.get('x')).toBeUndefined();
    expect(await a.get('x')).toBeDefined();
  });

  it('when windows have ended, then sweep removes their rows and keeps the others', async () => {
    const s = store('c/');
    await s.increment('old');
    now += 30_000;
    await s.increment('young');
    now += 30_001;
    const before = await db.sequelize.query<{ n: number }>(`SELECT COUNT(*) AS n FROM sign_in_counts WHERE limit_key LIKE 'c/%'`, { type: QueryTypes.SELECT });
    expect(Number(before[0].n)).toBe(2);
    expect(await s.sweep()).toBeGreaterThanOrEqual(1);
    const left = await db.sequelize.query<{ limit_key: string }>(`SELECT limit_key FROM sign_in_counts WHERE limit_key LIKE 'c/%'`, { type: QueryTypes.SELECT });
    expect(left.map((r) => r.limit_key)).toEqual(['c/young']);
  });
});
