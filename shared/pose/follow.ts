import type { Keypoint } from '../keypoints';
import type { PixelBox } from './pose-detector';

// Following the picked athlete when other people are in the frame (docs/metrics.md, "Picking the
// athlete"). The coach points at the athlete once; each frame is then read only inside a box around
// where the athlete was in the frame before, so a skier or coach crossing elsewhere is never taken,
// and a small, distant athlete is read large. Pure functions: the browser, the server and the command
// line run the same rules around the same detector.

/** Points scored at least this outline the athlete. */
const OUTLINE_SCORE = 0.3;
/** The followed box is the athlete's outline grown by this share of its larger side on every side. */
export const FOLLOW_MARGIN = 0.35;
/** Too few points of the athlete in a frame: lost. */
const MIN_POINTS = 6;
/** Mean score of the outline's points under this: lost. */
const MIN_MEAN_SCORE = 0.35;
/** The outline's middle moving more than this many outline heights from one read frame to the next: swapped or lost. */
const MAX_JUMP = 0.9;
/** The outline growing or shrinking by more than this factor between read frames: someone else. */
const MAX_SCALE_CHANGE = 1.8;
/** Starting from points several frames away, the margin grows by at most this many margins more. */
const MAX_GAP_WIDEN = 2;
/** Known points further than this many frames from the frame to read are too old to look around. */
export const MAX_FOLLOW_GAP = 10;
/** Side of the square boxes tried around a pick, as shares of the frame height. */
const PICK_SIZES = [0.3, 0.5, 0.75, 1.0] as const;

export interface PickPoint {
  x: number;
  y: number;
}

/** The box around the points scored at least OUTLINE_SCORE; null with fewer than MIN_POINTS of them. */
export function outlineOf(keypoints: readonly Keypoint[]): PixelBox | null {
  const sure = keypoints.filter((k) => k.score >= OUTLINE_SCORE);
  if (sure.length < MIN_POINTS) return null;
  const xs = sure.map((k) => k.x);
  const ys = sure.map((k) => k.y);
  const x = Math.min(...xs);
  const y = Math.min(...ys);
  return { x, y, width: Math.max(1, Math.max(...xs) - x), height: Math.max(1, Math.max(...ys) - y) };
}

/** A square box around `box`, grown by `margin` of its larger side each way, kept inside the frame. */
export function followBox(
  box: PixelBox,
  frame: { width: number; height: number },
  margin = FOLLOW_MARGIN,
): PixelBox {
  const side = Math.max(box.width, box.height) * (1 + 2 * margin);
  const cx = box.x + box.width / 2;
  const cy = box.y + box.height / 2;
  const w = Math.min(side, frame.width);
  const h = Math.min(side, frame.height);
  const x = Math.max(0, Math.min(frame.width - w, cx - w / 2));
  const y = Math.max(0, Math.min(frame.height - h, cy - h / 2));
  return { x, y, width: w, height: h };
}

/** Square boxes of several sizes centred on a pick (the coach's click), to find the athlete at any size. */
export function pickBoxes(point: PickPoint, frame: { width: number; height: number }): PixelBox[] {
  return PICK_SIZES.map((share) => {
    const side = share * frame.height;
    return followBox({ x: point.x - side / 2, y: point.y - side / 2, width: side, height: side }, frame, 0);
  });
}

/** Whether the outline holds the point, grown by a tenth of its height (a click on the edge of a jacket). */
export function outlineHolds(box: PixelBox, point: PickPoint): boolean {
  const pad = box.height * 0.1;
  return (
    point.x >= box.x - pad &&
    point.x <= box.x + box.width + pad &&
    point.y >= box.y - pad &&
    point.y <= box.y + box.height + pad
  );
}

export type FollowState = 'following' | 'lost';

/**
 * Whether this frame's read is still the followed athlete, judged against the last frame that was:
 * enough sure points, and no jump or size change that a skier cannot make between two read frames.
 */
