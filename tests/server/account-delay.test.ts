import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { accountDelay } from '../../server/auth/account-delay';
import { freshDb } from '../support/fresh-db';

/** The per-account spacing of sign-in attempts, kept in the database (sign_in_delays). */

const opts = { freeFailures: 3, baseDelayMs: 1000, maxDelayMs: 8000, maxWaitMs: 10_000, windowMs: 15 * 60_000 };

let db: Awaited<ReturnType<typeof freshDb>>;
beforeAll(async () => {
  db = await freshDb();
});
afterAll(() => db?.dispose());

let now = 1_000_000;
/** One app instance's view of the spacing: every instance made here shares the one database. */
const instance = () => accountDelay(() => db.sequelize, opts, () => now);

describe('per-account sign-in spacing', () => {
  it('when failures pass the free allowance, then the spacing doubles per failure up to the cap', () => {
    const d = instance();
    expect([0, 1, 2, 3, 4, 5, 6, 7, 9].map(d.spacing)).toEqual([0, 0, 0, 1000, 2000, 4000, 8000, 8000, 8000]);
  });

  it('when attempts on a spaced account arrive together, then each waits its own turn, and one beyond the longest wait is told when to retry', async () => {
    now = 1_000_000;
    const d = instance();
    for (let i = 0; i < 4; i++) await d.failed('a@x.test');
    // 4 failures → 2 s between attempts
    const waits = [];
    for (let i = 0; i < 6; i++) waits.push(await d.reserve('a@x.test'));
    expect(waits).toEqual([{ waitMs: 0 }, { waitMs: 2000 }, { waitMs: 4000 }, { waitMs: 6000 }, { waitMs: 8000 }, { waitMs: 10_000 }]);
    expect(await d.reserve('a@x.test')).toEqual({ retryAfterMs: 12_000 });
    // another account is not slowed
    expect(await d.reserve('b@x.test')).toEqual({ waitMs: 0 });
    // once the turns have passed, the next attempt waits no longer than the spacing
    now += 60_000;
    expect(await d.reserve('a@x.test')).toEqual({ waitMs: 0 });
  });

  it('when two instances take turns on one account at the same moment, then no turn is handed out twice and the failures of both count', async () => {
    now = 5_000_000;
    const [one, two] = [instance(), instance()];
    // two failures on each instance: four on the account, 2 s apart
    await Promise.all([one.failed('c@x.test'), two.failed('c@x.test'), one.failed('c@x.test'), two.failed('c@x.test')]);
    const turns = await Promise.all([one, two, one, two, one, two].map((d) => d.reserve('c@x.test')));
    const waits = turns.map((t) => ('waitMs' in t ? t.waitMs : -1)).sort((a, b) => a - b);
    expect(waits).toEqual([0, 2000, 4000, 6000, 8000, 10_000]);
  });

  it('when the owner signs in or the window passes, then the account is no longer spaced; sweeping removes only what has ended', async () => {
    now = 9_000_000;
    const d = instance();
    for (let i = 0; i < 6; i++) await d.failed('d@x.test');
    await d.reserve('d@x.test');
    expect(await d.reserve('d@x.test')).toEqual({ waitMs: 8000 });
    await d.succeeded('d@x.test');
    expect(await d.reserve('d@x.test')).toEqual({ waitMs: 0 });
    for (let i = 0; i < 6; i++) await d.failed('e@x.test');
    await d.failed('f@x.test');
    now += opts.windowMs - 1;
    await d.failed('f@x.test'); // f's window started at the same moment as e's
    now += 1;
    expect(await d.reserve('e@x.test')).toEqual({ waitMs: 0 });
    // a failure after the window starts a new one at one failure
    for (let i = 0; i < 3; i++) await d.failed('f@x.test');
    expect(d.spacing(3)).toBe(1000);
    expect(await d.reserve('f@x.test')).toEqual({ waitMs: 0 });
    expect(await d.reserve('f@x.test')).toEqual({ waitMs: 1000 });
    expect(await d.sweep()).toBeGreaterThanOrEqual(1); // e (and the older accounts above)
    const left = await db.sequelize.query<{ account_key: string }>(`SELECT account_key FROM sign_in_delays ORDER BY account_key`, { type: 'SELECT' as never });
    expect(left.map((r) => r.account_key)).toEqual(['f@x.test']);
  });
});
