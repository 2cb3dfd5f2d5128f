import { EntitySchema } from 'typeorm';
import { idColumn, timestampColumn } from './columns';

export interface Club {
  id: string;
  name: string;
  /** Days between a withdrawal of consent and the erasure of the athlete's clips (0: at the next sweep). */
  consentGraceDays: number;
  /** Days clips are kept after their season ends; null keeps them until deleted by hand. */
  retentionDaysAfterSeason: number | null;
  createdAt: Date;
}

export const ClubEntity = new EntitySchema<Club>({
  name: 'Club',
  tableName: 'club',
  columns: {
    id: idColumn,
    name: { type: 'varchar', length: 120 },
    consentGraceDays: { type: 'integer', default: 30 },
    retentionDaysAfterSeason: { type: 'integer', nullable: true, default: 365 },
    createdAt: timestampColumn,
  },
});
