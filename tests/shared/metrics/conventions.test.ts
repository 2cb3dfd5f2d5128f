// Published conventions, each check naming its source (docs/metrics.md, Sources).
import { describe, expect, it } from 'vitest';
import { segmentAngle, vec } from '@shared/geometry';
import { computeFrameMetrics } from '@shared/metrics';
import { atan2d, toKeypoints, type Pose } from '../figures';

const S3 = Math.sqrt(3);

/** A side-view leg facing +x: ankle at the origin, shin tilted `shin`° forward, knee flexed `flex`°. */
function leg(
  shinDeg: number,
  flexDeg: number,
  foot?: { heel: [number, number]; toe: [number, number] },
): Pose {
  const s = (shinDeg * Math.PI) / 180;
  const knee: [number, number] = [40 * Math.sin(s), 40 * Math.cos(s)];
  // Thigh direction: the shin's upward direction turned back (clockwise toward -x) by the flexion.
  const t = s - (flexDeg * Math.PI) / 180;
  const hip: [number, number] = [knee[0] + 40 * Math.sin(t), knee[1] + 40 * Math.cos(t)];
  const pose: Pose = {
    nose: [hip[0] + 12, hip[1] + 70],
    left_ear: [hip[0], hip[1] + 72],
    left_ankle: [0, 0],
    left_knee: knee,
    left_hip: hip,
    left_shoulder: [hip[0], hip[1] + 60],
  };
  if (foot) {
    pose.left_heel = foot.heel;
    pose.left_foot_index = foot.toe;
  }
  return pose;
}

const sideMetrics = (pose: Pose) =>
  computeFrameMetrics({ keypoints: toKeypoints(pose), view: 'side' }).metrics;

describe('knee flexion (ISB: Wu et al. 2002 / Grood & Suntay 1983; goniometry, docs/metrics.md, Sources §1)', () => {
  it('is 0 at full extension', () => {
    expect(sideMetrics(leg(0, 0)).kneeFlexionLeft).toBeCloseTo(0, 9);
  });

  it('is positive in flexion and equals the flexion built into the leg', () => {
    for (const flex of [10, 45, 90, 120])
      expect(sideMetrics(leg(20, flex)).kneeFlexionLeft).toBeCloseTo(flex, 9);
  });

  it("matches Winter's knee angle θthigh − θleg (Winter 2009, segment angles distal→proximal)", () => {
    const pose = leg(25, 70);
    const thigh = segmentAngle(vec(...pose.left_knee!), vec(...pose.left_hip!))!;
    const shank = segmentAngle(vec(...pose.left_ankle!), vec(...pose.left_knee!))!;
    expect(sideMetrics(pose).kneeFlexionLeft).toBeCloseTo(thigh - shank, 9);
  });
});

describe('hip flexion (Winter: hip = θthigh − θtrunk, flexion positive [from memory, docs/metrics.md, Sources §1])', () => {
  it('is 0 standing tall and positive with the trunk folded forward', () => {
    const upright = { ...leg(0, 0) };
    expect(sideMetrics(upright).hipFlexionLeft).toBeCloseTo(0, 9);
    const folded = { ...leg(0, 0) };
    const hip = folded.left_hip!;
    // Trunk 30° forward of vertical: θtrunk = 60°, θthigh = 90° → 30° flexion.
    folded.left_shoulder = [hip[0] + 60 * Math.sin(Math.PI / 6), hip[1] + 60 * Math.cos(Math.PI / 6)];
    expect(sideMetrics(folded).hipFlexionLeft).toBeCloseTo(30, 9);
    const thigh = segmentAngle(vec(...folded.left_knee!), vec(...hip))!;
    const trunk = segmentAngle(vec(...hip), vec(...folded.left_shoulder))!;
    expect(sideMetrics(folded).hipFlexionLeft).toBeCloseTo(thigh - trunk, 9);
  });
});

