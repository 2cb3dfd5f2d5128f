import { createWriteStream } from 'node:fs';
import fs from 'node:fs/promises';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { setTimeout as sleep } from 'node:timers/promises';
import type { DataSource } from 'typeorm';
import type { Logger } from 'pino';
import type { Clip } from '../entities/clip.entity';
import type { Job } from '../entities/job.entity';
import type { FrameResult } from '../entities/frame-result.entity';
import { UnitOfWork } from '../repositories/unit-of-work';
import type { ObjectStorage } from '../storage/object-storage';
import { runPoseAnalysis, type PoseAnalysisRequest } from '../workers/pose-analysis-pool';
import { FrameStore } from './frame-store';
import { systemClock, type Clock } from './principal';
import { bandService } from './tolerance-band.service';

export interface ServerAnalysisOptions {
  /** Clips analysed at the same time, each in its own worker thread. */
  workers: number;
  /** Scratch folder for the local copies of the videos being read. */
  workDir: string;
  /** Frames handed from the worker and stored per transaction. */
  batchSize?: number;
  /** Rest between batches (a small machine keeps answering requests; tests slow a job down). */
  pauseMs?: number;
  clock?: Clock;
}

/**
 * Analyses clips on the server in the background: one durable `clip-analysis` job per clip and model,
 * at most `workers` at a time, each read by the shared pose detector (Node, WASM) in a worker thread.
 * Each batch of frames is stored by the same FrameStore the browser's batches go through, and the job
 * records the last stored frame; after a crash or restart `resume()` goes on after the last stored
 * frame, so no frame is read or stored twice.
 */
export class ServerAnalysisQueue {
  private readonly uow: UnitOfWork;
  private readonly frames: FrameStore;
  private readonly clock: Clock;
  private readonly running = new Map<string, { stop: AbortController; done: Promise<void> }>();
  private filling: Promise<void> | null = null;
  private again = false;
  private closing = false;
  private wakeTimer: NodeJS.Timeout | null = null;
  private swept = false;

  constructor(
    dataSource: DataSource,
    private readonly storage: ObjectStorage,
    private readonly logger: Logger,
    private readonly options: ServerAnalysisOptions,
  ) {
    this.uow = new UnitOfWork(dataSource);
    this.clock = options.clock ?? systemClock;
    this.frames = new FrameStore(this.uow, bandService(this.uow, this.clock), this.clock);
  }

  /** Starts queued jobs while workers are free (at start: also the ones a stopped process left). */
  resume(): void {
    if (this.closing || this.options.workers < 1) return;
    if (this.filling) {
      this.again = true;
      return;
    }
    this.filling = this.fill()
      .catch((error: unknown) => this.logger.error({ err: error }, 'server analysis stopped'))
      .finally(() => {
        this.filling = null;
        if (this.again && !this.closing) {
          this.again = false;
          this.resume();
        }
      });
  }

  /** Resolves once no analysis is running or waiting (tests and benchmarks). */
  async idle(): Promise<void> {
    for (;;) {
      if (this.filling) await this.filling;
      const current = [...this.running.values()].map((r) => r.done);
      if (current.length === 0) {
        if (this.filling) continue;
        return;
      }
      await Promise.all(current);
    }
  }

  /** Stops the running analyses at once; their jobs stay unfinished and resume at the next start. */
  async close(): Promise<void> {
    this.closing = true;
    if (this.wakeTimer) clearTimeout(this.wakeTimer);
    await this.filling;
    for (const r of this.running.values()) r.stop.abort();
    await Promise.all([...this.running.values()].map((r) => r.done));
  }

  private async fill(): Promise<void> {
    this.again = false;
    if (!this.swept) {
      // Scratch copies a stopped process left: nothing of this queue runs yet.
      this.swept = true;
      if (this.running.size === 0) await fs.rm(this.options.workDir, { recursive: true, force: true });
    }
    const waiting = await this.uow.repos.jobs.unfinished('clip-analysis');
    const now = this.clock.now().getTime();
    let nextHeld = Infinity;
    for (const job of waiting) {
      if (this.closing || this.running.size >= this.options.workers) break;
      if (this.running.has(job.id)) continue;
      // Held while a browser analyses the clip: look again when the hold ends.
      const heldUntil =
        job.status === 'queued' && job.payload.notBefore ? Date.parse(job.payload.notBefore) : 0;
      if (heldUntil > now) {
        nextHeld = Math.min(nextHeld, heldUntil);
        continue;
      }
      const stop = new AbortController();
      const done = this.run(job, stop.signal).finally(() => {
        this.running.delete(job.id);
        this.resume();
      });
      this.running.set(job.id, { stop, done });
    }
    if (Number.isFinite(nextHeld) && !this.closing) {
      if (this.wakeTimer) clearTimeout(this.wakeTimer);
      this.wakeTimer = setTimeout(() => this.resume(), Math.max(50, nextHeld - now + 50));
      this.wakeTimer.unref();
    }
  }

