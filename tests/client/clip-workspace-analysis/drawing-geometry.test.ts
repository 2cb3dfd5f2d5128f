import { describe, expect, it } from 'vitest';
import {
  angleArc,
  angleLabelPosition,
  appendStrokePoint,
  arrowHead,
  isDrawingEmpty,
  manualAngleDegrees,
} from '@/features/clip-workspace/components/notes/drawing-geometry';

describe('manual angle tool', () => {
  it('reads a right angle between an arm along +x and an arm along +y', () => {
    // Worked example: arms (10, 0) and (0, 10) from the vertex are perpendicular, so 90°.
    expect(manualAngleDegrees([10, 0], [0, 0], [0, 10])).toBeCloseTo(90, 10);
  });

  it('reads 60° for the arms of an equilateral triangle', () => {
    // Worked example: (1, 0) and (1, √3) from the origin; tan⁻¹(√3/1) = 60°.
    expect(manualAngleDegrees([1, 0], [0, 0], [1, Math.sqrt(3)])).toBeCloseTo(60, 10);
  });

  it('reads 135° when one arm points back up and left, away from a non-origin vertex', () => {
    // Worked example: vertex (100, 50); arms (+20, 0) and (−10, −10). cos θ = −200 / (20 · 10√2) = −1/√2 → 135°.
    expect(manualAngleDegrees([120, 50], [100, 50], [90, 40])).toBeCloseTo(135, 10);
  });

  it('reads 180° for a straight line and does not depend on the order of the arms', () => {
    expect(manualAngleDegrees([0, 0], [5, 5], [10, 10])).toBeCloseTo(180, 10);
    expect(manualAngleDegrees([0, 10], [0, 0], [10, 0])).toBeCloseTo(
      manualAngleDegrees([10, 0], [0, 0], [0, 10])!,
      10,
    );
  });

  it('gives no reading when an arm has no length', () => {
    expect(manualAngleDegrees([3, 4], [3, 4], [10, 0])).toBeNull();
  });
});

describe('angle arc', () => {
  it('sweeps the smaller side, clockwise on screen, from the first arm', () => {
    // y down: (1, 0) is at 0 rad and (0, 1) at +π/2, so the 90° arc runs 0 → π/2.
    expect(angleArc([1, 0], [0, 0], [0, 1])).toEqual({ start: 0, end: Math.PI / 2 });
    // Arms given the other way round: the same arc.
    expect(angleArc([0, 1], [0, 0], [1, 0])).toEqual({ start: 0, end: Math.PI / 2 });
  });

  it('wraps across ±π instead of drawing the reflex side', () => {
    // (−1, 1) is at 3π/4, (−1, −1) at −3π/4: the 90° between them crosses π, so 3π/4 → 5π/4.
    const arc = angleArc([-1, 1], [0, 0], [-1, -1]);
    expect(arc.start).toBeCloseTo((3 * Math.PI) / 4, 12);
    expect(arc.end).toBeCloseTo((5 * Math.PI) / 4, 12);
  });

  it('puts the label on the bisector', () => {
    // Bisector of 0 and π/2 is π/4: at distance 10 that is (10/√2, 10/√2).
    const [x, y] = angleLabelPosition([1, 0], [0, 0], [0, 1], 10);
    expect(x).toBeCloseTo(10 / Math.SQRT2, 10);
    expect(y).toBeCloseTo(10 / Math.SQRT2, 10);
  });
});

describe('arrow head', () => {
  it('puts the barbs behind the tip at the spread angle', () => {
    // Arrow along +x to (10, 0); barbs 5 long at 45° off the shaft, pointing back:
    // 10 − 5·cos45° = 6.4645, ±5·sin45° = ±3.5355.
    const head = arrowHead([0, 0], [10, 0], 5, 45);
    expect(head).not.toBeNull();
    const ys = head!.map((p) => p[1]).sort((a, b) => a - b);
    for (const p of head!) expect(p[0]).toBeCloseTo(10 - 5 * Math.SQRT1_2, 10);
    expect(ys[0]).toBeCloseTo(-5 * Math.SQRT1_2, 10);
    expect(ys[1]).toBeCloseTo(5 * Math.SQRT1_2, 10);
  });

  it('has no head for an arrow of zero length', () => {
    expect(arrowHead([4, 4], [4, 4], 5)).toBeNull();
  });
});

describe('freehand strokes', () => {
  it('drops samples closer than the minimum step and keeps the rest', () => {
    let points = appendStrokePoint([], [0, 0], 2);
    points = appendStrokePoint(points, [1, 1], 2); // √2 ≈ 1.41 < 2: dropped
    points = appendStrokePoint(points, [2, 0], 2); // exactly 2: kept
    expect(points).toEqual([
      [0, 0],
      [2, 0],
    ]);
  });

  it('knows an empty drawing', () => {
    expect(isDrawingEmpty(null)).toBe(true);
    expect(isDrawingEmpty({ strokes: [], arrows: [], angles: [] })).toBe(true);
    expect(isDrawingEmpty({ strokes: [{ points: [[1, 1]], color: '#fff' }], arrows: [], angles: [] })).toBe(
      false,
    );
  });
});
