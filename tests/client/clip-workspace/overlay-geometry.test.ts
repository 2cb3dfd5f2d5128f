import { describe, expect, it } from 'vitest';
import {
  arcBetween,
  lineAcrossRect,
  nearestPoint,
  snowLineAxes,
  widthBar,
} from '@/features/clip-workspace/lib/overlay-geometry';

// Screen axes: x right, y down; canvas angles turn clockwise on screen. Values worked by hand.
describe('angle arcs', () => {
  it('opens from one direction to another the short way', () => {
    // From +x (0 rad) to +y (π/2, straight down on screen): 90°, clockwise, label on the 45° bisector.
    const arc = arcBetween([100, 100], [1, 0], [0, 5], 20, 10)!;
    expect(arc.startAngle).toBeCloseTo(0, 12);
    expect(arc.endAngle).toBeCloseTo(Math.PI / 2, 12);
    expect(arc.anticlockwise).toBe(false);
    expect(arc.degrees).toBeCloseTo(90, 9);
    // Label at 30 px along 45°: 100 + 30·cos 45° = 121.2132.
    expect(arc.labelAt[0]).toBeCloseTo(100 + 30 * Math.SQRT1_2, 9);
    expect(arc.labelAt[1]).toBeCloseTo(100 + 30 * Math.SQRT1_2, 9);
  });

  it('goes anticlockwise when that is shorter, across the ±π seam', () => {
    // From 170° to −170°: the short way is +20° through 180°, clockwise on screen.
    const deg = (d: number): [number, number] => [
      Math.cos((d * Math.PI) / 180),
      Math.sin((d * Math.PI) / 180),
    ];
    const across = arcBetween([0, 0], deg(170), deg(-170), 10)!;
    expect(across.degrees).toBeCloseTo(20, 9);
    expect(across.anticlockwise).toBe(false);
    // From 30° to −30°: 60° the other way.
    const back = arcBetween([0, 0], deg(30), deg(-30), 10)!;
    expect(back.degrees).toBeCloseTo(60, 9);
    expect(back.anticlockwise).toBe(true);
  });

  it('matches knee flexion for the worked example of docs/metrics.md (Sources §1)', () => {
    // docs/metrics.md, Sources §1 [D]: y up, knee (0,0), hip (−0.5, 0.866), ankle (−0.5, −0.866) → flexion 60°.
    // On screen (y down) hip (−0.5, −0.866), ankle (−0.5, 0.866). The arc runs from the thigh carried
    // on past the knee (knee − hip) to the shin (ankle − knee); its opening is the flexion.
    const hip: [number, number] = [-0.5, -0.866];
    const ankle: [number, number] = [-0.5, 0.866];
    const arc = arcBetween([0, 0], [0 - hip[0], 0 - hip[1]], [ankle[0], ankle[1]], 10)!;
    expect(arc.degrees).toBeCloseTo(60, 1);
  });

  it('refuses a zero-length direction', () => {
    expect(arcBetween([0, 0], [0, 0], [1, 0], 10)).toBeNull();
  });
});

describe('snow line', () => {
  it('gives the image level when no line is set', () => {
    const axes = snowLineAxes(null);
    expect(axes.along).toEqual([1, 0]);
    // Upward normal on screen is −y.
    expect(axes.up[0]).toBeCloseTo(0, 12);
    expect(axes.up[1]).toBeCloseTo(-1, 12);
  });

  it('follows a tilted line, oriented to the image right', () => {
    // Points given right-to-left, rising 1 in 1 on screen toward the right: along = (1, −1)/√2.
    const axes = snowLineAxes([
      [100, 100],
      [0, 200],
    ]);
    expect(axes.along[0]).toBeCloseTo(Math.SQRT1_2, 12);
    expect(axes.along[1]).toBeCloseTo(-Math.SQRT1_2, 12);
    // Its upward normal points up-left on screen: (−1, −1)/√2.
    expect(axes.up[0]).toBeCloseTo(-Math.SQRT1_2, 12);
    expect(axes.up[1]).toBeCloseTo(-Math.SQRT1_2, 12);
  });

  it('extends the line through two handles to the frame edges', () => {
    // y = 0.5·x + 100 in a 640×480 frame: x = 0 → y = 100; x = 640 → y = 420.
    const [a, b] = lineAcrossRect([100, 150], [200, 200], 640, 480)!;
    expect(a[0]).toBeCloseTo(0, 9);
    expect(a[1]).toBeCloseTo(100, 9);
    expect(b[0]).toBeCloseTo(640, 9);
    expect(b[1]).toBeCloseTo(420, 9);
    // A steep line leaves through the top and bottom: x = 320 + (y − 240)/4.
    const [c, d] = lineAcrossRect([320, 240], [321, 244], 640, 480)!;
    expect(c).toEqual([260, 0]);
    expect(d).toEqual([380, 480]);
    // A line entirely below the frame misses it.
    expect(lineAcrossRect([0, 600], [10, 600], 640, 480)).toBeNull();
  });
});

describe('width bars', () => {
  it('measures a pair along the hip line, as stanceWidthRatio does', () => {
    // Hips level, 40 px apart; ankles 50 px apart in x and 10 px in y: along the hip line 50 px.
    const hips = widthBar([220, 300], [180, 300], [220, 300], [180, 300])!;
    expect(hips.width).toBeCloseTo(40, 9);
    const ankles = widthBar([225, 505], [175, 495], [220, 300], [180, 300])!;
    expect(ankles.width).toBeCloseTo(50, 9);
    expect(ankles.width / hips.width).toBeCloseTo(1.25, 9);
    // The bar is centred on the ankle midpoint (200, 500) and lies along the hip line.
    expect(ankles.from).toEqual([175, 500]);
    expect(ankles.to).toEqual([225, 500]);
  });

  it('uses the tilted hip line, not the image horizontal', () => {
    // Hip line at 45°: u = (1, 1)/√2. Knees (10, 0) apart project to 10/√2 = 7.0711.
    const bar = widthBar([10, 0], [0, 0], [1, 1], [0, 0])!;
    expect(bar.width).toBeCloseTo(10 * Math.SQRT1_2, 9);
  });
});

describe('hit testing', () => {
  it('picks the nearest point inside the grab radius', () => {
    const points: [number, number][] = [
      [0, 0],
      [10, 0],
      [30, 0],
    ];
    expect(nearestPoint(points, [8, 1], 5)).toBe(1);
    expect(nearestPoint(points, [20, 0], 5)).toBe(-1);
  });
});
