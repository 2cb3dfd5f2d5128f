import { EntitySchema } from 'typeorm';
import { timestampColumn } from './columns';

/**
 * Attempts counted against one rate-limit key in its current window. Kept in the database so every
 * server process on it counts the same attempts (and a restart does not hand out fresh tries).
 */
export interface RateLimitHit {
  key: string;
  hits: number;
  resetAt: Date;
}

export const RateLimitHitEntity = new EntitySchema<RateLimitHit>({
  name: 'RateLimitHit',
  tableName: 'rate_limit_hit',
  columns: {
    key: { type: 'varchar', length: 400, primary: true },
    hits: { type: 'integer' },
    resetAt: timestampColumn,
  },
});
