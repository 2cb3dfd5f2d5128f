// How long one redraw of the workspace overlays takes (the stage redraws on every frame shown and
// every pointer move while a point or handle is dragged). Draws on a 1920×1080 software canvas,
// which is slower than a browser's; prints figures only.
import { performance } from 'node:perf_hooks';
import { createCanvas } from '@napi-rs/canvas';
import type { Keypoint, KeypointName, View } from '@shared/keypoints';
import { computeFrameMetrics } from '@shared/metrics';
import { drawOverlays } from '@/features/clip-workspace/components/overlays/draw-overlays';
import type { PoseFrameResult } from '@/features/clip-workspace/components/stage/analysis-context';

const RUNS = 400;

// An invented crouched skier, image pixels of a 1920×1080 frame.
const POINTS: [KeypointName, number, number][] = [
  ['nose', 980, 300],
  ['left_eye', 990, 290],
  ['right_eye', 970, 290],
  ['left_ear', 1005, 300],
  ['right_ear', 955, 300],
  ['left_shoulder', 1050, 380],
  ['right_shoulder', 910, 395],
  ['left_elbow', 1100, 480],
  ['right_elbow', 860, 490],
  ['left_wrist', 1130, 560],
  ['right_wrist', 830, 570],
  ['left_hip', 1030, 600],
  ['right_hip', 930, 610],
  ['left_knee', 1070, 740],
  ['right_knee', 900, 750],
  ['left_ankle', 1090, 880],
  ['right_ankle', 880, 885],
];
const keypoints: Keypoint[] = POINTS.map(([name, x, y]) => ({ name, x, y, score: 0.85 }));

function pose(view: View): PoseFrameResult {
  const m = computeFrameMetrics({ keypoints, view });
  return {
    frameIndex: 0,
    timeMs: 0,
    model: 'lightning',
    keypoints,
    width: 1920,
    height: 1080,
    origin: 'live',
    correctedPoints: ['left_knee'],
    metrics: m.metrics,
    reasons: m.reasons,
    confidence: m.confidence,
  };
}

const canvas = createCanvas(1920, 1080);
const ctx = canvas.getContext('2d') as unknown as CanvasRenderingContext2D;

for (const view of ['front', 'side'] as const) {
  const scene = {
    pose: pose(view),
    view,
    referenceLine: [
      [100, 950],
      [1800, 900],
    ] as [[number, number], [number, number]],
    toggles: { skeleton: true, angleArcs: true, tiltGauge: true, widthBars: true },
    bands: [],
    videoSize: { width: 1920, height: 1080 },
    snowLineHandles: true,
  };
  // Warm-up: font loading and path caches.
  for (let i = 0; i < 20; i++) drawOverlays(ctx, scene, { map: (p) => p });
  let start = performance.now();
  for (let i = 0; i < RUNS; i++) {
    ctx.clearRect(0, 0, 1920, 1080);
    drawOverlays(ctx, scene, { map: (p) => p });
  }
  const drawMs = (performance.now() - start) / RUNS;
  start = performance.now();
  for (let i = 0; i < RUNS; i++) computeFrameMetrics({ keypoints, view, referenceLine: scene.referenceLine });
  const metricsMs = (performance.now() - start) / RUNS;
  process.stdout.write(
    `${view} view: all overlays ${drawMs.toFixed(2)} ms a redraw, metrics recompute ${metricsMs.toFixed(3)} ms (${RUNS} runs, 1920×1080)\n`,
  );
}
