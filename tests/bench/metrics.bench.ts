// How long the measurement core takes: per frame, and per 10,000-frame clip. Prints figures only.
import { performance } from 'node:perf_hooks';
import type { Keypoint } from '@shared/keypoints';
import { computeFrameMetrics } from '@shared/metrics';
import { analyzeSeries, type SeriesFrameInput } from '@shared/series';
import {
  FRONT_BLAZEPOSE_EXTRAS,
  FRONT_POSE,
  onlyCoco,
  SIDE_FEET,
  SIDE_POSE,
  toKeypoints,
} from '../shared/figures';
import { clip } from '../shared/series/synthetic-clip';

function time<T>(label: string, count: number, unit: string, run: () => T): void {
  run(); // warm-up
  const start = performance.now();
  run();
  const ms = performance.now() - start;
  const per = (ms * 1000) / count;
  process.stdout.write(
    `${label.padEnd(44)} ${ms.toFixed(1).padStart(9)} ms total  ${per.toFixed(2).padStart(9)} µs/${unit}\n`,
  );
}

function perFrame(label: string, keypoints: Keypoint[], view: 'front' | 'side', n = 20_000) {
  // Small per-frame wobble so nothing is cached by accident.
  const frames = Array.from({ length: n }, (_, i) =>
    keypoints.map((k) => ({ ...k, x: k.x + (i % 7) * 0.1 })),
  );
  time(`computeFrameMetrics ${label}`, n, 'frame', () => {
    for (const keypointsOfFrame of frames) computeFrameMetrics({ keypoints: keypointsOfFrame, view });
  });
}

perFrame('side, COCO-17', toKeypoints(onlyCoco(SIDE_POSE)), 'side');
perFrame('side, BlazePose 33', toKeypoints({ ...SIDE_POSE, ...SIDE_FEET }), 'side');
perFrame('front, COCO-17', toKeypoints(onlyCoco(FRONT_POSE)), 'front');
perFrame('front, BlazePose 33', toKeypoints({ ...FRONT_POSE, ...FRONT_BLAZEPOSE_EXTRAS }), 'front');

const N = 10_000;
const frames: SeriesFrameInput[] = clip(N, 30, (t) => ({
  inclinationDeg: 25 * Math.sin((2 * Math.PI * t) / 1600),
  legExtension: 0.85 + 0.05 * Math.cos((2 * Math.PI * t) / 800),
  shoulderTiltDeg: -0.2 * 25 * Math.sin((2 * Math.PI * t) / 1600),
}));
// Drop a knee now and then so gap filling has work.
for (let i = 0; i < N; i += 97)
  frames[i].keypoints = frames[i].keypoints.filter((k) => k.name !== 'left_knee');

for (const filter of [{ kind: 'butterworth' }, { kind: 'one-euro' }, { kind: 'none' }] as const) {
  let turns = 0;
  time(`analyzeSeries 10,000 frames, ${filter.kind}`, N, 'frame', () => {
    turns = analyzeSeries(frames, { view: 'front', fps: 30, filter }).turns.length;
  });
  process.stdout.write(`${''.padEnd(44)} (${turns} turns found)\n`);
}
