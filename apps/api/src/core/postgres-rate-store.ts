import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import type { DataSource } from 'typeorm';

/** Expired windows are swept at most this often per process, inside an ordinary increment. */
const SWEEP_EVERY_MS = 60_000;

interface WindowRow {
  hits: number;
  resets_at: Date;
}

/**
 * An express-rate-limit store in the `rate_limit_window` table: one row per key, counted with a
 * single upsert so concurrent requests on any API process add up exactly. A window that has run
 * out restarts at one hit.
 */
export class PostgresRateStore implements Store {
  /** Tells express-rate-limit the count is shared, not per process. */
  readonly localKeys = false;
  private windowMs = 60_000;
  private lastSweep = 0;

  constructor(
    private readonly dataSource: DataSource,
    readonly prefix: string,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const rows: WindowRow[] = await this.dataSource.query(
      `SELECT hits, resets_at FROM rate_limit_window WHERE key = $1 AND resets_at > now()`,
      [this.prefix + key],
    );
    return rows[0] ? { totalHits: rows[0].hits, resetTime: rows[0].resets_at } : undefined;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    await this.sweepNowAndThen();
    const rows: WindowRow[] = await this.dataSource.query(
      `INSERT INTO rate_limit_window AS w (key, hits, resets_at)
       VALUES ($1, 1, now() + make_interval(secs => $2::double precision / 1000))
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN w.resets_at <= now() THEN 1 ELSE w.hits + 1 END,
         resets_at = CASE WHEN w.resets_at <= now() THEN EXCLUDED.resets_at ELSE w.resets_at END
       RETURNING hits, resets_at`,
      [this.prefix + key, this.windowMs],
    );
    return { totalHits: rows[0].hits, resetTime: rows[0].resets_at };
  }

  async decrement(key: string): Promise<void> {
    await this.dataSource.query(`UPDATE rate_limit_window SET hits = hits - 1 WHERE key = $1 AND hits > 0 AND resets_at > now()`, [this.prefix + key]);
  }

  async resetKey(key: string): Promise<void> {
    await this.dataSource.query(`DELETE FROM rate_limit_window WHERE key = $1`, [this.prefix + key]);
  }

  private async sweepNowAndThen(): Promise<void> {
    const now = Date.now();
    if (now - this.lastSweep < SWEEP_EVERY_MS) return;
    this.lastSweep = now;
    await this.dataSource.query(`DELETE FROM rate_limit_window WHERE resets_at < now() - interval '1 hour'`);
  }
}
