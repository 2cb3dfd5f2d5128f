import { describe, expect, it } from 'vitest';
import * as tf from '@tensorflow/tfjs-core';
import { BLAZEPOSE33_NAMES, COCO17_NAMES } from '@shared/keypoints';
import { mapKeypoints, scaleKeypoints, swapLeftRight } from '@shared/pose/keypoint-mapping';
import { selectBackend } from '@shared/pose/pose-detector';

const raw = (n: number) => Array.from({ length: n }, (_, i) => ({ x: i, y: 2 * i, score: 0.5 }));

describe('keypoint mapping', () => {
  it('names MoveNet and BlazePose points by output index', () => {
    expect(mapKeypoints(raw(17)).map((k) => k.name)).toEqual([...COCO17_NAMES]);
    expect(mapKeypoints(raw(33)).map((k) => k.name)).toEqual([...BLAZEPOSE33_NAMES]);
  });

  it('refuses a point whose upstream label disagrees with its index, and unknown counts', () => {
    const points = raw(17).map((p, i) => ({ ...p, name: COCO17_NAMES[i] as string }));
    points[5].name = 'right_shoulder';
    expect(() => mapKeypoints(points)).toThrow(/keypoint 5 is "right_shoulder", expected "left_shoulder"/);
    expect(() => mapKeypoints(raw(12))).toThrow(/unexpected keypoint count 12/);
  });

  it('drops non-finite points, clamps scores to 0..1 and scales to the source frame', () => {
    const points = raw(17);
    points[3] = { x: NaN, y: 1, score: 0.9 };
    points[4] = { x: 1, y: 1, score: 1.7 };
    const mapped = mapKeypoints(points, 2, 3);
    expect(mapped).toHaveLength(16);
    expect(mapped.find((k) => k.name === 'right_ear')?.score).toBe(1);
    expect(mapped.find((k) => k.name === 'nose')).toEqual({ name: 'nose', x: 0, y: 0, score: 0.5 });
    expect(mapped.find((k) => k.name === 'left_eye')).toEqual({ name: 'left_eye', x: 2, y: 6, score: 0.5 });
    expect(scaleKeypoints(mapped, 0.5, 2)[1]).toEqual({ name: 'left_eye', x: 1, y: 12, score: 0.5 });
  });
});

describe('swapLeftRight', () => {
  it('exchanges every left/right pair and keeps the middle points', () => {
    const mapped = mapKeypoints(raw(33));
    const swapped = swapLeftRight(mapped);
    expect(swapped.map((k) => k.name).sort()).toEqual([...BLAZEPOSE33_NAMES].sort());
    const at = (list: typeof mapped, name: string) => list.find((k) => k.name === name);
    expect(at(swapped, 'right_heel')).toMatchObject({ x: at(mapped, 'left_heel')!.x });
    expect(at(swapped, 'left_eye_inner')).toMatchObject({ x: at(mapped, 'right_eye_inner')!.x });
    expect(at(swapped, 'nose')).toEqual(at(mapped, 'nose'));
    expect(swapLeftRight(swapped)).toEqual(mapped);
  });
});

describe('backend selection', () => {
  it('says which backends it tried when none can start', async () => {
    await expect(selectBackend(tf, ['webgpu-not-here', 'nope'])).rejects.toThrow(
      /no TensorFlow.js backend could start \(webgpu-not-here: not registered; nope: not registered\)/,
    );
  });
});
