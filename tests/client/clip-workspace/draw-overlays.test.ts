import { createCanvas } from '@napi-rs/canvas';
import { describe, expect, it } from 'vitest';
import type { Keypoint, ReferenceLine } from '@shared/keypoints';
import { computeFrameMetrics } from '@shared/metrics';
import {
  drawOverlays,
  OVERLAY_COLORS,
  type OverlayScene,
} from '@/features/clip-workspace/components/overlays/draw-overlays';
import type { PoseFrameResult } from '@/features/clip-workspace/components/stage/analysis-context';

// A standing figure drawn on a 200×200 canvas with the identity mapping, then read back pixel by pixel.
// Joints are discs 9 px across, so their centre pixel carries the fill colour exactly.
const figure: Keypoint[] = [
  { name: 'left_shoulder', x: 120, y: 60, score: 0.9 },
  { name: 'right_shoulder', x: 80, y: 60, score: 0.9 },
  { name: 'left_hip', x: 115, y: 110, score: 0.9 },
  { name: 'right_hip', x: 85, y: 110, score: 0.9 },
  { name: 'left_knee', x: 118, y: 145, score: 0.9 },
  { name: 'right_knee', x: 82, y: 145, score: 0.9 },
  { name: 'left_ankle', x: 120, y: 180, score: 0.9 },
  { name: 'right_ankle', x: 80, y: 180, score: 1 },
  // No eyes or ears, so no bone runs through the nose: a low-score point is a ring with an empty centre.
  { name: 'nose', x: 100, y: 30, score: 0.1 },
];

function pose(keypoints: Keypoint[], corrected: Keypoint['name'][] = []): PoseFrameResult {
  const m = computeFrameMetrics({ keypoints, view: 'front' });
  return {
    frameIndex: 0,
    timeMs: 0,
    model: 'lightning',
    keypoints,
    width: 200,
    height: 200,
    origin: corrected.length ? 'corrected' : 'live',
    correctedPoints: corrected,
    metrics: m.metrics,
    reasons: m.reasons,
    confidence: m.confidence,
  };
}

function render(scene: Partial<OverlayScene>) {
  const canvas = createCanvas(200, 200);
  const ctx = canvas.getContext('2d');
  const full: OverlayScene = {
    pose: pose(figure),
    view: 'front',
    referenceLine: null,
    toggles: { skeleton: true, angleArcs: false, tiltGauge: false, widthBars: false },
    bands: [],
    videoSize: { width: 200, height: 200 },
    snowLineHandles: false,
    ...scene,
  };
  drawOverlays(ctx as unknown as CanvasRenderingContext2D, full, { map: (p) => p });
  return (x: number, y: number) => Array.from(ctx.getImageData(x, y, 1, 1).data);
}

const rgb = (hex: string) => [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));

function expectColour(pixel: number[], hex: string) {
  const [r, g, b] = rgb(hex);
  expect(pixel[3]).toBe(255);
  expect(Math.abs(pixel[0] - r)).toBeLessThanOrEqual(2);
  expect(Math.abs(pixel[1] - g)).toBeLessThanOrEqual(2);
  expect(Math.abs(pixel[2] - b)).toBeLessThanOrEqual(2);
}

describe('pose overlay drawing', () => {
  it('colours joints by the skier’s own side', () => {
    const at = render({});
    expectColour(at(118, 145), OVERLAY_COLORS.left);
    expectColour(at(82, 145), OVERLAY_COLORS.right);
  });

  it('draws a point below the confidence floor as a hollow ring', () => {
    const at = render({});
    // Centre empty, the ring (radius 5.5) in the uncertain grey's casing or stroke.
    expect(at(100, 30)[3]).toBe(0);
    expect(at(100, 30 - 5)[3]).toBeGreaterThan(0);
  });

  it('draws corrected points in their own colour', () => {
    const at = render({ pose: pose(figure, ['left_knee']) });
    expectColour(at(118, 145), OVERLAY_COLORS.corrected);
    expectColour(at(82, 145), OVERLAY_COLORS.right);
  });

  it('draws nothing of the skeleton when it is switched off', () => {
    const at = render({ toggles: { skeleton: false, angleArcs: false, tiltGauge: false, widthBars: false } });
    expect(at(118, 145)[3]).toBe(0);
  });

  it('runs the snow line across the whole frame', () => {
    // Line through (50, 190.5) and (150, 190.5), on the middle of pixel row 190 so its 1.5 px stroke
    // covers the row; clipped to x = 0..200, the first dash covers x = 0..10.
    const line: ReferenceLine = [
      [50, 190.5],
      [150, 190.5],
    ];
    const at = render({ referenceLine: line, pose: null });
    expectColour(at(4, 190), OVERLAY_COLORS.snowLine);
    expect(at(4, 150)[3]).toBe(0);
  });

  it('colours a width bar outside its band', () => {
    // Ankles 40 px apart along a 30 px hip line: stance ratio 40/30 = 1.33 > 1.3 (common practice band).
    const at = render({
      toggles: { skeleton: false, angleArcs: false, tiltGauge: false, widthBars: true },
      bands: [
        {
          metric: 'stanceWidthRatio',
          ageGroup: 'U12',
          min: 0.8,
          max: 1.3,
          target: null,
          source: 'common practice',
        },
      ],
    });
    // The bar runs through the ankle midpoint (100, 180).
    expectColour(at(100, 180), OVERLAY_COLORS.outside);
    // The knee bar (36/30 = 1.2, no band given for knees) is drawn in the within colour.
    expectColour(at(100, 145), OVERLAY_COLORS.within);
  });
});
