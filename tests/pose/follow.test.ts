// Two phantom skiers crossing (docs/metrics.md, "Picking the athlete"): the coach picks one at the
// first frame, and the follower reads every frame inside a box around them. The picked skier is
// measured in every frame, within the usual joint tolerance of their own truth, while the other skier
// passes behind them. Without following, the detector alone ends up on the other skier.
import { describe, expect, it } from 'vitest';
import type { Keypoint } from '@shared/keypoints';
import { AthleteFollower } from '@shared/pose/follow';
import { createNodePoseDetector } from '@server/pose/node-detector';
import {
  renderPhantomGroup,
  type PhantomFrameSpec,
  type PhantomTruth,
} from '../../fixtures/phantom/render-phantom';
import { evaluateFrame, pooledErrors } from './phantom-eval';
import { SET_LIMITS } from './tolerances';

const WIDTH = 960;
const HEIGHT = 540;
const FRAMES = 40;

/**
 * Frame i: the picked skier (A) comes down left to right; another skier (B) crosses right to left
 * further up the hill, behind A (smaller, higher in the frame, and partly hidden by A at the crossing).
 */
function frameSpecs(i: number): [PhantomFrameSpec, PhantomFrameSpec] {
  const t = i / (FRAMES - 1);
  const wave = Math.sin(Math.PI * 2 * t);
  const common = { width: WIDTH, height: HEIGHT, roll: 0, seed: 3 } as const;
  const other: PhantomFrameSpec = {
    ...common,
    pose: {
      view: 'front',
      facing: 'toward',
      inclination: -18 * wave,
      angulation: -6 * wave,
      kneeFlexion: 40,
    },
    skierHeight: HEIGHT * 0.34,
    origin: [WIDTH * (0.8 - 0.6 * t), HEIGHT * 0.62],
    outfit: 2,
  };
  const picked: PhantomFrameSpec = {
    ...common,
    pose: { view: 'front', facing: 'toward', inclination: 20 * wave, angulation: 7 * wave, kneeFlexion: 50 },
    skierHeight: HEIGHT * 0.45,
    origin: [WIDTH * (0.2 + 0.6 * t), HEIGHT * 0.93],
    outfit: 0,
  };
  return [picked, other];
}

/** The picked skier drawn last: in front. */
function render(i: number) {
  const [picked, other] = frameSpecs(i);
  const group = renderPhantomGroup([other, picked]);
  return { ...group, picked: group.truths[1], other: group.truths[0] };
}

const hipMid = (t: PhantomTruth) => ({
  x: (t.joints.left_hip[0] + t.joints.right_hip[0]) / 2,
  y: (t.joints.left_hip[1] + t.joints.right_hip[1]) / 2,
});
const medianError = (keypoints: Keypoint[], truth: PhantomTruth) =>
  pooledErrors([evaluateFrame(keypoints, truth)]).median;

describe('following the picked athlete', () => {
  it('measures the picked skier in every frame while another crosses behind', async () => {
    const detector = await createNodePoseDetector('lightning');
    try {
      const follower = new AthleteFollower({ width: WIDTH, height: HEIGHT });
      const errors: number[] = [];
      let unfollowedOnOther = 0;
      for (let i = 0; i < FRAMES; i++) {
        const frame = render(i);
        const image = { data: frame.rgba, width: WIDTH, height: HEIGHT, channels: 4 as const };
        const read = async (region: { x: number; y: number; width: number; height: number }) =>
          (await detector.detect(image, { region })).keypoints;
        const result = i === 0 ? await follower.pick(hipMid(frame.picked), read) : await follower.next(read);
        expect(result.state, `frame ${i}: ${result.reason}`).toBe('following');
        const error = medianError(result.keypoints, frame.picked);
        errors.push(error);
        // Nearer the picked skier's truth than the other's, always.
        expect(error, `frame ${i}`).toBeLessThan(medianError(result.keypoints, frame.other));
        // The detector alone over the whole frame, tracking as it does in a clip.
        const alone = (await detector.detect(image, { timeMs: (i * 1000) / 25 })).keypoints;
        if (alone.length > 0 && medianError(alone, frame.other) < medianError(alone, frame.picked))
          unfollowedOnOther += 1;
      }
      // Every frame within the set limit of a single model pass on a skier this size.
      expect(Math.max(...errors)).toBeLessThan(SET_LIMITS.lightning.p90Error);
      expect(errors.sort((a, b) => a - b)[errors.length >> 1]).toBeLessThan(
        SET_LIMITS.lightning.medianError + 0.03,
      );
      // Without a pick, the detector takes the other skier on some frames.
      expect(unfollowedOnOther).toBeGreaterThan(0);
    } finally {
      detector.dispose();
    }
  }, 240_000);

  it('says the athlete is lost when they leave the box, instead of measuring someone else', async () => {
    const detector = await createNodePoseDetector('lightning');
    try {
      const follower = new AthleteFollower({ width: WIDTH, height: HEIGHT });
      const first = render(0);
      const image0 = { data: first.rgba, width: WIDTH, height: HEIGHT, channels: 4 as const };
      await follower.pick(
        hipMid(first.picked),
        async (region) => (await detector.detect(image0, { region })).keypoints,
      );
      // The next frame shows only the other skier, across the frame from where the picked one was.
      const [, other] = frameSpecs(0);
      const alone = renderPhantomGroup([other]);
      const image1 = { data: alone.rgba, width: WIDTH, height: HEIGHT, channels: 4 as const };
      const result = await follower.next(
        async (region) => (await detector.detect(image1, { region })).keypoints,
      );
      expect(result.state).toBe('lost');
      expect(result.keypoints).toEqual([]);
      expect(result.reason).toMatch(/not found|unsurely|jumped|size/);
      // A pick on empty snow finds no one.
      const none = await new AthleteFollower({ width: WIDTH, height: HEIGHT }).pick(
        { x: 30, y: 30 },
        async (region) => (await detector.detect(image1, { region })).keypoints,
      );
      expect(none.state).toBe('lost');
      expect(none.reason).toMatch(/no one found/);
    } finally {
      detector.dispose();
    }
  }, 120_000);

  it('starts from a known frame a few frames away with a box grown for the time between', async () => {
    // Ten points outlining a 100 px figure; the read gives them back a little lower each frame.
    const figure = (dy: number): Keypoint[] =>
      Array.from({ length: 10 }, (_, i) => ({
        name: 'nose' as const,
        x: 500 + (i % 2) * 100,
        y: 200 + dy + (i / 9) * 100,
        score: 0.9,
      }));
    const sides: number[] = [];
    const read = (dy: number) => async (region: { width: number }) => {
      sides.push(region.width);
      return figure(dy);
    };
    const frame = { width: 1920, height: 1080 };
    for (const apart of [1, 5, 9, 50]) {
      const follower = new AthleteFollower(frame);
      expect(follower.start(figure(0), apart)).toBe(true);
      expect((await follower.next(read(5))).state).toBe('following');
      // The next frame is read from one frame apart again.
      await follower.next(read(10));
    }
    // Margin 0.35 of the side each way, grown by a quarter per frame apart, at most three times.
    expect(sides.map(Math.round)).toEqual([170, 170, 240, 170, 310, 170, 310, 170]);
    // Known points that outline no one start nothing.
    expect(new AthleteFollower(frame).start(figure(0).slice(0, 3), 2)).toBe(false);
  });
});
