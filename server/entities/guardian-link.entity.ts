import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, timestampColumn, uuidColumn } from './columns';

export interface GuardianLink {
  id: string;
  guardianUserId: string;
  athleteId: string;
  createdAt: Date;
}

export const GuardianLinkEntity = new EntitySchema<GuardianLink>({
  name: 'GuardianLink',
  tableName: 'guardian_link',
  columns: {
    id: idColumn,
    guardianUserId: uuidColumn,
    athleteId: uuidColumn,
    createdAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('User', 'guardianUserId', 'CASCADE'),
    foreignKey('Athlete', 'athleteId', 'CASCADE'),
  ],
  uniques: [{ name: 'UQ_guardian_link_pair', columns: ['guardianUserId', 'athleteId'] }],
  indices: [{ name: 'IDX_guardian_link_athlete', columns: ['athleteId'] }],
});