export function judgeFollow(
  previous: PixelBox,
  keypoints: readonly Keypoint[],
  framesApart = 1,
): { state: FollowState; outline: PixelBox | null; reason: string | null } {
  const outline = outlineOf(keypoints);
  if (!outline) return { state: 'lost', outline: null, reason: 'athlete not found in the followed box' };
  const sure = keypoints.filter((k) => k.score >= OUTLINE_SCORE);
  const mean = sure.reduce((s, k) => s + k.score, 0) / sure.length;
  if (mean < MIN_MEAN_SCORE) return { state: 'lost', outline, reason: 'athlete seen too unsurely' };
  const jump =
    Math.hypot(
      outline.x + outline.width / 2 - (previous.x + previous.width / 2),
      outline.y + outline.height / 2 - (previous.y + previous.height / 2),
    ) / Math.max(previous.height, 1);
  if (jump > MAX_JUMP * Math.max(1, framesApart / 2))
    return { state: 'lost', outline, reason: 'the figure jumped: maybe someone else' };
  const scale = Math.max(outline.height / previous.height, previous.height / outline.height);
  if (scale > MAX_SCALE_CHANGE)
    return { state: 'lost', outline, reason: 'the figure changed size: maybe someone else' };
  return { state: 'following', outline, reason: null };
}

/** One frame read for the follower: the athlete's points (empty when lost) and why not. */
export interface FollowResult {
  keypoints: Keypoint[];
  state: FollowState;
  reason: string | null;
  /** Where the frame was read. */
  region: PixelBox;
}

/** Reads one frame's points inside a box (the shared detector with `region`). */
export type ReadRegion = (region: PixelBox) => Promise<Keypoint[]>;

/**
 * Follows one athlete frame to frame: `pick` finds them at the coach's point (or `start` from points
 * already known, e.g. a stored frame), then `next` reads each following frame inside a box around where
 * they were. A frame whose read fails the checks of `judgeFollow` is "lost": no points, a reason, and a
 * box that grows each lost frame until the athlete is found again (or the coach picks again).
 */
export class AthleteFollower {
  private outline: PixelBox | null = null;
  private lostFrames = 0;
  /** Frames between the outline's frame and the next one read (more than 1 after `start` from afar). */
  private framesApart = 1;

  constructor(private readonly frame: { width: number; height: number }) {}

  get following(): boolean {
    return this.outline !== null;
  }

  /**
   * Starts from known points (a stored or already read frame); false when they do not outline a figure.
   * `framesApart` is how far that frame is from the next one read: the box grows by a quarter of the
   * margin per frame apart (up to MAX_GAP_WIDEN margins more), and the allowed jump with it.
   */
  start(keypoints: readonly Keypoint[], framesApart = 1): boolean {
    this.outline = outlineOf(keypoints);
    this.lostFrames = 0;
    this.framesApart = Math.max(1, Math.round(framesApart));
    return this.outline !== null;
  }

  /** Finds the athlete at the point: boxes of several sizes around it, the surest figure that holds it. */
  async pick(point: PickPoint, read: ReadRegion): Promise<FollowResult> {
    let best: { keypoints: Keypoint[]; outline: PixelBox; region: PixelBox; score: number } | null = null;
    for (const region of pickBoxes(point, this.frame)) {
      const keypoints = await read(region);
      const outline = outlineOf(keypoints);
      if (!outline || !outlineHolds(outline, point)) continue;
      const sure = keypoints.filter((k) => k.score >= OUTLINE_SCORE);
      const score = sure.reduce((s, k) => s + k.score, 0) / sure.length;
      if (!best || score > best.score) best = { keypoints, outline, region, score };
    }
    if (!best) {
      this.outline = null;
      return {
        keypoints: [],
        state: 'lost',
        reason: 'no one found at that point; click on the athlete’s body',
        region: pickBoxes(point, this.frame).at(-1)!,
      };
    }
    this.outline = best.outline;
    this.lostFrames = 0;
    return { keypoints: best.keypoints, state: 'following', reason: null, region: best.region };
  }

  /** Reads the next frame inside the box around the athlete. */
  async next(read: ReadRegion): Promise<FollowResult> {
    if (!this.outline) throw new Error('pick the athlete first');
    // A few frames apart the athlete moves a little; a wider box would take in people around them.
    const widen = this.lostFrames + Math.min(MAX_GAP_WIDEN, (this.framesApart - 1) / 4);
    const region = followBox(this.outline, this.frame, FOLLOW_MARGIN * (1 + widen));
    const keypoints = await read(region);
    const judged = judgeFollow(this.outline, keypoints, this.lostFrames + this.framesApart);
    this.framesApart = 1;
    if (judged.state === 'following' && judged.outline) {
      this.outline = judged.outline;
      this.lostFrames = 0;
      return { keypoints, state: 'following', reason: null, region };
    }
    this.lostFrames += 1;
    return { keypoints: [], state: 'lost', reason: judged.reason, region };
  }
}
