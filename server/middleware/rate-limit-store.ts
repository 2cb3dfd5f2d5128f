import type { Options, Store } from 'express-rate-limit';
import type { UnitOfWork } from '../repositories/unit-of-work';
import type { Clock } from '../services/principal';

/**
 * An express-rate-limit store in the database: every server process on the same database counts the
 * same attempts, and a restart hands out no fresh tries.
 */
export class DatabaseRateLimitStore implements Store {
  private windowMs = 60_000;
  private sinceSweep = 0;

  constructor(
    private readonly uow: UnitOfWork,
    private readonly clock: Clock,
    readonly prefix: string,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async increment(key: string) {
    const now = this.clock.now();
    // Old counters are dropped now and then, so the table holds only live windows.
    if (++this.sinceSweep >= 200) {
      this.sinceSweep = 0;
      await this.uow.repos.rateLimits.sweep(now);
    }
    const { hits, resetAt } = await this.uow.repos.rateLimits.hit(`${this.prefix}${key}`, now, this.windowMs);
    return { totalHits: hits, resetTime: resetAt };
  }

  async decrement(key: string): Promise<void> {
    await this.uow.repos.rateLimits.unhit(`${this.prefix}${key}`);
  }

  async resetKey(key: string): Promise<void> {
    await this.uow.repos.rateLimits.reset(`${this.prefix}${key}`);
  }
}
