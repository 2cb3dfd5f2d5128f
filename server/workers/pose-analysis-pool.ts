import { Worker } from 'node:worker_threads';
import type { Keypoint, PoseModelName, SkierFacing } from '@shared/keypoints';

export interface PoseAnalysisRequest {
  /** A local copy of the clip's playable video. */
  path: string;
  model: PoseModelName;
  facing: SkierFacing;
  fps: number | null;
  /** Resume here (frames before it are stored already). */
  fromFrame: number;
  /** Follow this athlete from this frame on (pixels of the original frame). */
  pick: { x: number; y: number; frame: number } | null;
  /** Read each frame with its mirror image too. */
  careful?: boolean;
  batchSize: number;
}

export type PoseAnalysisMessage =
  | { type: 'frames'; frames: { frameIndex: number; timeMs: number; keypoints: Keypoint[] }[] }
  | { type: 'done' }
  | { type: 'error'; message: string };

const WORKER_URL = new URL('./pose-analysis.worker.mjs', import.meta.url);

/**
 * Runs one clip's detection in its own worker thread and hands each batch of frames to `onFrames`,
 * one at a time, in order (the next batch waits until the last is stored). Resolves when the clip is
 * read; rejects with the worker's message (an undecodable video says what is wrong). `signal` stops the
 * thread at once: frames not yet handed over are simply read again on resume.
 */
export function runPoseAnalysis(
  request: PoseAnalysisRequest,
  onFrames: (frames: Extract<PoseAnalysisMessage, { type: 'frames' }>['frames']) => Promise<void>,
  signal: AbortSignal,
): Promise<void> {
  return new Promise<void>((resolve, reject) => {
    const worker = new Worker(WORKER_URL, { workerData: request });
    let chain = Promise.resolve();
    let settled = false;
    const finish = (error?: Error) => {
      if (settled) return;
      settled = true;
      signal.removeEventListener('abort', abort);
      void worker.terminate();
      if (error) reject(error);
      else resolve();
    };
    const abort = () => finish(new Error('stopped'));
    signal.addEventListener('abort', abort, { once: true });
    worker.on('message', (message: PoseAnalysisMessage) => {
      if (message.type === 'frames') {
        chain = chain.then(() => (settled ? undefined : onFrames(message.frames)));
        chain.catch((error: Error) => finish(error));
      } else if (message.type === 'done') chain.then(() => finish(), finish);
      else chain.then(() => finish(new Error(message.message)), finish);
    });
    worker.on('error', (error) => finish(error));
    worker.on('exit', (code) => {
      if (code !== 0) finish(new Error(`the analysis worker stopped (exit code ${code})`));
    });
    if (signal.aborted) abort();
  });
}
