// Whole-body centre of mass against a hand calculation from de Leva (1996) (docs/metrics.md, Sources §2).
import { describe, expect, it } from 'vitest';
import { computeFrameMetrics, DE_LEVA_FEMALE, DE_LEVA_MALE } from '@shared/metrics';
import { toKeypoints, type Pose } from '../figures';

/** Both sides on top of each other, as in a true side view; x positions chosen for easy sums. */
const POSED: Pose = {
  nose: [38, 165],
  left_ear: [30, 160],
  right_ear: [30, 160],
  left_shoulder: [20, 140],
  right_shoulder: [20, 140],
  left_elbow: [30, 110],
  right_elbow: [30, 110],
  left_wrist: [40, 85],
  right_wrist: [40, 85],
  left_hip: [-10, 80],
  right_hip: [-10, 80],
  left_knee: [10, 40],
  right_knee: [10, 40],
  left_ankle: [0, 0],
  right_ankle: [0, 0],
};

describe('centre of mass fore-aft (de Leva 1996 male table)', () => {
  it('matches the segment-by-segment hand calculation (COCO-17: hands at wrists, feet at ankles)', () => {
    // x of each segment CoM = first end + CoM% × (second end − first end), times its mass fraction:
    const head = 30 * 0.0694; // ear midpoint
    const trunk = (20 + 0.431 * (-10 - 20)) * 0.4346; // mid-shoulder → mid-hip, 43.10 %: 7.07
    const upperArm = (20 + 0.5772 * (30 - 20)) * 0.0271 * 2; // 25.772
    const forearm = (30 + 0.4574 * (40 - 30)) * 0.0162 * 2; // 34.574
    const hand = 40 * 0.0061 * 2;
    const thigh = (-10 + 0.4095 * (10 - -10)) * 0.1416 * 2; // -1.81
    const shank = (10 + 0.4395 * (0 - 10)) * 0.0433 * 2; // 5.605
    const foot = 0 * 0.0137 * 2;
    const comX = head + trunk + upperArm + forearm + hand + thigh + shank + foot; // masses sum to 1.0000
    const shin = Math.hypot(10, 40);
    const m = computeFrameMetrics({ keypoints: toKeypoints(POSED), view: 'side' });
    expect(m.facing).toBe('right');
    // 2.0820 + 3.0726 + 1.3968 + 1.1202 + 0.4880 − 0.5126 + 0.4854 + 0 = 8.1325
    expect(comX).toBeCloseTo(8.1325, 3);
    expect(m.metrics.comForeAft).toBeCloseTo(comX / shin, 9);
    expect(m.notes.comForeAft).toBe('from ankle midpoint');
  });

  it('uses the foot segment and the mid-foot with BlazePose heels and foot tips', () => {
    const pose: Pose = {
      ...POSED,
      left_heel: [-5, -4],
      right_heel: [-5, -4],
      left_foot_index: [15, -4],
      right_foot_index: [15, -4],
    };
    const withoutFeet =
      30 * 0.0694 +
      (20 + 0.431 * -30) * 0.4346 +
      (20 + 0.5772 * 10) * 0.0271 * 2 +
      (30 + 0.4574 * 10) * 0.0162 * 2 +
      40 * 0.0061 * 2 +
      (-10 + 0.4095 * 20) * 0.1416 * 2 +
      (10 + 0.4395 * -10) * 0.0433 * 2;
    const foot = (-5 + 0.4415 * 20) * 0.0137 * 2; // heel → toe tip, 44.15 %: 3.83
    const midFoot = 5; // midpoint of heel (-5) and toe tip (15)
    const m = computeFrameMetrics({ keypoints: toKeypoints(pose), view: 'side' });
    expect(m.metrics.comForeAft).toBeCloseTo((withoutFeet + foot - midFoot) / Math.hypot(10, 40), 9);
  });

  it('is negative when the body sits back behind the feet', () => {
    const back = Object.fromEntries(
      Object.entries(POSED).map(([n, [x, y]]) => [n, [n.endsWith('ankle') ? 40 : x, y]]),
    ) as Pose;
    const m = computeFrameMetrics({ keypoints: toKeypoints(back), view: 'side' });
    expect(m.metrics.comForeAft!).toBeLessThan(0);
  });

  it('needs the arms: a missing elbow gives null with the reason', () => {
    const pose = { ...POSED };
    delete pose.right_elbow;
    const m = computeFrameMetrics({ keypoints: toKeypoints(pose), view: 'side' });
    expect(m.metrics.comForeAft).toBeNull();
    expect(m.reasons.comForeAft).toBe('missing: right_elbow');
  });

  it('takes masses from the published table: each sums to 1 within rounding', () => {
    for (const t of [DE_LEVA_MALE, DE_LEVA_FEMALE]) {
      const total =
        t.headNeck.mass +
        t.trunk.mass +
        2 * (t.upperArm.mass + t.forearm.mass + t.hand.mass + t.thigh.mass + t.shank.mass + t.foot.mass);
      // docs/metrics.md, Sources §2: 1.0000 (male), 0.9999 (female).
      expect(total).toBeCloseTo(t === DE_LEVA_MALE ? 1 : 0.9999, 6);
    }
  });
});
