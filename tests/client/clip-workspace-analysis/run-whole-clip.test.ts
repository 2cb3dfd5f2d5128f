import { describe, expect, it } from 'vitest';
import type { Keypoint } from '@shared/keypoints';
import type { PostClipFramesInput } from '@/features/clip-workspace/api/post-clip-frames';
import { framesToAnalyze } from '@/features/clip-workspace/components/analysis/analysis-plan';
import {
  compactKeypoints,
  runWholeClip,
  WholeClipError,
  type WholeClipDeps,
  type WholeClipProgress,
} from '@/features/clip-workspace/components/analysis/run-whole-clip';

const point = (x: number): Keypoint => ({ name: 'left_knee', x, y: 2 * x, score: 0.9 });

/** Fake clip: frame i "decodes" to i; detection puts the knee at x = i; the clock advances 10 ms a call. */
function fakes(options: { failPostAt?: number; failDetectAt?: number; onDetect?: (i: number) => void } = {}) {
  let clock = 0;
  const posts: PostClipFramesInput[] = [];
  const deps: WholeClipDeps<number> = {
    grab: async (i) => i,
    detect: async (frame) => {
      options.onDetect?.(frame);
      if (frame === options.failDetectAt) throw new Error('the model ran out of memory');
      clock += 10;
      return { keypoints: frame % 4 === 3 ? [] : [point(frame)] };
    },
    postBatch: async (input) => {
      if (posts.length === options.failPostAt) throw new Error('the server is unreachable');
      posts.push(input);
      return { stored: input.frames.length, flags: 0 };
    },
    now: () => clock,
  };
  return { deps, posts };
}

const plan = (frameCount: number, every = 1) => ({
  frames: framesToAnalyze(frameCount, every),
  fps: 30,
  model: 'lightning' as const,
  view: 'front' as const,
  referenceLine: null,
});

describe('whole-clip run', () => {
  it('analyses every planned frame and posts them in order, in batches', async () => {
    const { deps, posts } = fakes();
    const progress: WholeClipProgress[] = [];
    const outcome = await runWholeClip(plan(10, 3), deps, {
      signal: new AbortController().signal,
      batchSize: 3,
      onProgress: (p) => progress.push(p),
    });
    // Frames 0, 3, 6, 9 in batches of 3: [0, 3, 6] then [9].
    expect(posts.map((p) => p.frames.map((f) => f.frameIndex))).toEqual([[0, 3, 6], [9]]);
    expect(posts.every((p) => p.model === 'lightning')).toBe(true);
    // Frame 3 at 30 fps starts at 3 / 30 s = 100 ms.
    expect(posts[0].frames[1].timeMs).toBe(100);
    // The fake finds nobody in frames where i % 4 = 3: of 0, 3, 6, 9 only frame 3.
    expect(outcome).toMatchObject({ status: 'finished', done: 4, stored: 4, total: 4, emptyFrames: 1 });
    // 4 detections at 10 ms each on the fake clock.
    expect(outcome.elapsedMs).toBe(40);
    expect(progress.at(-1)).toMatchObject({ done: 4, total: 4, stored: 4, remainingMs: 0, msPerFrame: 10 });
    expect(progress.map((p) => p.done)).toContain(2);
  });

  it('keeps every frame analysed before Cancel', async () => {
    const controller = new AbortController();
    const { deps, posts } = fakes({ onDetect: (i) => i === 4 && controller.abort() });
    const discarded: number[] = [];
    deps.discard = (frame) => discarded.push(frame);
    const outcome = await runWholeClip(plan(20), deps, { signal: controller.signal, batchSize: 3 });
    await Promise.resolve();
    // Frames 0..4 were detected (4 while Cancel came in); the loop stops before frame 5.
    const sent = posts.flatMap((p) => p.frames.map((f) => f.frameIndex));
    expect(sent).toEqual([0, 1, 2, 3, 4]);
    expect(outcome).toMatchObject({ status: 'cancelled', done: 5, stored: 5, total: 20 });
    // Frame 5 was already being decoded when Cancel came; it is freed, not detected.
    expect(discarded).toEqual([5]);
  });

  it('stops on a failed upload and says how much is stored', async () => {
    const { deps, posts } = fakes({ failPostAt: 1 });
    const run = runWholeClip(plan(12), deps, { signal: new AbortController().signal, batchSize: 4 });
    await expect(run).rejects.toBeInstanceOf(WholeClipError);
    const error = (await run.catch((e: unknown) => e)) as WholeClipError;
    expect(error.stored).toBe(4);
    expect(error.message).toMatch(/4 frames are stored; run the analysis again/);
    expect(posts).toHaveLength(1);
  });

  it('stores the frames before a detector failure and names the frame', async () => {
    const { deps, posts } = fakes({ failDetectAt: 5 });
    const run = runWholeClip(plan(12), deps, { signal: new AbortController().signal, batchSize: 2 });
    const error = (await run.catch((e: unknown) => e)) as WholeClipError;
    expect(error).toBeInstanceOf(WholeClipError);
    expect(error.message).toMatch(/^Frame 5 could not be analysed: the model ran out of memory/);
    expect(posts.flatMap((p) => p.frames.map((f) => f.frameIndex))).toEqual([0, 1, 2, 3, 4]);
    expect(error.stored).toBe(5);
  });

  it('rounds coordinates to tenths of a pixel and scores to thousandths', () => {
    expect(compactKeypoints([{ name: 'nose', x: 10.04999, y: 3.26, score: 0.87654 }])).toEqual([
      { name: 'nose', x: 10, y: 3.3, score: 0.877 },
    ]);
  });
});
