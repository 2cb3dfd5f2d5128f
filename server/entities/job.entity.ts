import { EntitySchema } from 'typeorm';
import type { PoseModelName } from '@shared/keypoints';
import {
  foreignKey,
  idColumn,
  nullableTimestampColumn,
  nullableUuidColumn,
  timestampColumn,
} from './columns';

/**
 * Background work that must finish even across a restart. The cursor and the counts are written in
 * the same transaction as each step's results, so a step is done once or not at all.
 */
export type JobKind = 'flag-reevaluation' | 'clip-analysis';

/**
 * flag-reevaluation: { ageGroupIds } (null: every age group). clip-analysis: { model }, the clip in
 * `clipId`.
 */
export interface JobPayload {
  ageGroupIds?: string[] | null;
  model?: PoseModelName;
  /** clip-analysis: read every frame again, not only those after the stored ones. */
  fromStart?: boolean;
  /** clip-analysis: not before this time (ISO); a browser analysing the clip keeps pushing it on. */
  notBefore?: string;
  /** clip-analysis: read each frame with its mirror image too. */
  careful?: boolean;
}

export interface Job {
  id: string;
  kind: JobKind;
  clubId: string | null;
  /** The clip a clip-analysis job reads (erasing the clip removes the job). */
  clipId: string | null;
  payload: JobPayload;
  label: string;
  status: 'queued' | 'running' | 'done' | 'failed';
  total: number;
  done: number;
  /** The last step finished ("clipId:model", or a clip-analysis job's last stored frame); steps run in that order. */
  cursor: string | null;
  error: string | null;
  createdById: string | null;
  createdAt: Date;
  startedAt: Date | null;
  finishedAt: Date | null;
  updatedAt: Date;
}

export const JobEntity = new EntitySchema<Job>({
  name: 'Job',
  tableName: 'job',
  columns: {
    id: idColumn,
    kind: { type: 'varchar', length: 30 },
    clubId: nullableUuidColumn,
    clipId: nullableUuidColumn,
    payload: { type: 'simple-json' },
    label: { type: 'varchar', length: 200 },
    status: { type: 'varchar', length: 10 },
    total: { type: 'integer', default: 0 },
    done: { type: 'integer', default: 0 },
    cursor: { type: 'varchar', length: 80, nullable: true },
    error: { type: 'text', nullable: true },
    createdById: nullableUuidColumn,
    createdAt: { type: 'datetime' },
    startedAt: nullableTimestampColumn,
    finishedAt: nullableTimestampColumn,
    updatedAt: timestampColumn,
  },
  foreignKeys: [
    foreignKey('Club', 'clubId', 'CASCADE'),
    foreignKey('Clip', 'clipId', 'CASCADE'),
    foreignKey('User', 'createdById', 'SET NULL'),
  ],
  indices: [
    { name: 'IDX_job_status', columns: ['status', 'createdAt'] },
    { name: 'IDX_job_clip', columns: ['clipId', 'createdAt'] },
  ],
});
