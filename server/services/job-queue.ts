import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { JobDto } from '@shared/schemas/tolerance.schema';
import type { Job } from '../entities/job.entity';
import type { UnitOfWork } from '../repositories/unit-of-work';

export function toJobDto(job: Job): JobDto {
  return {
    id: job.id,
    kind: job.kind,
    status: job.status,
    total: job.total,
    done: Math.min(job.done, job.total),
    label: job.label,
    error: job.error,
    createdAt: job.createdAt.toISOString(),
    finishedAt: job.finishedAt?.toISOString() ?? null,
  };
}

/**
 * Queues a re-evaluation of the club's flags for these age groups (null: all), in the caller's
 * transaction, so a band change and its job are stored together. A job of the club still waiting
 * to start takes the new groups instead of a second job being queued.
 */
export async function queueFlagReevaluation(
  uow: UnitOfWork,
  manager: EntityManager,
  request: {
    clubId: string;
    ageGroupIds: string[] | null;
    label: string;
    createdById: string | null;
    now: Date;
  },
): Promise<Job> {
  const jobs = uow.of(manager).jobs;
  const waiting = await jobs.queuedForClub(request.clubId);
  if (waiting) {
    const groups =
      waiting.payload.ageGroupIds === null || request.ageGroupIds === null
        ? null
        : [...new Set([...waiting.payload.ageGroupIds, ...request.ageGroupIds])];
    const label = waiting.label.includes(request.label)
      ? waiting.label
      : `${waiting.label}; ${request.label}`;
    const patch = { payload: { ageGroupIds: groups }, label: label.slice(0, 200), updatedAt: request.now };
    await jobs.update(waiting.id, patch);
    return { ...waiting, ...patch };
  }
  const job: Job = {
    id: randomUUID(),
    kind: 'flag-reevaluation',
    clubId: request.clubId,
    payload: { ageGroupIds: request.ageGroupIds },
    label: request.label.slice(0, 200),
    status: 'queued',
    total: 0,
    done: 0,
    cursor: null,
    error: null,
    createdById: request.createdById,
    createdAt: request.now,
    startedAt: null,
    finishedAt: null,
    updatedAt: request.now,
  };
  await jobs.insert(job);
  return job;
}
