/**
 * The per-account part of the sign-in policy (README, "Sign-in and sessions"): after a few failed
 * sign-ins to one account, from any address, each further attempt on that account waits its
 * turn, and the spacing between turns doubles with each failure up to a cap. Guessing stays slow
 * however many addresses an attacker has, but the account is never locked: its owner's attempt
 * waits at most `maxWaitMs` and then goes through, or is told to retry in a few seconds.
 *
 * Kept in memory (one server process); a restart forgets the counts.
 */
export interface AccountDelayOptions {
  /** Failures within the window before any spacing applies. */
  freeFailures: number;
  /** Spacing after the first counted failure [ms]; doubles with each further failure. */
  baseDelayMs: number;
  /** Largest spacing between two attempts on one account [ms]. */
  maxDelayMs: number;
  /** An attempt whose turn is further away than this is answered 429 at once [ms]. */
  maxWaitMs: number;
  /** Failures older than this are forgotten [ms]. */
  windowMs: number;
}

interface Entry {
  failures: number[];
  /** Earliest time the next attempt may be checked [ms since epoch]. */
  nextSlot: number;
}

export function accountDelay(opts: AccountDelayOptions, clock: () => number = Date.now) {
  const byAccount = new Map<string, Entry>();

  const entry = (key: string) => {
    const now = clock();
    let e = byAccount.get(key);
    if (!e) {
      e = { failures: [], nextSlot: 0 };
      byAccount.set(key, e);
    }
    e.failures = e.failures.filter((t) => now - t < opts.windowMs);
    return e;
  };

  /** Spacing between attempts after `n` failures [ms]. */
  const spacing = (n: number) => (n < opts.freeFailures ? 0 : Math.min(opts.maxDelayMs, opts.baseDelayMs * 2 ** (n - opts.freeFailures)));

  return {
    spacing,
    /**
     * Reserves the account's next turn: `{ waitMs }` to sleep before checking the password, or
     * `{ retryAfterMs }` when the turn is too far away.
     */
    reserve(key: string): { waitMs: number } | { retryAfterMs: number } {
      const now = clock();
      const e = entry(key);
      const gap = spacing(e.failures.length);
      if (gap === 0) return { waitMs: 0 };
      const slot = Math.max(now, e.nextSlot);
      if (slot - now > opts.maxWaitMs) return { retryAfterMs: slot - now };
      e.nextSlot = slot + gap;
      return { waitMs: slot - now };
    },
    failed(key: string) {
      entry(key).failures.push(clock());
    },
    succeeded(key: string) {
      byAccount.delete(key);
    },
    /** Drops accounts with nothing left to remember (called now and then). */
    sweep() {
      const now = clock();
      for (const [k, e] of byAccount) if (e.nextSlot < now && entry(k).failures.length === 0) byAccount.delete(k);
    },
  };
}
