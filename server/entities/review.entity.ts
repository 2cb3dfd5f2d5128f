import { EntitySchema } from 'typeorm';
import {
  foreignKey,
  idColumn,
  nullableTimestampColumn,
  nullableUuidColumn,
  timestampColumn,
  uuidColumn,
} from './columns';

/** A coach's review of a clip for one athlete; shared by e-mail once published. */
export interface Review {
  id: string;
  clipId: string;
  athleteId: string;
  createdById: string | null;
  title: string;
  summary: string | null;
  publishedAt: Date | null;
  /** SHA-256 of the share link token; the token itself is only ever in the e-mail. */
  shareTokenHash: string | null;
  createdAt: Date;
}

export const ReviewEntity = new EntitySchema<Review>({
  name: 'Review',
  tableName: 'review',
  columns: {
    id: idColumn,
    clipId: uuidColumn,
    athleteId: uuidColumn,
    createdById: nullableUuidColumn,
    title: { type: 'varchar', length: 200 },
    summary: { type: 'text', nullable: true },
    publishedAt: nullableTimestampColumn,
    shareTokenHash: { type: 'varchar', length: 64, nullable: true, unique: true },
    createdAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Clip', 'clipId', 'CASCADE'),
    foreignKey('Athlete', 'athleteId', 'CASCADE'),
    foreignKey('User', 'createdById', 'SET NULL'),
  ],
  indices: [{ name: 'IDX_review_athlete', columns: ['athleteId'] }],
});
