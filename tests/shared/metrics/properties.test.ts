// Invariances the definitions promise (docs/metrics.md): rotation of image and snow line together,
// uniform scale, facing the other way, and mirror + left/right swap flipping only the signed leans.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Keypoint, KeypointName, ReferenceLine, View } from '@shared/keypoints';
import { computeFrameMetrics, METRIC_KEYS, type FrameMetrics, type MetricKey } from '@shared/metrics';
import {
  FRONT_BLAZEPOSE_EXTRAS,
  FRONT_POSE,
  onlyCoco,
  SIDE_FEET,
  SIDE_POSE,
  toKeypoints,
  type Pose,
} from '../figures';

type Transform = (x: number, y: number) => [number, number];

const mapKeypoints = (keypoints: Keypoint[], f: Transform): Keypoint[] =>
  keypoints.map((k) => {
    const [x, y] = f(k.x, k.y);
    return { ...k, x, y };
  });
const mapLine = (line: ReferenceLine, f: Transform): ReferenceLine => [f(...line[0]), f(...line[1])];

const swapName = (name: KeypointName): KeypointName =>
  (name.startsWith('left_')
    ? name.replace('left_', 'right_')
    : name.startsWith('right_')
      ? name.replace('right_', 'left_')
      : name) as KeypointName;
const swapKey = (key: MetricKey): MetricKey =>
  (key.endsWith('Left')
    ? key.replace(/Left$/, 'Right')
    : key.endsWith('Right')
      ? key.replace(/Right$/, 'Left')
      : key) as MetricKey;

/** Signed metrics whose sign docs/metrics.md ties to the skier's left/right (tilts, leans, left − right). */
const FLIPS_ON_MIRROR_SWAP: ReadonlySet<MetricKey> = new Set<MetricKey>([
  'shoulderTilt',
  'hipTilt',
  'inclination',
  'upperBodyInclination',
  'angulation',
  'kneeAngulation',
  'ankleFlexionDifference',
  'foreAftOffset',
]);

function expectSameMetrics(
  a: FrameMetrics,
  b: FrameMetrics,
  key: (k: MetricKey) => MetricKey = (k) => k,
  sign = (_k: MetricKey) => 1,
) {
  for (const k of METRIC_KEYS) {
    const va = a.metrics[k];
    const vb = b.metrics[key(k)];
    if (va === null || vb === null) {
      expect(vb, `${k} null`).toBe(va);
      continue;
    }
    expect(Math.abs(va - sign(k) * vb), `${k}: ${va} vs ${vb}`).toBeLessThan(1e-6);
  }
}

/**
 * Mirror about the image's x = 0 edge. Negation is exact in floating point, so a value that sits
 * exactly on a threshold (the facing dead band) stays on the same side; `width − x` rounds, and
 * fast-check found a nose whose cue landed on the dead band in one image and just under it in the other.
 */
const mirror: Transform = (x, y) => [-x, y];

const jitter = (n: number) =>
  fc.array(fc.double({ min: -6, max: 6, noNaN: true }), { minLength: n, maxLength: n });

const CASES: { label: string; view: View; pose: Pose }[] = [
  { label: 'side, COCO-17', view: 'side', pose: onlyCoco(SIDE_POSE) },
  { label: 'side, BlazePose', view: 'side', pose: { ...SIDE_POSE, ...SIDE_FEET } },
  { label: 'front, COCO-17', view: 'front', pose: onlyCoco(FRONT_POSE) },
  { label: 'front, BlazePose', view: 'front', pose: { ...FRONT_POSE, ...FRONT_BLAZEPOSE_EXTRAS } },
];

function jittered(pose: Pose, offsets: number[]): Keypoint[] {
  return toKeypoints(pose).map((k, i) => ({ ...k, x: k.x + offsets[2 * i], y: k.y + offsets[2 * i + 1] }));
}

const metricsOf = (keypoints: Keypoint[], view: View, referenceLine: ReferenceLine | null = null) =>
  computeFrameMetrics({ keypoints, view, referenceLine });

describe.each(CASES)('invariances ($label)', ({ view, pose }) => {
  const n = Object.keys(pose).length * 2;

  it('rotating image points and the snow line together leaves every metric unchanged', () => {
    fc.assert(
      fc.property(
        jitter(n),
        fc.double({ min: -60, max: 60, noNaN: true }),
        fc.double({ min: -15, max: 15, noNaN: true }),
        (offsets, turnDeg, slopeDeg) => {
          const keypoints = jittered(pose, offsets);
          const s = (slopeDeg * Math.PI) / 180;
          const line: ReferenceLine = [
            [100, 300],
            [100 + 200 * Math.cos(s), 300 - 200 * Math.sin(s)],
          ];
          const t = (turnDeg * Math.PI) / 180;
          const rotate: Transform = (x, y) => [
            250 + (x - 250) * Math.cos(t) - (y - 250) * Math.sin(t),
            250 + (x - 250) * Math.sin(t) + (y - 250) * Math.cos(t),
          ];
          expectSameMetrics(
            metricsOf(keypoints, view, line),
            metricsOf(mapKeypoints(keypoints, rotate), view, mapLine(line, rotate)),
          );
        },
      ),
      { numRuns: 150 },
    );
  });

  it('scaling the image leaves angles and ratios unchanged', () => {
    fc.assert(
      fc.property(jitter(n), fc.double({ min: 0.1, max: 10, noNaN: true }), (offsets, k) => {
        const keypoints = jittered(pose, offsets);
        expectSameMetrics(
          metricsOf(keypoints, view),
          metricsOf(
            mapKeypoints(keypoints, (x, y) => [x * k, y * k]),
            view,
          ),
        );
      }),
      { numRuns: 150 },
    );
  });

  it('a skier facing the other way (image mirrored, labels kept) gives the same values', () => {
    fc.assert(
      fc.property(jitter(n), (offsets) => {
        const keypoints = jittered(pose, offsets);
        const mirrored = metricsOf(mapKeypoints(keypoints, mirror), view);
        const original = metricsOf(keypoints, view);
        expectSameMetrics(original, mirrored);
        // A nose straight above the ears gives no facing in either image (the dead band).
        const opposite = { left: 'right', right: 'left' } as const;
        if (view === 'side') expect(mirrored.facing).toBe(original.facing && opposite[original.facing]);
      }),
      { numRuns: 100 },
    );
  });

  it('mirroring and swapping left/right flips the signed leans and swaps the per-side metrics, nothing else', () => {
    fc.assert(
      fc.property(jitter(n), (offsets) => {
        const keypoints = jittered(pose, offsets);
        const swapped = mapKeypoints(keypoints, mirror).map((k) => ({
          ...k,
          name: swapName(k.name),
        }));
        expectSameMetrics(metricsOf(keypoints, view), metricsOf(swapped, view), swapKey, (k) =>
          FLIPS_ON_MIRROR_SWAP.has(k) ? -1 : 1,
        );
      }),
      { numRuns: 100 },
    );
  });
});

describe('the property checks can fail', () => {
  it('notices a rotation of the points alone, without the snow line', () => {
    const keypoints = toKeypoints(FRONT_POSE);
    const rotate: Transform = (x, y) => [
      x * Math.cos(0.3) - y * Math.sin(0.3),
      x * Math.sin(0.3) + y * Math.cos(0.3),
    ];
    expect(() =>
      expectSameMetrics(metricsOf(keypoints, 'front'), metricsOf(mapKeypoints(keypoints, rotate), 'front')),
    ).toThrow();
  });
});
