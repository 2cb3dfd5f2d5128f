import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { COCO17_NAMES, BLAZEPOSE33_NAMES, POSE_MODELS, type PoseModelName } from '@shared/keypoints';
import type { PoseDetector } from '@shared/pose/pose-detector';
import { createNodePoseDetector, tf } from '@server/pose/node-detector';
import { renderPhantom } from '../../fixtures/phantom/render-phantom';
import { PHANTOM_CASES } from './phantom-cases';
import { BODY_JOINTS, evaluateFrame } from './phantom-eval';
import { JOINT_TOLERANCE, METRIC_TOLERANCE } from './tolerances';

const frames = PHANTOM_CASES.map((c) => ({ name: c.name, frame: renderPhantom(c.spec) }));

describe.each(POSE_MODELS)('%s detector in Node (WASM) on phantom stills', (model: PoseModelName) => {
  let detector: PoseDetector;
  beforeAll(async () => {
    detector = await createNodePoseDetector(model);
  });
  afterAll(() => detector?.dispose());

  it('loads on the WASM backend and reports its timings', () => {
    expect(detector.backend).toBe('wasm');
    expect(detector.loadMs).toBeGreaterThan(0);
    expect(detector.warmupMs).toBeGreaterThan(0);
  });

  it.each(frames)('$name: joints and metrics within tolerance of the truth', async ({ frame }) => {
    detector.reset();
    const result = await detector.detect({
      data: frame.rgba,
      width: frame.width,
      height: frame.height,
      channels: 4,
    });
    expect(result.width).toBe(frame.width);
    expect(result.height).toBe(frame.height);
    expect(result.keypoints.map((k) => k.name)).toEqual(
      model === 'blazepose' ? [...BLAZEPOSE33_NAMES] : [...COCO17_NAMES],
    );
    const evaluation = evaluateFrame(result.keypoints, frame.truth);
    for (const joint of BODY_JOINTS) {
      expect(evaluation.jointError[joint], `${joint} error / torso length`).toBeLessThan(
        JOINT_TOLERANCE[joint],
      );
    }
    for (const { key, tolerance, why } of METRIC_TOLERANCE) {
      const want = frame.truth.metrics[key];
      if (want === null) continue;
      const got = evaluation.metrics[key];
      expect(got, `${key} (${why})`).not.toBeNull();
      expect(Math.abs((got as number) - want), `${key}: got ${got}, truth ${want} (${why})`).toBeLessThan(
        tolerance,
      );
    }
  });

  it('returns the same keypoints for the same still after a reset, and frees its tensors', async () => {
    const { frame } = frames[0];
    const input = { data: frame.rgba, width: frame.width, height: frame.height, channels: 4 as const };
    detector.reset();
    const first = await detector.detect(input);
    const tensors = tf.memory().numTensors;
    detector.reset();
    const second = await detector.detect(input);
    expect(second.keypoints).toEqual(first.keypoints);
    expect(tf.memory().numTensors).toBe(tensors);
  });

  it('finds no skier on empty snow', async () => {
    const snow = new Uint8Array(320 * 240 * 3).fill(246);
    detector.reset();
    const result = await detector.detect({ data: snow, width: 320, height: 240, channels: 3 });
    expect(result.keypoints).toEqual([]);
    expect(result.score).toBeNull();
  });

  it('rejects a frame whose byte count does not match its size', async () => {
    await expect(
      detector.detect({ data: new Uint8Array(10), width: 4, height: 4, channels: 3 }),
    ).rejects.toThrow(/expected 4×4×3/);
  });
});