describe('ankle flexion (ISB: Wu et al. 2002, dorsiflexion positive, 0 with the foot ⟂ shank)', () => {
  it('is 0 when the shin is perpendicular to the foot', () => {
    expect(sideMetrics(leg(0, 30, { heel: [-8, -3], toe: [20, -3] })).ankleFlexionLeft).toBeCloseTo(0, 9);
  });

  it('is positive in dorsiflexion (knee over the toes) and negative in plantarflexion', () => {
    expect(sideMetrics(leg(15, 30, { heel: [-8, -3], toe: [20, -3] })).ankleFlexionLeft).toBeCloseTo(15, 9);
    expect(sideMetrics(leg(-10, 30, { heel: [-8, -3], toe: [20, -3] })).ankleFlexionLeft).toBeCloseTo(-10, 9);
  });

  it("is the negative of Winter's ankle angle θleg − θfoot + 90 (+ plantarflexion; foot vector MT5→heel)", () => {
    // Foot tipped 3-4-5 toes-down; shin 20° forward.
    const pose = leg(20, 40, { heel: [-12, 6], toe: [20, -18] });
    const shank = segmentAngle(vec(...pose.left_ankle!), vec(...pose.left_knee!))!;
    const foot = segmentAngle(vec(...pose.left_foot_index!), vec(...pose.left_heel!))!;
    expect(sideMetrics(pose).ankleFlexionLeft).toBeCloseTo(-(shank - foot + 90), 9);
    // By hand: foot tipped down atan(24/32) = 36.87°, shin 20° forward: 20 − 36.87 = −16.87 (plantarflexed).
    expect(sideMetrics(pose).ankleFlexionLeft).toBeCloseTo(20 - atan2d(3, 4), 9);
  });
});

describe("segment angles against the vertical (Winter's convention, subject moving toward +x)", () => {
  it('shin angle is 90° − θleg, positive with the knee ahead of the ankle', () => {
    const pose = leg(30, 60);
    const shank = segmentAngle(vec(...pose.left_ankle!), vec(...pose.left_knee!))!;
    expect(shank).toBeCloseTo(60, 9);
    expect(sideMetrics(pose).shinAngleLeft).toBeCloseTo(90 - shank, 9);
  });

  it('torso angle is positive leaning forward, and both flip to the skier when the skier faces −x', () => {
    const pose = leg(30, 60);
    const hip = pose.left_hip!;
    pose.left_shoulder = [hip[0] + 30, hip[1] + 30 * S3]; // 30° forward
    expect(sideMetrics(pose).torsoAngle).toBeCloseTo(30, 9);
    const mirrored = Object.fromEntries(Object.entries(pose).map(([n, [x, y]]) => [n, [-x, y]])) as Pose;
    expect(sideMetrics(mirrored).torsoAngle).toBeCloseTo(30, 9);
    expect(sideMetrics(mirrored).shinAngleLeft).toBeCloseTo(30, 9);
  });
});

describe('shin–torso mismatch (coaching rule "back parallel to the shins", common practice; docs/metrics.md)', () => {
  it('is 0 with the trunk parallel to the shin and positive when folded at the waist', () => {
    const pose = leg(30, 60);
    const hip = pose.left_hip!;
    pose.left_shoulder = [hip[0] + 30, hip[1] + 30 * S3]; // trunk 30° forward, shin 30° forward
    expect(sideMetrics(pose).shinTorsoMismatch).toBeCloseTo(0, 9);
    pose.left_shoulder = [hip[0] + 30 * S3, hip[1] + 30]; // trunk 60° forward
    expect(sideMetrics(pose).shinTorsoMismatch).toBeCloseTo(30, 9);
  });
});

describe('fore-aft foot offset (docs/metrics.md: + left foot ahead, in shin lengths)', () => {
  const feet = (leftAhead: number): Pose => ({
    ...leg(30, 60),
    right_ankle: [-leftAhead, 0],
    right_knee: [-leftAhead + 20, 20 * S3],
  });

  it('is 0 with the feet level and one shin length with the left foot a shin ahead', () => {
    expect(sideMetrics(feet(0)).foreAftOffset).toBeCloseTo(0, 9);
    expect(sideMetrics(feet(40)).foreAftOffset).toBeCloseTo(1, 9);
    expect(sideMetrics(feet(-20)).foreAftOffset).toBeCloseTo(-0.5, 9);
  });
});
