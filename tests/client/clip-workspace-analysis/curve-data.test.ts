import { describe, expect, it } from 'vitest';
import {
  chartRows,
  flagMarkers,
  flagSpans,
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

describe('flag chips', () => {
  it('shows the server’s grouped flags as chips in time order, pointing at each worst frame', () => {
    const flag = (
      id: string,
      metric: 'shoulderTilt' | 'hipTilt',
      firstFrame: number,
      lastFrame: number,
      worst: number,
    ) =>
      ({
        id,
        model: 'lightning',
        metric,
        value: 12,
        min: -8,
        max: 8,
        distance: 4,
        side: 'above',
        frameIndex: worst,
        turnIndex: 1,
        firstFrame,
        lastFrame,
        frameCount: lastFrame - firstFrame + 1,
        bandVersion: 2,
        status: 'unreviewed',
      }) as const;
    const spans = flagSpans([flag('b', 'shoulderTilt', 20, 30, 25), flag('a', 'hipTilt', 10, 12, 11)]);
    expect(spans.map((s) => [s.key, s.firstFrame, s.worstFrame, s.count])).toEqual([
      ['a', 10, 11, 3],
      ['b', 20, 25, 11],
    ]);
  });
});

describe('turn table numbers', () => {
  it('never shows a negative zero', () => {
    expect(signedFixed(-0.001, 2)).toBe('0.00');
    expect(signedFixed(-0.006, 2)).toBe('-0.01');
    expect(signedFixed(0.05, 2)).toBe('0.05');
  });
});
