import { createHash } from 'node:crypto';
import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import type { Pool } from '../db/client';

/**
 * express-rate-limit counters in MariaDB (`rate_limits`), so every app instance behind a
 * load balancer counts the same attempts and a restart does not reset them. One store per
 * limiter (the prefix keeps them apart). Times come from the database clock (UTC).
 */
const pending = new Set<Promise<unknown>>();
function track<T>(work: Promise<T>): Promise<T> {
  pending.add(work);
  void work.finally(() => pending.delete(work)).catch(() => {});
  return work;
}

/**
 * Waits for counter writes still under way (a decrement runs after the response is sent);
 * call before closing the pool.
 */
export async function settleRateLimitWrites(): Promise<void> {
  while (pending.size) await Promise.allSettled([...pending]);
}

export class MariaDbRateLimitStore implements Store {
  windowMs = 60_000;
  readonly localKeys = false;

  constructor(
    private readonly pool: Pool,
    readonly prefix: string,
  ) {}

  init(options: Options) {
    this.windowMs = options.windowMs;
  }

  private hash(key: string) {
    return createHash('sha256').update(`${this.prefix}\0${key}`).digest('hex');
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const [rows] = await this.pool.query<import('mysql2').RowDataPacket[]>(
      'SELECT hits, reset_at FROM rate_limits WHERE key_hash = ? AND reset_at > UTC_TIMESTAMP(3)',
      [this.hash(key)],
    );
    const row = rows[0];
    return row ? { totalHits: Number(row.hits), resetTime: row.reset_at as Date } : undefined;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const hash = this.hash(key);
    const micros = Math.round(this.windowMs * 1000);
    // One statement: a fresh window when the old one is over, else one more hit.
    // (ON DUPLICATE KEY UPDATE assigns left to right; reset_at is still the old value in `hits`'s IF.)
    await this.pool.query(
      `INSERT INTO rate_limits (key_hash, hits, reset_at) VALUES (?, 1, UTC_TIMESTAMP(3) + INTERVAL ? MICROSECOND)
       ON DUPLICATE KEY UPDATE
         hits = IF(reset_at <= UTC_TIMESTAMP(3), 1, hits + 1),
         reset_at = IF(reset_at <= UTC_TIMESTAMP(3), UTC_TIMESTAMP(3) + INTERVAL ? MICROSECOND, reset_at)`,
      [hash, micros, micros],
    );
    const [rows] = await this.pool.query<import('mysql2').RowDataPacket[]>('SELECT hits, reset_at FROM rate_limits WHERE key_hash = ?', [hash]);
    const row = rows[0];
    return { totalHits: Number(row?.hits ?? 1), resetTime: row?.reset_at as Date | undefined };
  }

  async decrement(key: string): Promise<void> {
    await track(this.pool.query('UPDATE rate_limits SET hits = GREATEST(hits - 1, 0) WHERE key_hash = ?', [this.hash(key)]));
  }

  async resetKey(key: string): Promise<void> {
    await this.pool.query('DELETE FROM rate_limits WHERE key_hash = ?', [this.hash(key)]);
  }
}

/** Drops counters whose window is over (the hourly sweep calls it). */
export async function sweepRateLimits(pool: Pool): Promise<void> {
  await pool.query('DELETE FROM rate_limits WHERE reset_at <= UTC_TIMESTAMP(3)');
}
