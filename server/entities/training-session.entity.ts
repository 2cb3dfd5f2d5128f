import { EntitySchema } from 'typeorm';
import type { DISCIPLINES, SNOW_CONDITIONS } from '@shared/schemas/session.schema';
import { foreignKey, idColumn, nullableUuidColumn, timestampColumn, uuidColumn } from './columns';

export interface TrainingSession {
  id: string;
  clubId: string;
  /** Calendar date, YYYY-MM-DD. */
  date: string;
  venue: string;
  discipline: (typeof DISCIPLINES)[number];
  snow: (typeof SNOW_CONDITIONS)[number];
  notes: string | null;
  createdById: string | null;
  createdAt: Date;
}

export const TrainingSessionEntity = new EntitySchema<TrainingSession>({
  name: 'TrainingSession',
  tableName: 'training_session',
  columns: {
    id: idColumn,
    clubId: uuidColumn,
    date: { type: 'varchar', length: 10 },
    venue: { type: 'varchar', length: 120 },
    discipline: { type: 'varchar', length: 20 },
    snow: { type: 'varchar', length: 20 },
    notes: { type: 'text', nullable: true },
    createdById: nullableUuidColumn,
    createdAt: timestampColumn,
  },
  foreignKeys: [foreignKey('Club', 'clubId', 'CASCADE'), foreignKey('User', 'createdById', 'SET NULL')],
  indices: [{ name: 'IDX_training_session_club_date', columns: ['clubId', 'date'] }],
});
