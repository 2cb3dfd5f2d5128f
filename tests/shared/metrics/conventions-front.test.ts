// Front-view and whole-leg conventions, each naming where the expectation comes from.
import { describe, expect, it } from 'vitest';
import { computeFrameMetrics } from '@shared/metrics';
import { toKeypoints, type Pose } from '../figures';

const front = (pose: Pose) => computeFrameMetrics({ keypoints: toKeypoints(pose), view: 'front' }).metrics;

/** Front view, skier's left on +x: feet at ±15, hip mid displaced (dx, dy) from the ankle mid. */
function leaning(dx: number, dy: number, upper: [number, number] = [0, 50]): Pose {
  const hip: [number, number] = [dx, dy];
  const shoulder: [number, number] = [dx + upper[0], dy + upper[1]];
  const at = (p: [number, number], s: number): [number, number] => [p[0] + s, p[1]];
  return {
    left_ankle: [15, 0],
    right_ankle: [-15, 0],
    left_knee: [15 + dx / 2, dy / 2],
    right_knee: [-15 + dx / 2, dy / 2],
    left_hip: at(hip, 15),
    right_hip: at(hip, -15),
    left_shoulder: at(shoulder, 20),
    right_shoulder: at(shoulder, -20),
  };
}

describe('inclination (docs/metrics.md, Sources §6: boots→CoM line against vertical; steady turn tan i = v²/(gR))', () => {
  it('reads the lean of a steady turn: 18 m/s on a 25 m radius gives about 53°', () => {
    // [D] tan i = v²/(g·R) = 18² / (9.81 · 25) = 1.3211; place the hip mid 1.3211 units out per unit up.
    const ratio = (18 * 18) / (9.81 * 25);
    const m = front(leaning(80 * ratio, 80));
    expect(m.inclination).toBeCloseTo((Math.atan(ratio) * 180) / Math.PI, 9);
    expect(m.inclination).toBeCloseTo(52.9, 1);
  });

  it('is positive toward the skier’s left, whichever way the skier faces the camera', () => {
    expect(front(leaning(30, 80)).inclination!).toBeGreaterThan(0);
    expect(front(leaning(-30, 80)).inclination!).toBeLessThan(0);
    // Skier seen from behind: the left side is on −x; a lean toward −x is toward the left.
    const fromBehind = Object.fromEntries(
      Object.entries(leaning(30, 80)).map(([n, [x, y]]) => [n, [-x, y]]),
    ) as Pose;
    expect(front(fromBehind).inclination!).toBeGreaterThan(0);
  });
});

describe('angulation (docs/metrics.md, Sources §6 [from memory]: inclination minus the upper body’s tilt)', () => {
  it('equals the inclination when the upper body is upright (all edging from the hips)', () => {
    const m = front(leaning(40, 80, [0, 50]));
    expect(m.upperBodyInclination).toBeCloseTo(0, 9);
    expect(m.angulation).toBeCloseTo(m.inclination!, 9);
  });

  it('is 0 when the whole body leans in one line (pure inclination, "banking")', () => {
    expect(front(leaning(40, 80, [25, 50])).angulation).toBeCloseTo(0, 9);
  });
});

describe('knee angulation (docs/metrics.md: shin lean minus thigh lean)', () => {
  it('is 0 with thighs and shins in line, positive with knees driven in toward the turn', () => {
    expect(front(leaning(40, 80)).kneeAngulation).toBeCloseTo(0, 9);
    const pose = leaning(40, 80);
    pose.left_knee = [pose.left_knee![0] + 10, pose.left_knee![1]];
    pose.right_knee = [pose.right_knee![0] + 10, pose.right_knee![1]];
    expect(front(pose).kneeAngulation!).toBeGreaterThan(0);
  });
});

describe('stance width and knee separation (docs/metrics.md, Sources §6 [common practice]: stance ≈ hip width)', () => {
  it('is 1 with feet and knees directly under the hips', () => {
    const pose = leaning(0, 80);
    const m = front(pose);
    expect(m.stanceWidthRatio).toBeCloseTo(1, 9);
    expect(m.kneeSeparationRatio).toBeCloseTo(1, 9);
  });

  it('drops below 1 with the knees pinched', () => {
    const pose = leaning(0, 80);
    pose.left_knee = [5, 40];
    pose.right_knee = [-5, 40];
    expect(front(pose).kneeSeparationRatio).toBeCloseTo(10 / 30, 9);
  });
});

describe('shoulder and hip tilt (docs/metrics.md: against the snow line, + left side higher)', () => {
  it('is 0 for level shoulders and +30° with the left shoulder up a 30/60/90 line', () => {
    const pose = leaning(0, 80);
    expect(front(pose).shoulderTilt).toBeCloseTo(0, 9);
    pose.left_shoulder = [20, 130 + 20 / Math.sqrt(3)];
    pose.right_shoulder = [-20, 130 - 20 / Math.sqrt(3)];
    expect(front(pose).shoulderTilt).toBeCloseTo(30, 9);
  });
});

describe('leg extension (docs/metrics.md: 1 = fully straight)', () => {
  it('is 1 for straight legs and below 1 once the knees bend', () => {
    const straight = front(leaning(0, 80));
    expect(straight.legExtension).toBeCloseTo(1, 9);
    const pose = leaning(0, 80);
    // Knees pushed 30 sideways off a 80-long leg: 80 / (2·√(40² + 30²)) = 80/100.
    pose.left_knee = [45, 40];
    pose.right_knee = [-45, 40];
    expect(front(pose).legExtension).toBeCloseTo(0.8, 9);
  });
});
