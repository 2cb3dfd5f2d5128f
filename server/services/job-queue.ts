import { randomUUID } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import type { JobDto } from '@shared/schemas/tolerance.schema';
import type { PoseModelName } from '@shared/keypoints';
import type { Clip } from '../entities/clip.entity';
import type { Job } from '../entities/job.entity';
import type { JobRepository } from '../repositories/job.repository';
import { UnitOfWork } from '../repositories/unit-of-work';

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
      !waiting.payload.ageGroupIds || request.ageGroupIds === null
        ? null
        : [...new Set([...waiting.payload.ageGroupIds, ...request.ageGroupIds])];
    const label = waiting.label.includes(request.label)
      ? waiting.label
      : `${waiting.label}; ${request.label}`;
    const patch = { payload: { ageGroupIds: groups }, label: label.slice(0, 200), updatedAt: request.now };
    await jobs.update(waiting.id, patch);
    return { ...waiting, ...patch };
  }
  return insertQueuedJob(jobs, {
    kind: 'flag-reevaluation',
    clubId: request.clubId,
    clipId: null,
    payload: { ageGroupIds: request.ageGroupIds },
    label: request.label,
    total: 0,
    createdById: request.createdById,
    now: request.now,
  });
}

/** Stores a new job waiting to start (nothing done, no cursor); the label is cut to its column. */
async function insertQueuedJob(
  jobs: JobRepository,
  fields: Pick<Job, 'kind' | 'clubId' | 'clipId' | 'payload' | 'label' | 'total' | 'createdById'> & {
    now: Date;
  },
): Promise<Job> {
  const { now, ...rest } = fields;
  const job: Job = {
    ...rest,
    id: randomUUID(),
    label: fields.label.slice(0, 200),
    status: 'queued',
    done: 0,
    cursor: null,
    error: null,
    createdAt: now,
    startedAt: null,
    finishedAt: null,
    updatedAt: now,
  };
  await jobs.insert(job);
  return job;
}

/**
 * Queues a server-side analysis of a clip with a model, unless one is queued or running already (that
 * one is returned). Frames stored before (by the browser or an earlier run) are not read again.
 */
export async function queueClipAnalysis(
  uow: UnitOfWork,
  manager: EntityManager,
  request: {
    clip: Clip;
    model: PoseModelName;
    createdById: string | null;
    now: Date;
    fromStart?: boolean;
    careful?: boolean;
    /** Wait until then before starting (a browser analysing the clip holds it). */
    notBefore?: Date;
  },
): Promise<Job> {
  const jobs = uow.of(manager).jobs;
  const current = (await jobs.latestAnalyses([request.clip.id])).get(request.clip.id);
  if (
    current &&
    current.payload.model === request.model &&
    (current.payload.careful ?? false) === (request.careful ?? false) &&
    (current.status === 'queued' || current.status === 'running')
  )
    return current;
  return insertQueuedJob(jobs, {
    kind: 'clip-analysis',
    clubId: request.clip.clubId,
    clipId: request.clip.id,
    payload: {
      model: request.model,
      ...(request.fromStart ? { fromStart: true } : {}),
      ...(request.careful ? { careful: true } : {}),
      ...(request.notBefore ? { notBefore: request.notBefore.toISOString() } : {}),
    },
    label: `Pose analysis of ${request.clip.originalName}`,
    total: request.clip.frameCount ?? 0,
    createdById: request.createdById,
    now: request.now,
  });
}

/** Queues the server analysis of a clip that just became ready, with its default model. */
export async function queueAnalysisOfReadyClip(dataSource: DataSource, clipId: string): Promise<boolean> {
  const uow = new UnitOfWork(dataSource);
  return uow.transaction(async (manager) => {
    const clip = await uow.of(manager).clips.findById(clipId);
    if (!clip || clip.status !== 'ready') return false;
    await queueClipAnalysis(uow, manager, {
      clip,
      model: clip.defaultModel,
      createdById: clip.uploadedById ?? null,
      now: new Date(),
    });
    return true;
  });
}
