import { EntitySchema } from 'typeorm';
import type { Role } from '@shared/schemas/auth.schema';
import { idColumn, foreignKey, nullableTimestampColumn, timestampColumn, uuidColumn } from './columns';

export interface User {
  id: string;
  clubId: string;
  email: string;
  name: string;
  role: Role;
  /** Null until the member accepts an invitation and sets a password. */
  passwordHash: string | null;
  /** Bumped on logout-everywhere or password change; access tokens carry it. */
  tokenVersion: number;
  lastSignInAt: Date | null;
  createdAt: Date;
}

export const UserEntity = new EntitySchema<User>({
  name: 'User',
  tableName: 'user',
  columns: {
    id: idColumn,
    clubId: uuidColumn,
    email: { type: 'varchar', length: 254, unique: true },
    name: { type: 'varchar', length: 120 },
    role: { type: 'varchar', length: 20 },
    passwordHash: { type: 'varchar', length: 100, nullable: true },
    tokenVersion: { type: 'integer', default: 0 },
    lastSignInAt: nullableTimestampColumn,
    createdAt: timestampColumn,
  },
  foreignKeys: [foreignKey('Club', 'clubId', 'CASCADE')],
  indices: [{ name: 'IDX_user_club', columns: ['clubId'] }],
});
