import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, nullableTimestampColumn, timestampColumn, uuidColumn } from './columns';

/**
 * One issued refresh cookie; only its hash is stored. Rotation revokes the old row and issues a new one
 * in the same session: access and media tokens name the session, and stop working once it has ended.
 */
export interface RefreshToken {
  id: string;
  userId: string;
  /** The sign-in this token belongs to; kept across rotations. */
  sessionId: string;
  tokenHash: string;
  expiresAt: Date;
  revokedAt: Date | null;
  createdAt: Date;
}

export const RefreshTokenEntity = new EntitySchema<RefreshToken>({
  name: 'RefreshToken',
  tableName: 'refresh_token',
  columns: {
    id: idColumn,
    userId: uuidColumn,
    sessionId: uuidColumn,
    tokenHash: { type: 'varchar', length: 64, unique: true },
    expiresAt: timestampColumn,
    revokedAt: nullableTimestampColumn,
    createdAt: timestampColumn,
  },
  foreignKeys: [foreignKey('User', 'userId', 'CASCADE')],
  indices: [
    { name: 'IDX_refresh_token_user', columns: ['userId'] },
    { name: 'IDX_refresh_token_session', columns: ['sessionId'] },
  ],
});
