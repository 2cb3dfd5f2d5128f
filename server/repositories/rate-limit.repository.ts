import type { EntityManager } from 'typeorm';

/** Hit counters per key in fixed windows (table rate_limit_hit); times are ISO strings, compared as text. */
export class RateLimitRepository {
  constructor(private readonly manager: EntityManager) {}

  /** Counts one hit; a key whose window has ended starts a new one. One statement, so never a lost hit. */
  async hit(key: string, now: Date, windowMs: number): Promise<{ hits: number; resetAt: Date }> {
    const at = now.toISOString();
    const reset = new Date(now.getTime() + windowMs).toISOString();
    const rows = (await this.manager.query(
      `INSERT INTO "rate_limit_hit" ("key", "hits", "resetAt") VALUES (?, 1, ?)
       ON CONFLICT("key") DO UPDATE SET
         "hits" = CASE WHEN "resetAt" <= ? THEN 1 ELSE "hits" + 1 END,
         "resetAt" = CASE WHEN "resetAt" <= ? THEN excluded."resetAt" ELSE "resetAt" END
       RETURNING "hits", "resetAt"`,
      [key, reset, at, at],
    )) as { hits: number; resetAt: string }[];
    return { hits: rows[0].hits, resetAt: new Date(rows[0].resetAt) };
  }

  async unhit(key: string): Promise<void> {
    await this.manager.query(`UPDATE "rate_limit_hit" SET "hits" = MAX(0, "hits" - 1) WHERE "key" = ?`, [
      key,
    ]);
  }

  async reset(key: string): Promise<void> {
    await this.manager.query(`DELETE FROM "rate_limit_hit" WHERE "key" = ?`, [key]);
  }

  /** Drops counters whose window has ended. */
  async sweep(now: Date): Promise<number> {
    const result = (await this.manager.query(`DELETE FROM "rate_limit_hit" WHERE "resetAt" <= ?`, [
      now.toISOString(),
    ])) as unknown;
    return typeof result === 'number' ? result : 0;
  }
}
