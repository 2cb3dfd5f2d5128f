import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, nullableTimestampColumn, timestampColumn, uuidColumn } from './columns';

/** One issued refresh cookie; only its hash is stored. Rotation revokes the old row. */
export interface RefreshToken {
  id: string;
  userId: string;
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
    tokenHash: { type: 'varchar', length: 64, unique: true },
    expiresAt: timestampColumn,
    revokedAt: nullableTimestampColumn,
    createdAt: timestampColumn,
  },
  foreignKeys: [foreignKey('User', 'userId', 'CASCADE')],
  indices: [{ name: 'IDX_refresh_token_user', columns: ['userId'] }],
});
