import { describe, expect, it } from 'vitest';
import { detectFacing, suggestView } from '@shared/metrics';
import { FRONT_POSE, onlyCoco, SIDE_FEET, SIDE_POSE, toKeypoints, type Pose } from '../figures';

const mirror = (pose: Pose): Pose =>
  Object.fromEntries(Object.entries(pose).map(([n, [x, y]]) => [n, [-x, y]])) as Pose;

describe('suggestView', () => {
  it('calls a wide shoulder and hip line a front view', () => {
    const s = suggestView(toKeypoints(FRONT_POSE));
    expect(s.view).toBe('front');
    expect(s.confidence).toBeGreaterThan(0.5);
  });

  it('calls overlapping left and right points a side view', () => {
    // Side pose: shoulders 10 apart and hips 10 apart over a torso 60 long: ratio 0.17 < 0.35.
    const s = suggestView(toKeypoints(onlyCoco(SIDE_POSE)));
    expect(s.view).toBe('side');
    expect(s.confidence).toBeGreaterThan(0.4);
  });

  it('says it cannot tell (confidence 0) without shoulders and hips', () => {
    expect(suggestView(toKeypoints({ nose: [0, 0] }))).toEqual({ view: 'front', confidence: 0 });
  });
});

describe('detectFacing', () => {
  it('reads the nose ahead of the ears', () => {
    expect(detectFacing(toKeypoints(onlyCoco(SIDE_POSE)))?.facing).toBe('right');
    expect(detectFacing(toKeypoints(onlyCoco(mirror(SIDE_POSE))))?.facing).toBe('left');
  });

  it('reads BlazePose foot tips ahead of heels when the head is hidden', () => {
    const pose: Pose = { ...SIDE_POSE, ...SIDE_FEET };
    delete pose.nose;
    // Left foot (40,-30): cosine 0.8 with +x; right foot (40,0): 1. Mean 0.9.
    const f = detectFacing(toKeypoints(pose));
    expect(f?.facing).toBe('right');
    expect(f?.confidence).toBeCloseTo(0.9, 9);
  });

  it('returns null when there is no cue or the nose sits right between the ears', () => {
    expect(detectFacing(toKeypoints({ left_hip: [0, 0] }))).toBeNull();
    expect(detectFacing(toKeypoints(FRONT_POSE))).toBeNull();
  });

  it('gives no facing, in the image or its mirror, when the nose is only rounding noise off the ears', () => {
    // Found by the facing property test: ears at x = 0.1 and 0.2, nose at 0.15 + 1e-15 in a 640-wide
    // image. The cue is a rounding error, so neither the image nor its mirror may claim a direction.
    const pose: Pose = {
      ...onlyCoco(SIDE_POSE),
      left_ear: [0.1, 10],
      right_ear: [0.2, 10],
      nose: [0.15 + 1e-15, 10],
    };
    expect(detectFacing(toKeypoints(pose))).toBeNull();
    const mirrored = Object.fromEntries(Object.entries(pose).map(([n, [x, y]]) => [n, [640 - x, y]])) as Pose;
    expect(detectFacing(toKeypoints(mirrored))).toBeNull();
  });
});
