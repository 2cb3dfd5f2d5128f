import { useEffect, useMemo, useRef, useState } from 'react';
import { MAX_FOLLOW_GAP } from '@shared/pose/follow';
import { errorMessage } from '@/lib/api-client';
import { getPoseClient } from '@/lib/pose-client';
import { useClipFrames } from '../api/get-clip-frames';
import {
  correctionKey,
  useAnalysis,
  type FrameKeypoints,
  type LiveRead,
} from '../components/stage/analysis-context';
import { useStage, useStageClock } from '../components/stage/stage-context';
import { frameStartMs } from '../lib/frame-time';
import { handPlacedPoints } from '../lib/point-correction';

/**
 * Keeps frameKeypoints in step with the frame on screen: a correction made here wins, then the stored
 * analysis (a second visit needs no detection), then live detection on the displayed frame whenever
 * playback is paused. Live results are cached per model and frame, so stepping back costs nothing.
 */
export function useFramePose() {
  const { clip, fps, videoRef, videoSize, clock } = useStage();
  const { model, setFrameKeypoints, setPoseStatus, corrections } = useAnalysis();
  const view = clip.view;
  // This hook follows every frame; it runs in a leaf of the stage, so only that leaf re-renders.
  const currentFrame = useStageClock((s) => s.frame);
  const playing = useStageClock((s) => s.playing);
  const mediaReady = useStageClock((s) => s.mediaReady);
  const stored = useClipFrames(clip.id, model);
  const storedByFrame = useMemo(() => {
    const map = new Map<number, FrameKeypoints>();
    for (const frame of stored.data?.frames ?? []) {
      const moved = frame.corrected ? handPlacedPoints(frame.keypoints) : [];
      map.set(frame.frameIndex, {
        frameIndex: frame.frameIndex,
        timeMs: frame.timeMs,
        model,
        keypoints: frame.keypoints,
        width: videoSize.width,
        height: videoSize.height,
        origin: frame.corrected ? 'corrected' : 'stored',
        correctedPoints: moved,
      });
    }
    return map;
  }, [stored.data, model, videoSize.width, videoSize.height]);

  const liveCache = useRef(new Map<string, FrameKeypoints>());
  // Live results carry the facing and the pick they were read with: a new one reads frames afresh.
  const facing = clip.facing;
  const pick = clip.athletePick ?? null;
  const readWith = `${facing}|${pick ? `${pick.frameIndex}:${pick.x},${pick.y}` : ''}`;
  const [cachedWith, setCachedWith] = useState(readWith);
  if (cachedWith !== readWith) {
    liveCache.current.clear();
    setCachedWith(readWith);
  }
  const request = useRef(0);
  const inFlight = useRef(false);
  const rerunWanted = useRef(false);
  const [rerun, setRerun] = useState(0);

  // Known keypoints go in the moment the clock moves, in the same task as the new frame, so what shows
  // the pose renders once per frame with it rather than once without and once with.
  useEffect(
    () =>
      clock.subscribe(() => {
        const frame = clock.get().frame;
        const key = correctionKey(model, frame);
        const known = corrections.get(key) ?? storedByFrame.get(frame) ?? liveCache.current.get(key);
        if (known) {
          setFrameKeypoints(known);
          setPoseStatus({ state: 'idle' });
        }
      }),
    [clock, model, corrections, storedByFrame, setFrameKeypoints, setPoseStatus],
  );

  useEffect(() => {
    const key = correctionKey(model, currentFrame);
    // Any result still on its way is for a frame no longer on screen.
    const id = ++request.current;
    const known = corrections.get(key) ?? storedByFrame.get(currentFrame) ?? liveCache.current.get(key);
    if (known) {
      setFrameKeypoints(known);
      setPoseStatus({ state: 'idle' });
      return;
    }
    // Detection waits for a still frame; while playing only stored frames are shown.
    if (playing || stored.isPending || !mediaReady) return;
    const video = videoRef.current;
    if (!video) return;
    if (video.seeking) {
      // The frame callback can report the new frame before 'seeked' fires; look again once it has.
      const again = () => setRerun((n) => n + 1);
      video.addEventListener('seeked', again, { once: true });
      return () => video.removeEventListener('seeked', again);
    }
    // One detection at a time: scrubbing fast must not queue a detection per frame passed. When the
    // running one ends, the effect runs again for whatever frame is then on screen.
    if (inFlight.current) {
      rerunWanted.current = true;
      return;
    }

    const knownAt = (frame: number): FrameKeypoints | undefined => {
      const k = correctionKey(model, frame);
      return corrections.get(k) ?? storedByFrame.get(frame) ?? liveCache.current.get(k);
    };
    inFlight.current = true;
    const frameIndex = currentFrame;
    setPoseStatus({ state: 'detecting', frameIndex });
    void (async () => {
      try {
        // Grab the pixels first: the bitmap is of the frame displayed now.
        const bitmap = await createImageBitmap(video);
        const client = getPoseClient();
        // With a picked athlete, every frame is read around them: at the pick on its frame, else around
        // where they were in the closest frame already known (stored, corrected or read here).
        const near = pick && pick.frameIndex !== frameIndex ? closestKnown(frameIndex, knownAt) : null;
        const liveRead: LiveRead | undefined = !pick
          ? undefined
          : pick.frameIndex === frameIndex
            ? { how: 'pick', lost: null }
            : near
              ? { how: 'followed', fromFrame: near.frameIndex, lost: null }
              : { how: 'whole-frame', pickFrame: pick.frameIndex };
        // Each paused frame is read afresh (whole-frame search, then a refined look at the skier), so
        // a frame shows the same numbers however the coach arrived at it.
        await client.reset();
        const result = await client.detect(bitmap, {
          frameIndex,
          timeMs: frameStartMs(frameIndex, fps),
          model,
          view,
          facing,
          // On the frame where the coach picked the athlete, read them there and not whoever else.
          follow:
            pick && pick.frameIndex === frameIndex
              ? { pick: { x: pick.x, y: pick.y } }
              : near
                ? {
                    near: {
                      keypoints: near.keypoints,
                      framesApart: Math.abs(frameIndex - near.frameIndex),
                    },
                  }
                : null,
          // No temporal smoothing: it would blend in the frames stepped through before this one.
          still: true,
        });
        const entry: FrameKeypoints = {
          frameIndex,
          timeMs: result.timeMs,
          model,
          keypoints: result.keypoints,
          width: result.width,
          height: result.height,
          origin: 'live',
          correctedPoints: [],
          liveRead:
            liveRead && liveRead.how !== 'whole-frame'
              ? { ...liveRead, lost: result.followed?.state === 'lost' ? result.followed.reason : null }
              : liveRead,
        };
        liveCache.current.set(correctionKey(model, frameIndex), entry);
        if (id !== request.current) return;
        setFrameKeypoints(entry);
        setPoseStatus({ state: 'idle' });
      } catch (error) {
        if (id !== request.current) return;
        setPoseStatus({
          state: 'error',
          frameIndex,
          message: `pose detection failed: ${errorMessage(error)}`,
        });
      } finally {
        inFlight.current = false;
        if (rerunWanted.current || id !== request.current) {
          rerunWanted.current = false;
          setRerun((n) => n + 1);
        }
      }
    })();
  }, [
    rerun,
    currentFrame,
    playing,
    mediaReady,
    model,
    view,
    facing,
    pick,
    fps,
    videoRef,
    corrections,
    storedByFrame,
    stored.isPending,
    setFrameKeypoints,
    setPoseStatus,
  ]);

  return { storedCount: storedByFrame.size, storedError: stored.error };
}

/**
 * The known frame with the athlete's points closest to `frameIndex` (within MAX_FOLLOW_GAP frames, the
 * earlier one on a tie); null when none is close enough.
 */
export function closestKnown(
  frameIndex: number,
  knownAt: (frame: number) => FrameKeypoints | undefined,
): FrameKeypoints | null {
  for (let gap = 1; gap <= MAX_FOLLOW_GAP; gap++) {
    for (const frame of [frameIndex - gap, frameIndex + gap]) {
      const known = frame >= 0 ? knownAt(frame) : undefined;
      if (known && known.keypoints.length > 0) return known;
    }
  }
  return null;
}
