import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, nullableTimestampColumn, timestampColumn, uuidColumn } from './columns';

/** A password-reset link sent by e-mail; only the hash of its secret is stored, and it works once. */
export interface PasswordReset {
  id: string;
  userId: string;
  tokenHash: string;
  expiresAt: Date;
  usedAt: Date | null;
  createdAt: Date;
}

export const PasswordResetEntity = new EntitySchema<PasswordReset>({
  name: 'PasswordReset',
  tableName: 'password_reset',
  columns: {
    id: idColumn,
    userId: uuidColumn,
    tokenHash: { type: 'varchar', length: 64, unique: true },
    expiresAt: timestampColumn,
    usedAt: nullableTimestampColumn,
    createdAt: timestampColumn,
  },
  foreignKeys: [foreignKey('User', 'userId', 'CASCADE')],
  indices: [{ name: 'IDX_password_reset_user', columns: ['userId'] }],
});
