import fs from 'node:fs/promises';
import fastq, { type queueAsPromised } from 'fastq';
import { MediaJobAborted } from './ffmpeg-run';
import { processClip, type ClipProcessorDeps } from './clip-processor';
import { repositoriesFor } from '../repositories/unit-of-work';

/**
 * Clips are processed one at a time, in the order they arrived, by ffmpeg child processes, so the
 * API answers while a clip encodes. In-process: a restart resumes whatever was left unfinished.
 */
export class ClipProcessingQueue {
  private readonly queue: queueAsPromised<string, void>;
  private readonly waiting = new Set<string>();
  private readonly stop = new AbortController();
  private running: Promise<void> | null = null;
  private closed = false;

  constructor(private readonly deps: ClipProcessorDeps) {
    this.queue = fastq.promise((clipId: string) => this.work(clipId), 1);
  }

  /** Queues a clip (a clip already waiting is not queued twice). */
  enqueue(clipId: string): void {
    if (this.closed || this.waiting.has(clipId)) return;
    this.waiting.add(clipId);
    this.queue.push(clipId).catch((error: unknown) => {
      if (!(error instanceof MediaJobAborted))
        this.deps.logger.error({ err: error, clipId }, 'media job crashed');
    });
  }

  /** Picks up clips a previous run left uploaded or half processed. Returns how many were queued. */
  async resume(): Promise<number> {
    // Scratch folders of jobs a crash interrupted; nothing of this queue is running yet.
    if (this.queue.idle() && !this.running) await fs.rm(this.deps.workDir, { recursive: true, force: true });
    const ids = await repositoriesFor(this.deps.dataSource.manager).clipMedia.idsWithStatus([
      'uploaded',
      'processing',
    ]);
    for (const id of ids) this.enqueue(id);
    return ids.length;
  }

  /** Resolves when nothing is queued or running. */
  async idle(): Promise<void> {
    if (this.queue.idle()) return;
    await this.queue.drained();
  }

  get pending(): number {
    return this.waiting.size;
  }

  /** Stops taking work, kills a running ffmpeg and waits for the job to wind down. */
  async close(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    this.queue.kill();
    this.stop.abort();
    await this.running?.catch(() => undefined);
  }

  private async work(clipId: string): Promise<void> {
    if (this.closed) return;
    this.running = processClip(this.deps, clipId, this.stop.signal);
    try {
      await this.running;
    } finally {
      this.running = null;
      this.waiting.delete(clipId);
    }
  }
}
