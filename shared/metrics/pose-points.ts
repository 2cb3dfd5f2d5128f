import { DEFAULT_CONFIDENCE_FLOOR, type Keypoint, type KeypointName } from '../keypoints';
import { fromImage, mean, type Vec2 } from '../geometry';

/** Thrown inside a metric when a point it needs is unusable; becomes `null` plus this reason. */
export class MetricUnavailable extends Error {
  override name = 'MetricUnavailable';
}

export interface PointRecord {
  point: Vec2;
  score: number;
}

/** Keypoints by name in the y-up frame, with the confidence floor applied on read. */
export class PosePoints {
  private readonly byName = new Map<KeypointName, Keypoint>();

  constructor(
    keypoints: readonly Keypoint[],
    readonly floor: number = DEFAULT_CONFIDENCE_FLOOR,
  ) {
    for (const k of keypoints) {
      const seen = this.byName.get(k.name);
      if (!seen || k.score > seen.score) this.byName.set(k.name, k);
    }
  }

  /** Why a point cannot be used, or null if it can. */
  problem(name: KeypointName): string | null {
    const k = this.byName.get(name);
    if (!k) return `missing: ${name}`;
    if (!Number.isFinite(k.x) || !Number.isFinite(k.y) || !Number.isFinite(k.score))
      return `invalid: ${name}`;
    if (k.score < this.floor) return `low confidence: ${name}`;
    return null;
  }

  has(name: KeypointName): boolean {
    // The same test as problem(), without building its message (asked for every point of every frame).
    const k = this.byName.get(name);
    return (
      k !== undefined &&
      Number.isFinite(k.x) &&
      Number.isFinite(k.y) &&
      Number.isFinite(k.score) &&
      k.score >= this.floor
    );
  }

  record(name: KeypointName): PointRecord {
    const problem = this.problem(name);
    if (problem) throw new MetricUnavailable(problem);
    const k = this.byName.get(name)!;
    return { point: fromImage(k.x, k.y), score: k.score };
  }

  /** Raw keypoint (image pixels) when usable. */
  raw(name: KeypointName): Keypoint | null {
    return this.has(name) ? this.byName.get(name)! : null;
  }
}

/** Reads points for one metric and remembers the lowest score it used. */
export class PointReader {
  minScore = Infinity;

  constructor(readonly points: PosePoints) {}

  get(name: KeypointName): Vec2 {
    const r = this.points.record(name);
    if (r.score < this.minScore) this.minScore = r.score;
    return r.point;
  }

  has(name: KeypointName): boolean {
    return this.points.has(name);
  }

  /** Midpoint of a left/right pair; both are required. */
  pair(left: KeypointName, right: KeypointName): Vec2 {
    const a = this.get(left);
    const b = this.get(right);
    return { x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 };
  }

  /**
   * Mean of whichever of the pair is usable. In a side view the two sides project almost onto
   * each other and the far one is often hidden, so one side stands for both.
   */
  either(left: KeypointName, right: KeypointName): Vec2 {
    const usable = [left, right].filter((n) => this.has(n));
    if (usable.length === 0) {
      throw new MetricUnavailable(
        this.points.problem(left) ?? this.points.problem(right) ?? `missing: ${left}`,
      );
    }
    return mean(usable.map((n) => this.get(n)))!;
  }
}
