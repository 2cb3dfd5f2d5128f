import { EntitySchema } from 'typeorm';
import type { RecordConsentInput } from '@shared/schemas/athlete.schema';
import {
  foreignKey,
  idColumn,
  nullableTimestampColumn,
  nullableUuidColumn,
  timestampColumn,
  uuidColumn,
} from './columns';

export interface Athlete {
  id: string;
  clubId: string;
  ageGroupId: string;
  /** The sign-in of the athlete themself, once invited. */
  userId: string | null;
  firstName: string;
  lastName: string;
  birthYear: number;
  /** Guardian consent to store video of an under-18 athlete. */
  consentRecordedAt: Date | null;
  consentGuardianName: string | null;
  consentMethod: RecordConsentInput['method'] | null;
  consentRecordedById: string | null;
  /** Consent to send this athlete's reviews by e-mail (a separate purpose from storing clips). */
  consentShareByEmail: boolean;
  /** Consent withdrawn: clips and reviews hidden from all but the head coach, then erased. */
  consentWithdrawnAt: Date | null;
  /** When the withdrawn athlete's clips and reviews are erased (the club's grace period after withdrawal). */
  erasureDueAt: Date | null;
  createdAt: Date;
}

export const AthleteEntity = new EntitySchema<Athlete>({
  name: 'Athlete',
  tableName: 'athlete',
  columns: {
    id: idColumn,
    clubId: uuidColumn,
    ageGroupId: uuidColumn,
    userId: { ...nullableUuidColumn, unique: true },
    firstName: { type: 'varchar', length: 80 },
    lastName: { type: 'varchar', length: 80 },
    birthYear: { type: 'integer' },
    consentRecordedAt: nullableTimestampColumn,
    consentGuardianName: { type: 'varchar', length: 120, nullable: true },
    consentMethod: { type: 'varchar', length: 20, nullable: true },
    consentRecordedById: nullableUuidColumn,
    consentShareByEmail: { type: 'boolean', default: false },
    consentWithdrawnAt: nullableTimestampColumn,
    erasureDueAt: nullableTimestampColumn,
    createdAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Club', 'clubId', 'CASCADE'),
    foreignKey('AgeGroup', 'ageGroupId', 'RESTRICT'),
    foreignKey('User', 'userId', 'SET NULL'),
    foreignKey('User', 'consentRecordedById', 'SET NULL'),
  ],
  indices: [
    { name: 'IDX_athlete_club', columns: ['clubId'] },
    { name: 'IDX_athlete_age_group', columns: ['ageGroupId'] },
    { name: 'IDX_athlete_erasure_due', columns: ['erasureDueAt'] },
  ],
});