  private async run(queued: Job, signal: AbortSignal): Promise<void> {
    const jobs = this.uow.repos.jobs;
    const model = queued.payload.model;
    const begun = this.clock.now();
    await jobs.update(queued.id, {
      status: 'running',
      startedAt: queued.startedAt ?? begun,
      updatedAt: begun,
    });
    const scratch = path.join(this.options.workDir, queued.id);
    try {
      const clip = queued.clipId ? await this.uow.repos.clips.findById(queued.clipId) : null;
      if (!clip || !model) {
        await this.finish(queued.id, 0);
        return;
      }
      if (clip.status !== 'ready') throw new Error('the clip is not ready; it could not be processed');
      const total = clip.frameCount ?? 0;
      // Where to go on: after this job's last stored batch; on a first run after the frames stored
      // before (by the browser or an earlier run) unless asked to read the clip again from the start.
      const frames = this.uow.repos.frames;
      const last =
        queued.cursor !== null
          ? await frames.findOne(clip.id, model, Number(queued.cursor))
          : queued.payload.fromStart
            ? null
            : await frames.last(clip.id, model);
      const fromFrame = queued.cursor !== null ? Number(queued.cursor) + 1 : last ? last.frameIndex + 1 : 0;
      let done = fromFrame;
      await jobs.update(queued.id, { total, done, updatedAt: this.clock.now() });
      if (total > 0 && fromFrame >= total) {
        await this.finish(queued.id, total);
        return;
      }
      this.logger.info(
        { job: queued.id, clipId: clip.id, model, fromFrame, total },
        'server analysis started',
      );
      await fs.mkdir(scratch, { recursive: true });
      const video = path.join(scratch, 'playable');
      await pipeline(
        await this.storage.getStream(clip.proxyKey ?? clip.storageKey),
        createWriteStream(video),
        { signal },
      );
      const request: PoseAnalysisRequest = {
        path: video,
        model,
        facing: clip.view === 'front' ? clip.facing : 'toward',
        fps: clip.fps,
        fromFrame,
        pick: resumePick(clip, fromFrame, last),
        careful: queued.payload.careful ?? false,
        batchSize: this.options.batchSize ?? 10,
      };
      await runPoseAnalysis(
        request,
        async (batch) => {
          const lastIndex = batch[batch.length - 1].frameIndex;
          const careful = queued.payload.careful ? { careful: true } : {};
          // Read afresh: the coach may have turned the facing meanwhile, and the batch then is swapped.
          const current = (await this.uow.repos.clips.findById(clip.id)) ?? clip;
          const read = { model, ...careful, facing: request.facing, frames: batch };
          await this.frames.storeBatch(current, read, (manager) =>
            this.uow.of(manager).jobs.update(queued.id, {
              done: lastIndex + 1,
              cursor: String(lastIndex),
              updatedAt: this.clock.now(),
            }),
          );
          done = lastIndex + 1;
          if (this.options.pauseMs)
            await sleep(this.options.pauseMs, undefined, { signal }).catch(() => undefined);
        },
        signal,
      );
      await this.finish(queued.id, Math.max(total, done));
      this.logger.info({ job: queued.id, clipId: clip.id, frames: done }, 'server analysis finished');
    } catch (error) {
      // Stopped by a shutdown: the job stays running and resumes after the last stored frame.
      if (this.closing || signal.aborted) return;
      const message = error instanceof Error ? error.message : String(error);
      this.logger.warn({ err: error, job: queued.id }, 'server analysis failed');
      const now = this.clock.now();
      await jobs.update(queued.id, {
        status: 'failed',
        error: message.slice(0, 500),
        finishedAt: now,
        updatedAt: now,
      });
    } finally {
      await fs.rm(scratch, { recursive: true, force: true });
    }
  }

  private async finish(jobId: string, total: number): Promise<void> {
    const now = this.clock.now();
    await this.uow.repos.jobs.update(jobId, {
      status: 'done',
      total,
      done: total,
      finishedAt: now,
      updatedAt: now,
    });
  }
}

/**
 * Whom to follow from `fromFrame`: the coach's pick while it lies ahead; on a resume past it, the
 * athlete where the last stored frame had them (the midpoint of the hips), so the same person is
 * followed on.
 */
export function resumePick(
  clip: Pick<Clip, 'athletePick'>,
  fromFrame: number,
  last: Pick<FrameResult, 'keypoints'> | null,
): PoseAnalysisRequest['pick'] {
  const pick = clip.athletePick;
  if (!pick) return null;
  if (fromFrame <= pick.frameIndex) return { x: pick.x, y: pick.y, frame: pick.frameIndex };
  const hips = (last?.keypoints ?? []).filter((k) => k.name === 'left_hip' || k.name === 'right_hip');
  if (hips.length === 2)
    return { x: (hips[0].x + hips[1].x) / 2, y: (hips[0].y + hips[1].y) / 2, frame: fromFrame };
  return { x: pick.x, y: pick.y, frame: fromFrame };
}
