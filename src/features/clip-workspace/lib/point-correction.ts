import type { KeypointName } from '@shared/keypoints';
import type { FrameKeypoints } from '../components/stage/analysis-context';

/** A point the coach placed by hand is stored with full confidence; that is how it is recognised later. */
export const CORRECTED_SCORE = 1;
/**
 * In a corrected frame the model's own points are capped just below full confidence, so a model that
 * reports 1.0 (BlazePose does) is not mistaken for the coach. 0.001 of confidence changes no metric
 * (the confidence floor is 0.3).
 */
export const MAX_DETECTED_SCORE = 0.999;

/** The frame with `name` moved to `at` (video pixels) by hand. */
export function movePoint(frame: FrameKeypoints, name: KeypointName, at: [number, number]): FrameKeypoints {
  const moved = new Set([...frame.correctedPoints, name]);
  return {
    ...frame,
    origin: 'corrected',
    keypoints: frame.keypoints.map((k) =>
      k.name === name
        ? { ...k, x: at[0], y: at[1], score: CORRECTED_SCORE }
        : moved.has(k.name)
          ? k
          : { ...k, score: Math.min(k.score, MAX_DETECTED_SCORE) },
    ),
    correctedPoints: [...moved],
  };
}

/** Names of the points placed by hand in a stored corrected frame. */
export function handPlacedPoints(
  keypoints: readonly { name: KeypointName; score: number }[],
): KeypointName[] {
  return keypoints.filter((k) => k.score === CORRECTED_SCORE).map((k) => k.name);
}
