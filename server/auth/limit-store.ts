/**
 * Where express-rate-limit keeps the sign-in failure counts: a table of the database
 * (`sign_in_counts`), so every app instance on that database counts the same failures and the
 * README's limits hold behind a proxy over several instances. Each count is one row per key with
 * the end of its window; a key whose window has ended starts again at one.
 */
import type { Sequelize } from 'sequelize';
import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import { runSql, selectRows } from '../db/raw';

export class DatabaseLimitStore implements Store {
  /** The counts are not the process's own: the library must not assume it sees every hit. */
  localKeys = false;
  private windowMs = 60_000;

  constructor(
    private readonly sequelize: () => Sequelize,
    /** Distinguishes this limiter's keys from another's in the one table. */
    readonly prefix: string,
    private readonly clock: () => number = Date.now,
  ) {}

  init(options: Options) {
    this.windowMs = options.windowMs;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const now = this.clock();
    const [row] = await selectRows<{ hits: number; reset_at_ms: number }>(
      this.sequelize(),
      `INSERT INTO sign_in_counts (limit_key, hits, reset_at_ms) VALUES (?, 1, ?)
       ON CONFLICT (limit_key) DO UPDATE SET
         hits = CASE WHEN sign_in_counts.reset_at_ms <= ? THEN 1 ELSE sign_in_counts.hits + 1 END,
         reset_at_ms = CASE WHEN sign_in_counts.reset_at_ms <= ? THEN ? ELSE sign_in_counts.reset_at_ms END
       RETURNING hits, reset_at_ms`,
      [this.prefix + key, now + this.windowMs, now, now, now + this.windowMs],
    );
    return { totalHits: Number(row.hits), resetTime: new Date(Number(row.reset_at_ms)) };
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const [row] = await selectRows<{ hits: number; reset_at_ms: number }>(this.sequelize(), `SELECT hits, reset_at_ms FROM sign_in_counts WHERE limit_key = ? AND reset_at_ms > ?`, [this.prefix + key, this.clock()]);
    return row ? { totalHits: Number(row.hits), resetTime: new Date(Number(row.reset_at_ms)) } : undefined;
  }

  /** A request that was counted and then succeeded (skipSuccessfulRequests) is taken off again. */
  async decrement(key: string): Promise<void> {
    await runSql(this.sequelize(), `UPDATE sign_in_counts SET hits = hits - 1 WHERE limit_key = ? AND hits > 0 AND reset_at_ms > ?`, [this.prefix + key, this.clock()]);
  }

  async resetKey(key: string): Promise<void> {
    await runSql(this.sequelize(), `DELETE FROM sign_in_counts WHERE limit_key = ?`, [this.prefix + key]);
  }

  /** Removes the rows of every window that has ended (any instance may; the rows are no one's). */
  async sweep(): Promise<number> {
    return runSql(this.sequelize(), `DELETE FROM sign_in_counts WHERE reset_at_ms <= ?`, [this.clock()]);
  }
}
