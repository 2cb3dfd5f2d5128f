import type {
  AthletePick,
  Keypoint,
  PoseModelName,
  ReferenceLine,
  SkierFacing,
  View,
} from '@shared/keypoints';
import { MAX_FRAMES_PER_BATCH } from '@shared/schemas/frames.schema';
import type { FrameUpload, PostClipFramesInput, PostClipFramesResponse } from '../../api/post-clip-frames';
import { frameStartMs } from '../../lib/frame-time';
import { ANALYSIS_BATCH_SIZE, chunk, EtaEstimator } from './analysis-plan';

export interface DetectRequest {
  frameIndex: number;
  timeMs: number;
  model: PoseModelName;
  view: View;
  referenceLine?: ReferenceLine | null;
  facing?: SkierFacing;
  follow?: { pick: { x: number; y: number } } | { next: true } | null;
  careful?: boolean;
}

export interface WholeClipDeps<F> {
  /** Decodes one frame of the clip (a hidden video element in the browser). */
  grab(frameIndex: number, signal: AbortSignal): Promise<F>;
  detect(frame: F, req: DetectRequest): Promise<{ keypoints: Keypoint[] }>;
  postBatch(input: PostClipFramesInput, signal?: AbortSignal): Promise<PostClipFramesResponse>;
  /** Monotonic milliseconds (performance.now in the browser). */
  now(): number;
  /** Frees a grabbed frame that will not be detected (the run stopped first). */
  discard?(frame: F): void;
}

export interface WholeClipPlan {
  frames: number[];
  fps: number;
  model: PoseModelName;
  view: View;
  referenceLine: ReferenceLine | null;
  /** Front view filmed from behind: left and right swapped back (absent: toward the camera). */
  facing?: SkierFacing;
  /**
   * The athlete picked among several people: the run starts at the pick's frame (the plan's first)
   * and follows them from there; absent: whoever the model finds in each frame.
   */
  pick?: AthletePick | null;
  /** Read each frame with its mirror image too (about twice the passes, four on whole frames). */
  careful?: boolean;
}

export interface WholeClipProgress {
  done: number;
  total: number;
  /** Frames the server has confirmed stored. */
  stored: number;
  remainingMs: number | null;
  msPerFrame: number | null;
}

export interface WholeClipOutcome {
  status: 'finished' | 'cancelled';
  done: number;
  stored: number;
  total: number;
  elapsedMs: number;
  /** Frames where the model found nobody. */
  emptyFrames: number;
}

export class WholeClipError extends Error {
  override name = 'WholeClipError';
  constructor(
    message: string,
    readonly stored: number,
    override readonly cause?: unknown,
  ) {
    super(message);
  }
}

const round = (v: number, places: number) => {
  const f = 10 ** places;
  return Math.round(v * f) / f;
};

/** Tenths of a pixel and thousandths of a score are below what any model resolves; smaller uploads. */
export function compactKeypoints(keypoints: readonly Keypoint[]): Keypoint[] {
  return keypoints.map((k) => ({
    name: k.name,
    x: round(k.x, 1),
    y: round(k.y, 1),
    score: round(k.score, 3),
  }));
}

function isAbort(error: unknown): boolean {
  return error instanceof DOMException && error.name === 'AbortError';
}

/**
 * Runs the planned frames through the detector one after another (grabbing the next frame while the
 * current one is detected) and posts results in batches as they complete, so a cancel or a failure
 * keeps every frame already sent. Batches are posted in order, one at a time.
 */
export async function runWholeClip<F>(
  plan: WholeClipPlan,
  deps: WholeClipDeps<F>,
  options: {
    signal: AbortSignal;
    onProgress?: (p: WholeClipProgress) => void;
    batchSize?: number;
  },
): Promise<WholeClipOutcome> {
  const batchSize = Math.min(MAX_FRAMES_PER_BATCH, options.batchSize ?? ANALYSIS_BATCH_SIZE);
  const { signal } = options;
  const total = plan.frames.length;
  const eta = new EtaEstimator(total);
  const started = deps.now();
  eta.start(started);

  let done = 0;
  let stored = 0;
  let emptyFrames = 0;
  let pending: FrameUpload[] = [];
  let posting: Promise<void> = Promise.resolve();
  let postError: unknown = null;

  const report = () =>
    options.onProgress?.({
      done,
      total,
      stored,
      remainingMs: eta.remainingMs(done),
      msPerFrame: eta.msPerFrame(),
    });

  // Uploads are not aborted by Cancel: frames already analysed are worth keeping.
  const flush = () => {
    if (pending.length === 0) return;
    const batches = chunk(pending, batchSize);
    pending = [];
    for (const frames of batches) {
      posting = posting.then(async () => {
        if (postError) return;
        try {
          const res = await deps.postBatch({
            model: plan.model,
            ...(plan.careful ? { careful: true } : {}),
            // What the points were oriented for: a facing turned during the run is put right on storing.
            facing: plan.facing ?? 'toward',
            frames,
          });
          stored += res.stored;
          report();
        } catch (error) {
          postError = error;
        }
      });
    }
  };

  const grabNext = (k: number): Promise<F> | null =>
    k < total && !signal.aborted ? deps.grab(plan.frames[k], signal) : null;

  report();
  let next = grabNext(0);
  try {
    for (let k = 0; k < total; k++) {
      if (signal.aborted || postError || !next) break;
      const frame = await next;
      next = grabNext(k + 1);
      const frameIndex = plan.frames[k];
      const timeMs = frameStartMs(frameIndex, plan.fps);
      const result = await deps.detect(frame, {
        frameIndex,
        timeMs,
        model: plan.model,
        view: plan.view,
        referenceLine: plan.referenceLine,
        facing: plan.facing,
        follow: plan.pick ? (k === 0 ? { pick: { x: plan.pick.x, y: plan.pick.y } } : { next: true }) : null,
        ...(plan.careful ? { careful: true } : {}),
      });
      if (result.keypoints.length === 0) emptyFrames += 1;
      pending.push({ frameIndex, timeMs: round(timeMs, 3), keypoints: compactKeypoints(result.keypoints) });
      done += 1;
      eta.tick(deps.now());
      if (pending.length >= batchSize) flush();
      report();
    }
  } catch (error) {
    if (!isAbort(error)) {
      flush();
      await posting;
      throw new WholeClipError(
        `Frame ${plan.frames[done] ?? done} could not be analysed: ${error instanceof Error ? error.message : String(error)}. ` +
          `The ${stored} frames before it are stored; run the analysis again to continue.`,
        stored,
        error,
      );
    }
  } finally {
    // A grab started for the next frame may still be running; its frame will not be used.
    void next?.then((frame) => deps.discard?.(frame)).catch(() => undefined);
  }
  flush();
  await posting;
  if (postError) {
    throw new WholeClipError(
      `Saving results failed: ${postError instanceof Error ? postError.message : String(postError)}. ` +
        `${stored} frames are stored; run the analysis again to store the rest.`,
      stored,
      postError,
    );
  }
  report();
  return {
    status: done === total ? 'finished' : 'cancelled',
    done,
    stored,
    total,
    elapsedMs: deps.now() - started,
    emptyFrames,
  };
}
