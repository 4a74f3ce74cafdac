import { describe, expect, it } from 'vitest';
import { accountDelay } from '../../server/auth/account-delay';

const opts = { freeFailures: 3, baseDelayMs: 1000, maxDelayMs: 8000, maxWaitMs: 10_000, windowMs: 15 * 60_000 };

describe('per-account sign-in spacing', () => {
  it('when failures pass the free allowance, then the spacing doubles per failure up to the cap', () => {
    const d = accountDelay(opts, () => 0);
    expect([0, 1, 2, 3, 4, 5, 6, 7, 9].map(d.spacing)).toEqual([0, 0, 0, 1000, 2000, 4000, 8000, 8000, 8000]);
  });

  it('when attempts on a spaced account arrive together, then each waits its own turn, and one beyond the longest wait is told when to retry', () => {
    let now = 1_000_000;
    const d = accountDelay(opts, () => now);
    for (let i = 0; i < 4; i++) d.failed('a@x.test');
    // 4 failures → 2 s between attempts
    const waits = [0, 1, 2, 3, 4, 5].map(() => d.reserve('a@x.test'));
    expect(waits.slice(0, 6)).toEqual([{ waitMs: 0 }, { waitMs: 2000 }, { waitMs: 4000 }, { waitMs: 6000 }, { waitMs: 8000 }, { waitMs: 10_000 }]);
    expect(d.reserve('a@x.test')).toEqual({ retryAfterMs: 12_000 });
    // another account is not slowed
    expect(d.reserve('b@x.test')).toEqual({ waitMs: 0 });
    // once the turns have passed, the next attempt waits no longer than the spacing
    now += 60_000;
    expect(d.reserve('a@x.test')).toEqual({ waitMs: 0 });
  });

  it('when the owner signs in or the window passes, then the account is no longer spaced', () => {
    let now = 0;
    const d = accountDelay(opts, () => now);
    for (let i = 0; i < 6; i++) d.failed('a@x.test');
    d.reserve('a@x.test');
    expect(d.reserve('a@x.test')).toEqual({ waitMs: 8000 });
    d.succeeded('a@x.test');
    expect(d.reserve('a@x.test')).toEqual({ waitMs: 0 });
    for (let i = 0; i < 6; i++) d.failed('c@x.test');
    now += opts.windowMs;
    expect(d.reserve('c@x.test')).toEqual({ waitMs: 0 });
  });
});
