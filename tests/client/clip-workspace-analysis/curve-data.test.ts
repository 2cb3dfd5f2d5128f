import { describe, expect, it } from 'vitest';
import {
  chartRows,
  flagMarkers,
  flagSpans,
  frameStep,
  metricsForView,
  nearestFrame,
  turnShading,
  type CurveTurn,
} from '@/features/clip-workspace/components/curves/curve-data';
import { signedFixed } from '@/features/clip-workspace/components/curves/turn-table';

const turn = (index: number, direction: 'left' | 'right', startMs: number, endMs: number): CurveTurn => ({
  index,
  direction,
  startMs,
  endMs,
  apexMs: (startMs + endMs) / 2,
  apexFrame: 0,
  complete: true,
});

describe('turn shading', () => {
  it('shades each turn from its start to its end, in seconds, labelled by direction and number', () => {
    const shades = turnShading([turn(0, 'left', 0, 850), turn(1, 'right', 850, 1900)]);
    expect(shades).toEqual([
      { key: 'turn-0', x1: 0, x2: 0.85, direction: 'left', label: 'L1' },
      { key: 'turn-1', x1: 0.85, x2: 1.9, direction: 'right', label: 'R2' },
    ]);
  });

  it('leaves out a turn with no duration', () => {
    expect(turnShading([turn(0, 'left', 400, 400)])).toEqual([]);
  });
});

describe('chart rows', () => {
  const frames = [
    { frameIndex: 2, timeMs: 66.667, metrics: { inclination: 4, angulation: null } },
    { frameIndex: 0, timeMs: 0, metrics: { inclination: -1 } },
    { frameIndex: 1, timeMs: 33.333, metrics: {} },
  ];

  it('orders by frame, converts time to seconds and keeps gaps as null', () => {
    const rows = chartRows(frames, ['inclination', 'angulation']);
    expect(rows.map((r) => r.frameIndex)).toEqual([0, 1, 2]);
    expect(rows[2].t).toBeCloseTo(0.066667, 6);
    expect(rows[1].inclination).toBeNull();
    expect(rows[0].angulation).toBeNull();
    expect(rows[2].inclination).toBe(4);
  });

  it('finds the nearest frame for a click time', () => {
    const rows = chartRows(frames, ['inclination']);
    expect(nearestFrame(rows, 0.01)).toBe(0);
    expect(nearestFrame(rows, 0.04)).toBe(1);
    expect(nearestFrame(rows, 5)).toBe(2);
    expect(nearestFrame([], 1)).toBeNull();
  });

  it('places flags of charted metrics on their frame and skips the others', () => {
    const markers = flagMarkers(
      [
        { metric: 'inclination', value: 4, frameIndex: 2, turnIndex: null },
        { metric: 'shoulderTilt', value: 12, frameIndex: 2, turnIndex: null },
        { metric: 'inclination', value: 9, frameIndex: 7, turnIndex: null },
      ],
      frames,
      ['inclination'],
    );
    expect(markers).toHaveLength(1);
    expect(markers[0]).toMatchObject({ metric: 'inclination', frameIndex: 2, value: 4 });
    expect(markers[0].t).toBeCloseTo(0.066667, 6);
  });
});

describe('metrics and values', () => {
  it('lists the metrics of a view (docs/metrics.md table)', () => {
    expect(metricsForView('front')).toContain('kneeSeparationRatio');
    expect(metricsForView('front')).not.toContain('kneeFlexionLeft');
    expect(metricsForView('side')).toContain('kneeFlexionLeft');
    // legExtension applies to both views.
    expect(metricsForView('side')).toContain('legExtension');
    expect(metricsForView('front')).toContain('legExtension');
  });
});

describe('flag spans', () => {
  const flag = (metric: string, frameIndex: number, value: number, distance: number) => ({
    metric,
    frameIndex,
    value,
    distance,
    turnIndex: null,
  });

  it('merges neighbouring flagged frames of a metric and points at the worst one', () => {
    // Shoulder tilt band ±8°: 9° (1° out) at frame 10, 12° (4° out) at 11, 10° (2° out) at 12, then 9° at 20.
    const spans = flagSpans(
      [
        flag('shoulderTilt', 11, 12, 4),
        flag('shoulderTilt', 10, 9, 1),
        flag('shoulderTilt', 12, 10, 2),
        flag('shoulderTilt', 20, 9, 1),
        flag('stanceWidthRatio', 11, 0.7, 0.1),
      ],
      1,
    );
    expect(spans).toEqual([
      {
        key: 'shoulderTilt-10',
        metric: 'shoulderTilt',
        firstFrame: 10,
        lastFrame: 12,
        worstFrame: 11,
        worstValue: 12,
        count: 3,
      },
      {
        key: 'stanceWidthRatio-11',
        metric: 'stanceWidthRatio',
        firstFrame: 11,
        lastFrame: 11,
        worstFrame: 11,
        worstValue: 0.7,
        count: 1,
      },
      {
        key: 'shoulderTilt-20',
        metric: 'shoulderTilt',
        firstFrame: 20,
        lastFrame: 20,
        worstFrame: 20,
        worstValue: 9,
        count: 1,
      },
    ]);
  });

  it('treats every-Nth frames as neighbours and skips flags without a frame', () => {
    const spans = flagSpans(
      [flag('hipTilt', 0, 1, 1), flag('hipTilt', 3, 1, 1), { ...flag('hipTilt', 0, 1, 1), frameIndex: null }],
      3,
    );
    expect(spans).toHaveLength(1);
    expect(spans[0]).toMatchObject({ firstFrame: 0, lastFrame: 3, count: 2 });
  });

  it('finds the analysis step', () => {
    expect(frameStep([{ frameIndex: 0 }, { frameIndex: 3 }, { frameIndex: 6 }])).toBe(3);
    expect(frameStep([{ frameIndex: 4 }])).toBe(1);
  });
});

describe('turn table numbers', () => {
  it('never shows a negative zero', () => {
    expect(signedFixed(-0.001, 2)).toBe('0.00');
    expect(signedFixed(-0.006, 2)).toBe('-0.01');
    expect(signedFixed(0.05, 2)).toBe('0.05');
  });
});
