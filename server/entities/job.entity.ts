import { EntitySchema } from 'typeorm';
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
export interface Job {
  id: string;
  kind: 'flag-reevaluation';
  clubId: string | null;
  /** What the job covers, e.g. { ageGroupIds } (null: every age group). */
  payload: { ageGroupIds: string[] | null };
  label: string;
  status: 'queued' | 'running' | 'done' | 'failed';
  total: number;
  done: number;
  /** The last step finished ("clipId:model"); steps run in that order. */
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
  foreignKeys: [foreignKey('Club', 'clubId', 'CASCADE'), foreignKey('User', 'createdById', 'SET NULL')],
  indices: [{ name: 'IDX_job_status', columns: ['status', 'createdAt'] }],
});
