import { Worker } from 'node:worker_threads';
import type { SeriesFrameInput, SeriesOptions, SeriesResult } from '@shared/series';

interface Pending {
  resolve(result: SeriesResult): void;
  reject(error: Error): void;
}

/** Computes a clip's series; the worker in the app, the same function inline in a unit test. */
export interface SeriesAnalyzer {
  /** The per-frame smoothed values come back only with `withFrames` (they are most of the result). */
  analyze(frames: SeriesFrameInput[], options: SeriesOptions, withFrames?: boolean): Promise<SeriesResult>;
}

let shared: SeriesWorker | null = null;

/** The process's one series worker (every app and store in the process shares it). */
export function sharedSeriesWorker(): SeriesWorker {
  shared ??= new SeriesWorker();
  return shared;
}

const WORKER_URL = new URL('./series.worker.mjs', import.meta.url);

/**
 * One worker thread for series analysis, started on first use: jobs queue in the worker and run one
 * after another, while the main thread goes on answering requests. A crashed worker fails its jobs
 * and the next job starts a new one.
 */
export class SeriesWorker implements SeriesAnalyzer {
  private worker: Worker | null = null;
  private readonly pending = new Map<number, Pending>();
  private nextId = 1;

  analyze(frames: SeriesFrameInput[], options: SeriesOptions, withFrames = false): Promise<SeriesResult> {
    const worker = this.ensure();
    const id = this.nextId++;
    return new Promise<SeriesResult>((resolve, reject) => {
      this.pending.set(id, { resolve, reject });
      // Referenced while it has work, so a script waiting for a result is not ended under it.
      worker.ref();
      worker.postMessage({ id, frames, options, withFrames });
    });
  }

  async close(): Promise<void> {
    const worker = this.worker;
    this.worker = null;
    if (worker) await worker.terminate();
  }

  private ensure(): Worker {
    if (this.worker) return this.worker;
    // The entry registers tsx in the thread, then loads the TypeScript worker.
    const worker = new Worker(WORKER_URL);
    worker.on('message', (message: { id: number; result?: SeriesResult; error?: string }) => {
      const job = this.pending.get(message.id);
      if (!job) return;
      this.pending.delete(message.id);
      if (this.pending.size === 0) worker.unref();
      if (message.error !== undefined) job.reject(new Error(message.error));
      else job.resolve(message.result!);
    });
    const failAll = (error: Error) => {
      if (this.worker === worker) this.worker = null;
      for (const job of this.pending.values()) job.reject(error);
      this.pending.clear();
    };
    worker.on('error', failAll);
    worker.on('exit', (code) => {
      if (code !== 0) failAll(new Error(`the series worker stopped (exit code ${code})`));
      else if (this.worker === worker) this.worker = null;
    });
    // Idle, it must not keep the process alive.
    worker.unref();
    this.worker = worker;
    return worker;
  }
}
