/**
 * The per-account part of the sign-in policy (README, "Sign-in and sessions"): after a few failed
 * sign-ins to one account, from any address, each further attempt on that account waits its
 * turn, and the spacing between turns doubles with each failure up to a cap. Guessing stays slow
 * however many addresses an attacker has, but the account is never locked: its owner's attempt
 * waits at most `maxWaitMs` and then goes through, or is told to retry in a few seconds.
 *
 * Kept in the database (`sign_in_delays`, one row per account with recent failures), so every
 * app instance on it counts the same failures and hands out turns from one queue per account.
 * The failures are counted in a window that starts with the first of them, as the address limits
 * count theirs (limit-store.ts); a turn is taken by an update that only succeeds if no other
 * attempt took one meanwhile, so two instances never hand out the same turn.
 */
import type { Sequelize } from 'sequelize';
import { runSql, selectRows } from '../db/raw';

export interface AccountDelayOptions {
  /** Failures within the window before any spacing applies. */
  freeFailures: number;
  /** Spacing after the first counted failure [ms]; doubles with each further failure. */
  baseDelayMs: number;
  /** Largest spacing between two attempts on one account [ms]. */
  maxDelayMs: number;
  /** An attempt whose turn is further away than this is answered 429 at once [ms]. */
  maxWaitMs: number;
  /** How long failures are remembered, from the first of a window [ms]. */
  windowMs: number;
}

interface Row {
  failures: number;
  window_ends_ms: number;
  next_slot_ms: number;
}

export function accountDelay(sequelize: () => Sequelize, opts: AccountDelayOptions, clock: () => number = Date.now) {
  /** Spacing between attempts after `n` failures [ms]. */
  const spacing = (n: number) => (n < opts.freeFailures ? 0 : Math.min(opts.maxDelayMs, opts.baseDelayMs * 2 ** (n - opts.freeFailures)));

  const current = async (key: string, now: number): Promise<Row | undefined> => {
    const [row] = await selectRows<Row>(sequelize(), `SELECT failures, window_ends_ms, next_slot_ms FROM sign_in_delays WHERE account_key = ? AND window_ends_ms > ?`, [key, now]);
    return row && { failures: Number(row.failures), window_ends_ms: Number(row.window_ends_ms), next_slot_ms: Number(row.next_slot_ms) };
  };

  return {
    spacing,
    /**
     * Reserves the account's next turn: `{ waitMs }` to sleep before checking the password, or
     * `{ retryAfterMs }` when the turn is too far away.
     */
    async reserve(key: string): Promise<{ waitMs: number } | { retryAfterMs: number }> {
      for (;;) {
        const now = clock();
        const row = await current(key, now);
        const gap = row ? spacing(row.failures) : 0;
        if (!row || gap === 0) return { waitMs: 0 };
        const slot = Math.max(now, row.next_slot_ms);
        if (slot - now > opts.maxWaitMs) return { retryAfterMs: slot - now };
        // taken only if no other attempt (on this instance or another) took a turn meanwhile
        const took = await runSql(sequelize(), `UPDATE sign_in_delays SET next_slot_ms = ? WHERE account_key = ? AND next_slot_ms = ? AND failures = ?`, [
          slot + gap,
          key,
          row.next_slot_ms,
          row.failures,
        ]);
        if (took) return { waitMs: slot - now };
      }
    },
    /** Counts a failed attempt on the account (a window that has ended starts again at one). */
    async failed(key: string) {
      const now = clock();
      await runSql(
        sequelize(),
        `INSERT INTO sign_in_delays (account_key, failures, window_ends_ms, next_slot_ms) VALUES (?, 1, ?, 0)
         ON CONFLICT (account_key) DO UPDATE SET
           failures = CASE WHEN sign_in_delays.window_ends_ms <= ? THEN 1 ELSE sign_in_delays.failures + 1 END,
           next_slot_ms = CASE WHEN sign_in_delays.window_ends_ms <= ? THEN 0 ELSE sign_in_delays.next_slot_ms END,
           window_ends_ms = CASE WHEN sign_in_delays.window_ends_ms <= ? THEN ? ELSE sign_in_delays.window_ends_ms END`,
        [key, now + opts.windowMs, now, now, now, now + opts.windowMs],
      );
    },
    /** The owner signed in: the account is no longer spaced. */
    async succeeded(key: string) {
      await runSql(sequelize(), `DELETE FROM sign_in_delays WHERE account_key = ?`, [key]);
    },
    /** Removes the rows of accounts whose window has ended and whose turns have passed (any instance may). */
    async sweep(): Promise<number> {
      const now = clock();
      return runSql(sequelize(), `DELETE FROM sign_in_delays WHERE window_ends_ms <= ? AND next_slot_ms < ?`, [now, now]);
    },
  };
}
