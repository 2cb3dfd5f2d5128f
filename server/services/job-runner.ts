import { setTimeout as sleep } from 'node:timers/promises';
import type { DataSource } from 'typeorm';
import type { PoseModelName } from '@shared/keypoints';
import type { Job } from '../entities/job.entity';
import type { Logger } from 'pino';
import { UnitOfWork } from '../repositories/unit-of-work';
import { FrameStore } from './frame-store';
import { systemClock, type Clock } from './principal';
import { bandService } from './tolerance-band.service';

interface Step {
  key: string;
  clipId: string;
  model: PoseModelName;
  frames: number;
}

/**
 * Runs the durable background jobs of one database, oldest first, one at a time. A job is split into
 * steps (one clip and model each) in a fixed order; each step's results and the job's cursor are
 * written in one transaction, so after a crash or restart `resume()` goes on after the last finished
 * step and nothing is done twice.
 */
export class JobRunner {
  private readonly uow: UnitOfWork;
  private readonly frames: FrameStore;
  private readonly clock: Clock;
  private loop: Promise<void> | null = null;
  private again = false;
  private closing = false;

  constructor(
    dataSource: DataSource,
    private readonly logger: Logger,
    private readonly options: { pauseMs?: number; clock?: Clock } = {},
  ) {
    this.uow = new UnitOfWork(dataSource);
    this.clock = options.clock ?? systemClock;
    this.frames = new FrameStore(this.uow, bandService(this.uow, this.clock), this.clock);
  }

  /** Starts working through unfinished jobs (at start: the ones a stopped process left). */
  resume(): void {
    if (this.closing) return;
    if (this.loop) {
      this.again = true;
      return;
    }
    this.loop = this.drain()
      .catch((error: unknown) => this.logger.error({ err: error }, 'background jobs stopped'))
      .finally(() => {
        this.loop = null;
        if (this.again && !this.closing) {
          this.again = false;
          this.resume();
        }
      });
  }

  /** Resolves once no job is running or waiting (tests and benchmarks). */
  async idle(): Promise<void> {
    while (this.loop) await this.loop;
  }

  /** Stops after the step in progress; the job stays unfinished and resumes at the next start. */
  async close(): Promise<void> {
    this.closing = true;
    await this.loop;
  }

  private async drain(): Promise<void> {
    for (;;) {
      this.again = false;
      const [next] = await this.uow.repos.jobs.unfinished('flag-reevaluation');
      if (!next || this.closing) return;
      await this.run(next);
      if (this.closing) return;
    }
  }

  private async run(queued: Job): Promise<void> {
    const jobs = this.uow.repos.jobs;
    let job = queued;
    try {
      // Marked running before its groups are read: a band change queued meanwhile either joined this
      // job in time (and is read now) or finds it running and queues a job of its own.
      const begun = this.clock.now();
      await jobs.update(job.id, { status: 'running', startedAt: job.startedAt ?? begun, updatedAt: begun });
      job = (await jobs.findById(job.id)) ?? job;
      const steps = await this.steps(job);
      const total = steps.reduce((sum, s) => sum + s.frames, 0);
      let done = steps
        .filter((s) => job.cursor !== null && s.key <= job.cursor)
        .reduce((n, s) => n + s.frames, 0);
      const now = this.clock.now();
      await jobs.update(job.id, {
        status: 'running',
        total,
        done,
        startedAt: job.startedAt ?? now,
        updatedAt: now,
      });
      this.logger.info({ job: job.id, label: job.label, steps: steps.length, frames: total }, 'job started');
      for (const step of steps) {
        if (job.cursor !== null && step.key <= job.cursor) continue;
        if (this.closing) return;
        const clip = await this.uow.repos.clips.findById(step.clipId);
        const progress = { cursor: step.key, done: done + step.frames };
        // A clip deleted since the job was planned is a step with nothing to judge.
        if (clip)
          await this.frames.reevaluate(clip, step.model, (manager) =>
            this.uow.of(manager).jobs.update(job.id, { ...progress, updatedAt: this.clock.now() }),
          );
        else await jobs.update(job.id, progress);
        done += step.frames;
        // Let waiting requests in between steps (and, if set, rest a little on a small machine).
        await (this.options.pauseMs ? sleep(this.options.pauseMs) : new Promise((r) => setImmediate(r)));
      }
      const finished = this.clock.now();
      await jobs.update(job.id, { status: 'done', done: total, finishedAt: finished, updatedAt: finished });
      this.logger.info({ job: job.id, frames: total }, 'job finished');
    } catch (error) {
      if (this.closing) return;
      this.logger.error({ err: error, job: job.id }, 'job failed');
      const now = this.clock.now();
      await jobs.update(job.id, {
        status: 'failed',
        error: error instanceof Error ? error.message : String(error),
        finishedAt: now,
        updatedAt: now,
      });
    }
  }

  /** Every clip and model with stored frames that the job covers, in a fixed order. */
  private async steps(job: Job): Promise<Step[]> {
    if (!job.clubId) return [];
    const clipIds = await this.uow.repos.clips.idsInAgeGroups(job.clubId, job.payload.ageGroupIds ?? null);
    const counts = await this.uow.repos.frames.framesPerClipModel(clipIds);
    return counts.map((c) => ({
      key: `${c.clipId}:${c.model}`,
      clipId: c.clipId,
      model: c.model,
      frames: c.frames,
    }));
  }
}
