import { EntitySchema } from 'typeorm';
import type { ReviewOverlays, ReviewStatus } from '@shared/schemas/review.schema';
import {
  foreignKey,
  idColumn,
  nullableTimestampColumn,
  nullableUuidColumn,
  timestampColumn,
  uuidColumn,
} from './columns';

/** A coach's review of a clip for one athlete: a draft until published, withdrawn by unpublishing. */
export interface Review {
  id: string;
  clubId: string;
  clipId: string;
  athleteId: string;
  createdById: string | null;
  title: string;
  summary: string;
  status: ReviewStatus;
  /** What the athlete sees drawn on the clip. */
  overlays: ReviewOverlays;
  /** The baseline clip the athlete can play beside this one, in step by turn; null for none. */
  compareClipId: string | null;
  /** Show the whole-clip curves on the athlete's page (off unless the coach chooses them). */
  showCurves: boolean;
  publishedAt: Date | null;
  withdrawnAt: Date | null;
  /** How many times it has been published (a corrected review is published again). */
  publishCount: number;
  createdAt: Date;
  updatedAt: Date;
}

export const ReviewEntity = new EntitySchema<Review>({
  name: 'Review',
  tableName: 'review',
  columns: {
    id: idColumn,
    clubId: uuidColumn,
    clipId: uuidColumn,
    athleteId: uuidColumn,
    createdById: nullableUuidColumn,
    title: { type: 'varchar', length: 120 },
    summary: { type: 'text', default: '' },
    status: { type: 'varchar', length: 10, default: 'draft' },
    overlays: { type: 'simple-json' },
    compareClipId: nullableUuidColumn,
    showCurves: { type: 'boolean', default: false },
    publishedAt: nullableTimestampColumn,
    withdrawnAt: nullableTimestampColumn,
    publishCount: { type: 'integer', default: 0 },
    createdAt: timestampColumn,
    updatedAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Club', 'clubId', 'CASCADE'),
    foreignKey('Clip', 'clipId', 'CASCADE'),
    foreignKey('Athlete', 'athleteId', 'CASCADE'),
    foreignKey('User', 'createdById', 'SET NULL'),
    foreignKey('Clip', 'compareClipId', 'SET NULL'),
  ],
  indices: [
    { name: 'IDX_review_athlete_status', columns: ['athleteId', 'status'] },
    { name: 'IDX_review_clip', columns: ['clipId'] },
  ],
});
