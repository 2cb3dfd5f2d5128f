import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, timestampColumn, uuidColumn } from './columns';

export interface GuardianLink {
  id: string;
  guardianUserId: string;
  athleteId: string;
  /** An adult athlete chose to keep this guardian's access (from 18 the athlete decides). */
  keptByAthleteAt: Date | null;
  createdAt: Date;
}

export const GuardianLinkEntity = new EntitySchema<GuardianLink>({
  name: 'GuardianLink',
  tableName: 'guardian_link',
  columns: {
    id: idColumn,
    guardianUserId: uuidColumn,
    athleteId: uuidColumn,
    keptByAthleteAt: { type: 'datetime', nullable: true },
    createdAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('User', 'guardianUserId', 'CASCADE'),
    foreignKey('Athlete', 'athleteId', 'CASCADE'),
  ],
  uniques: [{ name: 'UQ_guardian_link_pair', columns: ['guardianUserId', 'athleteId'] }],
  indices: [{ name: 'IDX_guardian_link_athlete', columns: ['athleteId'] }],
});
