/**
 * Two clips in step. By time: the same offset from a start frame each side chose. By turn: turn N of
 * one clip with turn N (+ a shift) of the other, and inside each turn the time mapped phase by phase
 * (transition → apex → transition), so both skiers reach the apex on the same step although their
 * turns take different times.
 */

/** What syncing needs of a turn: its three phase frames. */
export interface TurnPhases {
  startFrame: number;
  apexFrame: number;
  endFrame: number;
}

/** A frame of the left clip and the frame of the right clip it is shown with. */
export type Anchor = readonly [left: number, right: number];

export interface TimeSync {
  mode: 'time';
  leftStart: number;
  rightStart: number;
  /** Frames per second of each clip; a 50 fps clip moves two frames for a 25 fps clip's one. */
  leftFps: number;
  rightFps: number;
}

export interface TurnSync {
  mode: 'turn';
  leftTurns: readonly TurnPhases[];
  rightTurns: readonly TurnPhases[];
  /** Right turn index minus left turn index of a matched pair (0: first with first). */
  shift: number;
  leftFps: number;
  rightFps: number;
}

export type SyncPlan = TimeSync | TurnSync;

/** Turn index pairs [left, right] that the shift matches, in order. */
export function matchedTurns(leftCount: number, rightCount: number, shift: number): [number, number][] {
  const pairs: [number, number][] = [];
  for (let left = 0; left < leftCount; left++) {
    const right = left + shift;
    if (right >= 0 && right < rightCount) pairs.push([left, right]);
  }
  return pairs;
}

/**
 * Phase anchors of the matched turns (start, apex and end of each pair), strictly increasing on both
 * sides; a turn whose phases would run backwards against the previous anchor is left out.
 */
export function turnAnchors(plan: TurnSync): Anchor[] {
  const anchors: Anchor[] = [];
  for (const [l, r] of matchedTurns(plan.leftTurns.length, plan.rightTurns.length, plan.shift)) {
    const a = plan.leftTurns[l];
    const b = plan.rightTurns[r];
    for (const anchor of [
      [a.startFrame, b.startFrame],
      [a.apexFrame, b.apexFrame],
      [a.endFrame, b.endFrame],
    ] as const) {
      const last = anchors[anchors.length - 1];
      if (last && last[0] === anchor[0] && last[1] === anchor[1]) continue; // the shared transition
      if (last && (anchor[0] <= last[0] || anchor[1] <= last[1])) continue;
      anchors.push(anchor);
    }
  }
  return anchors;
}

/** Right frame at real-time pace from an anchor (outside the matched turns, and in time mode). */
function byTime(left: number, anchor: Anchor, leftFps: number, rightFps: number): number {
  return anchor[1] + ((left - anchor[0]) * rightFps) / leftFps;
}

/** The right clip's frame (fractional) shown with a left frame. */
export function rightFrameFor(plan: SyncPlan, left: number): number {
  if (plan.mode === 'time') {
    return byTime(left, [plan.leftStart, plan.rightStart], plan.leftFps, plan.rightFps);
  }
  const anchors = turnAnchors(plan);
  if (anchors.length === 0) return byTime(left, [0, 0], plan.leftFps, plan.rightFps);
  if (left <= anchors[0][0]) return byTime(left, anchors[0], plan.leftFps, plan.rightFps);
  const last = anchors[anchors.length - 1];
  if (left >= last[0]) return byTime(left, last, plan.leftFps, plan.rightFps);
  let k = 1;
  while (anchors[k][0] < left) k++;
  const [a0, b0] = anchors[k - 1];
  const [a1, b1] = anchors[k];
  return b0 + ((left - a0) * (b1 - b0)) / (a1 - a0);
}

/** The right frame to show, rounded and kept inside the clip. */
export function syncedRightFrame(plan: SyncPlan, left: number, rightFrameCount: number): number {
  const frame = Math.round(rightFrameFor(plan, left));
  return Math.min(Math.max(0, frame), Math.max(0, rightFrameCount - 1));
}

export type TurnPhase = 'transition' | 'apex' | 'turn';

/** Where a frame is in a clip's turns: "apex of turn 3", "transition after turn 2", "in turn 1". */
export function phaseAt(
  turns: readonly TurnPhases[],
  frame: number,
): { turnIndex: number; phase: TurnPhase } | null {
  for (const [i, t] of turns.entries()) {
    if (frame === t.apexFrame) return { turnIndex: i, phase: 'apex' };
    if (frame === t.endFrame && i + 1 < turns.length && turns[i + 1].startFrame === t.endFrame)
      return { turnIndex: i, phase: 'transition' };
  }
  const inside = turns.findIndex((t) => frame >= t.startFrame && frame < t.endFrame);
  return inside < 0 ? null : { turnIndex: inside, phase: 'turn' };
}
