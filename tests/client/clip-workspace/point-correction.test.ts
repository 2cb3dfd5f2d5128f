import { describe, expect, it } from 'vitest';
import type { FrameKeypoints } from '@/features/clip-workspace/components/stage/analysis-context';
import {
  handPlacedPoints,
  movePoint,
  MAX_DETECTED_SCORE,
} from '@/features/clip-workspace/lib/point-correction';

const frame: FrameKeypoints = {
  frameIndex: 12,
  timeMs: 480,
  model: 'blazepose',
  keypoints: [
    { name: 'left_knee', x: 100, y: 200, score: 0.62 },
    // BlazePose can report a point with full confidence.
    { name: 'right_knee', x: 140, y: 205, score: 1 },
    { name: 'left_ankle', x: 98, y: 260, score: 0.2 },
  ],
  width: 640,
  height: 360,
  origin: 'live',
  correctedPoints: [],
};

describe('point correction', () => {
  it('moves one point, marks it as placed by hand and leaves the others where they were', () => {
    const next = movePoint(frame, 'left_knee', [110, 198]);
    expect(next.origin).toBe('corrected');
    expect(next.correctedPoints).toEqual(['left_knee']);
    expect(next.keypoints[0]).toEqual({ name: 'left_knee', x: 110, y: 198, score: 1 });
    expect(next.keypoints[1]).toMatchObject({ x: 140, y: 205 });
    expect(next.keypoints[2]).toEqual(frame.keypoints[2]);
    expect(frame.keypoints[0].x).toBe(100);
  });

  it('keeps a model point at full confidence from reading back as hand-placed', () => {
    const next = movePoint(frame, 'left_knee', [110, 198]);
    expect(next.keypoints[1].score).toBe(MAX_DETECTED_SCORE);
    expect(handPlacedPoints(next.keypoints)).toEqual(['left_knee']);
  });

  it('remembers every point moved on the frame', () => {
    const twice = movePoint(movePoint(frame, 'left_knee', [110, 198]), 'left_ankle', [101, 262]);
    expect(twice.correctedPoints).toEqual(['left_knee', 'left_ankle']);
    expect(handPlacedPoints(twice.keypoints)).toEqual(['left_knee', 'left_ankle']);
    // An uncertain point placed by hand becomes usable (score 1 is above the 0.3 floor).
    expect(twice.keypoints[2].score).toBe(1);
  });
});
