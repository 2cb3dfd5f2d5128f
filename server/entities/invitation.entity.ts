import { EntitySchema } from 'typeorm';
import type { Role } from '@shared/schemas/auth.schema';
import {
  foreignKey,
  idColumn,
  nullableTimestampColumn,
  nullableUuidColumn,
  timestampColumn,
  uuidColumn,
} from './columns';

export interface Invitation {
  id: string;
  clubId: string;
  email: string;
  role: Role;
  athleteId: string | null;
  ageGroupIds: string[];
  /** SHA-256 of the token in the e-mailed link. */
  tokenHash: string;
  invitedById: string | null;
  expiresAt: Date;
  acceptedAt: Date | null;
  createdAt: Date;
}

export const InvitationEntity = new EntitySchema<Invitation>({
  name: 'Invitation',
  tableName: 'invitation',
  columns: {
    id: idColumn,
    clubId: uuidColumn,
    email: { type: 'varchar', length: 254 },
    role: { type: 'varchar', length: 20 },
    athleteId: nullableUuidColumn,
    ageGroupIds: { type: 'simple-json' },
    tokenHash: { type: 'varchar', length: 64, unique: true },
    invitedById: nullableUuidColumn,
    expiresAt: timestampColumn,
    acceptedAt: nullableTimestampColumn,
    createdAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Club', 'clubId', 'CASCADE'),
    foreignKey('Athlete', 'athleteId', 'CASCADE'),
    foreignKey('User', 'invitedById', 'SET NULL'),
  ],
  indices: [{ name: 'IDX_invitation_email', columns: ['email'] }],
});
