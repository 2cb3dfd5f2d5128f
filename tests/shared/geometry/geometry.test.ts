import { describe, expect, it } from 'vitest';
import {
  angleBetween,
  angleFromVertical,
  fromImage,
  GeometryInputError,
  interiorAngle,
  lineTilt,
  project,
  referenceFrame,
  segmentAngle,
  signedAngle,
  tiltFromLine,
  toDegrees,
  toRadians,
  degrees,
  vec,
} from '@shared/geometry';

const S3 = Math.sqrt(3);

describe('angles', () => {
  it('measures the right angle of a 3-4-5 triangle and its acute angles (worked example)', () => {
    // Legs 3 and 4 meet at the origin; the hypotenuse closes the triangle.
    expect(interiorAngle(vec(4, 0), vec(0, 0), vec(0, 3))).toBeCloseTo(90, 10);
    // At (4,0): tan = 3/4 → 36.8699°; at (0,3): tan = 4/3 → 53.1301°.
    expect(interiorAngle(vec(0, 0), vec(4, 0), vec(0, 3))).toBeCloseTo(36.869897645844, 9);
    expect(interiorAngle(vec(0, 0), vec(0, 3), vec(4, 0))).toBeCloseTo(53.130102354156, 9);
  });

  it('gives 180 for a straight line and null for a zero-length arm', () => {
    expect(interiorAngle(vec(-1, 0), vec(0, 0), vec(2, 0))).toBeCloseTo(180, 10);
    expect(interiorAngle(vec(0, 0), vec(0, 0), vec(2, 0))).toBeNull();
    expect(angleBetween(vec(0, 0), vec(1, 0))).toBeNull();
  });

  it('signs angles counter-clockwise positive in the y-up frame', () => {
    expect(signedAngle(vec(1, 0), vec(0.5, S3 / 2))).toBeCloseTo(60, 10);
    expect(signedAngle(vec(1, 0), vec(0.5, -S3 / 2))).toBeCloseTo(-60, 10);
  });

  it("follows Winter's segment-angle convention (docs/metrics.md, Sources §1, Winter 2009)", () => {
    // Worked example from docs/metrics.md (Sources §1): y up, facing +x; knee (0,0), hip (-0.5, 0.866), ankle (-0.5, -0.866).
    const knee = vec(0, 0);
    const hip = vec(-0.5, S3 / 2);
    const ankle = vec(-0.5, -S3 / 2);
    const thigh = segmentAngle(knee, hip)!; // distal knee → proximal hip
    const leg = segmentAngle(ankle, knee)!; // distal ankle → proximal knee
    expect(thigh).toBeCloseTo(120, 10);
    expect(leg).toBeCloseTo(60, 10);
    // Knee = θthigh − θleg = 60° flexion, which is 180° − the interior angle.
    expect(thigh - leg).toBeCloseTo(180 - interiorAngle(hip, knee, ankle)!, 10);
  });

  it('converts units both ways', () => {
    expect(toDegrees(toRadians(degrees(30)))).toBeCloseTo(30, 12);
    expect(toRadians(degrees(180))).toBeCloseTo(Math.PI, 12);
  });
});

describe('reference frame', () => {
  it('turns image pixels into the y-up frame', () => {
    expect(fromImage(3, 4)).toEqual({ x: 3, y: -4 });
  });

  it('defaults to the image horizontal', () => {
    expect(referenceFrame(null)).toEqual({ along: { x: 1, y: 0 }, up: { x: 0, y: 1 } });
  });

  it('builds the line direction and its upward normal from two image points (3-4-5 slope)', () => {
    // Image (0,0) → (4,-3) rises 3 over 4 in the y-up frame: direction (0.8, 0.6), normal (-0.6, 0.8).
    const frame = referenceFrame([
      [0, 0],
      [4, -3],
    ]);
    expect(frame.along.x).toBeCloseTo(0.8, 12);
    expect(frame.along.y).toBeCloseTo(0.6, 12);
    expect(frame.up.x).toBeCloseTo(-0.6, 12);
    expect(frame.up.y).toBeCloseTo(0.8, 12);
    expect(lineTilt(frame)).toBeCloseTo(36.869897645844, 9);
    // The order of the two points does not matter.
    const reversed = referenceFrame([
      [4, -3],
      [0, 0],
    ]);
    expect(reversed.along.x).toBeCloseTo(0.8, 12);
    expect(reversed.up.y).toBeCloseTo(0.8, 12);
  });

  it('projects along the line and measures leans from its vertical', () => {
    const frame = referenceFrame([
      [0, 0],
      [4, -3],
    ]);
    // The image vertical (0,1) has 0.6 along the line and 0.8 up: 36.87° toward the line direction.
    expect(project(frame, vec(0, 1)).along).toBeCloseTo(0.6, 12);
    expect(angleFromVertical(frame, vec(0, 1))).toBeCloseTo(36.869897645844, 9);
    expect(angleFromVertical(frame, vec(0, 1), -1)).toBeCloseTo(-36.869897645844, 9);
    // Along the normal itself: 0.
    expect(angleFromVertical(frame, frame.up)).toBeCloseTo(0, 12);
  });

  it('measures tilt against the line the same whichever way the segment points', () => {
    const frame = referenceFrame(null);
    expect(tiltFromLine(frame, vec(4, 3))).toBeCloseTo(36.869897645844, 9);
    expect(tiltFromLine(frame, vec(-4, 3))).toBeCloseTo(36.869897645844, 9);
    expect(tiltFromLine(frame, vec(-4, -3))).toBeCloseTo(-36.869897645844, 9);
  });

  it('rejects a line whose points coincide or are not numbers', () => {
    expect(() =>
      referenceFrame([
        [1, 1],
        [1, 1],
      ]),
    ).toThrow(GeometryInputError);
    expect(() =>
      referenceFrame([
        [Number.NaN, 1],
        [1, 1],
      ]),
    ).toThrow(/finite/);
  });
});
