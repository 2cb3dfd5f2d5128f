import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import {
  matchedTurns,
  phaseAt,
  rightFrameFor,
  syncedRightFrame,
  turnAnchors,
  type TurnSync,
} from '@shared/compare/turn-sync';
import { BLAZEPOSE33_NAMES, type Keypoint, type ReferenceLine } from '@shared/keypoints';
import { analyzeSeries, type Turn } from '@shared/series';
import { frontTurnsClip, type ClipSpec } from '../../../fixtures/phantom/phantom-clip';
import { phantomTruth } from '../../../fixtures/phantom/render-phantom';

// Turn sync checked on the synthetic "phantom" skier (fixtures/phantom), whose true transitions (zero
// crossings of inclination) and apexes (peaks of |inclination|) are known by construction. The turns
// the product finds in each clip are matched turn by turn; every true apex and transition of the left
// clip must land within one frame of the right clip's own true apex or transition.

interface Events {
  transitions: number[];
  apexes: number[];
}

/** The true events of a clip as (turn-ordered) phase frames: apex k, transition after apex k. */
function truthPairs(left: Events, right: Events): [number, number][] {
  const pairs: [number, number][] = [];
  const n = Math.min(left.apexes.length, right.apexes.length);
  for (let k = 0; k < n; k++) pairs.push([left.apexes[k], right.apexes[k]]);
  const m = Math.min(left.transitions.length, right.transitions.length);
  for (let k = 0; k < m; k++) pairs.push([left.transitions[k], right.transitions[k]]);
  return pairs;
}

function syncOf(left: Turn[], right: Turn[], leftFps: number, rightFps: number): TurnSync {
  return { mode: 'turn', leftTurns: left, rightTurns: right, shift: 0, leftFps, rightFps };
}

/** Turns the product finds in a phantom clip from its exact joints (what a perfect detector would give). */
function turnsFromTruth(clip: ClipSpec): Turn[] {
  const truths = clip.frames.map((spec) => phantomTruth(spec));
  const frames = truths.map((truth, i) => ({
    frameIndex: i,
    timeMs: (i * 1000) / clip.fps,
    keypoints: BLAZEPOSE33_NAMES.map((name): Keypoint => ({
      name,
      x: truth.joints[name][0],
      y: truth.joints[name][1],
      score: 1,
    })),
  }));
  return analyzeSeries(frames, { view: 'front', fps: clip.fps, referenceLine: truths[0].referenceLine })
    .turns;
}

interface DemoKeypoints {
  frames: { frameIndex: number; timeMs: number; keypoints: Keypoint[] }[];
}
interface DemoTruth {
  clip: { fps: number; events: Events };
  frames: { referenceLine: ReferenceLine }[];
}

/** Turns the product finds in a committed demo clip: the rendered video through the MoveNet detector. */
function turnsFromDemo(name: string): { turns: Turn[]; events: Events; fps: number } {
  const truth = JSON.parse(
    readFileSync(join('fixtures', 'phantom', 'demo', `${name}.truth.json`), 'utf8'),
  ) as DemoTruth;
  const detected = JSON.parse(
    readFileSync(join('fixtures', 'media', 'demo', `${name}.lightning.json`), 'utf8'),
  ) as DemoKeypoints;
  const series = analyzeSeries(detected.frames, {
    view: 'front',
    fps: truth.clip.fps,
    referenceLine: truth.frames[0].referenceLine,
  });
  return { turns: series.turns, events: truth.clip.events, fps: truth.clip.fps };
}

describe('turn sync on phantom clips with different turn timings', () => {
  it.each([
    { left: { turnSeconds: 1.4, fps: 25 }, right: { turnSeconds: 1.0, fps: 25 } },
    { left: { turnSeconds: 1.1, fps: 25 }, right: { turnSeconds: 1.6, fps: 25 } },
    { left: { turnSeconds: 1.2, fps: 25 }, right: { turnSeconds: 0.9, fps: 50 } },
  ])(
    'left $left.turnSeconds s at $left.fps fps, right $right.turnSeconds s at $right.fps fps',
    ({ left, right }) => {
      const a = frontTurnsClip({ turns: 4, ...left });
      const b = frontTurnsClip({ turns: 4, ...right });
      const plan = syncOf(turnsFromTruth(a), turnsFromTruth(b), a.fps, b.fps);
      const pairs = truthPairs(a.events, b.events);
      expect(pairs.length).toBe(8); // 4 apexes and 4 transitions each
      for (const [trueLeft, trueRight] of pairs) {
        expect(
          Math.abs(syncedRightFrame(plan, trueLeft, b.frames.length) - trueRight),
          `left ${trueLeft}`,
        ).toBeLessThanOrEqual(1);
      }
    },
  );

  it('the demo footage read by the detector: sync adds at most one frame to the detector’s own apex error', () => {
    // The committed demo clips (rendered video, autumn 1.4 s turns, spring 1.15 s) through MoveNet: the
    // detected apex is the noisy peak of a flat top, up to 2 frames from the true one, so here the
    // bound is that error on both sides plus one frame.
    const autumn = turnsFromDemo('phantom-front-turns');
    const spring = turnsFromDemo('phantom-spring-turns');
    const plan = syncOf(autumn.turns, spring.turns, autumn.fps, spring.fps);
    // The same events as the truth lists them (the last turn, cut by the clip's end, has no true apex).
    const detected = (turns: Turn[], truthEvents: Events): Events => ({
      apexes: turns.map((t) => t.apexFrame).slice(0, truthEvents.apexes.length),
      transitions: turns.map((t) => t.endFrame).slice(0, truthEvents.transitions.length),
    });
    const truth = truthPairs(autumn.events, spring.events);
    const found = truthPairs(detected(autumn.turns, autumn.events), detected(spring.turns, spring.events));
    expect(truth.length).toBe(8);
    for (const [k, [trueLeft, trueRight]] of truth.entries()) {
      const [foundLeft, foundRight] = found[k];
      const detectorError = Math.abs(foundLeft - trueLeft) + Math.abs(foundRight - trueRight);
      expect(detectorError, `event ${k}`).toBeLessThanOrEqual(4);
      const miss = Math.abs(syncedRightFrame(plan, trueLeft, 116) - trueRight);
      expect(miss, `left ${trueLeft}`).toBeLessThanOrEqual(detectorError + 1);
    }
  });

  it('by time instead, the same clips drift apart: the apexes of the later turns miss by many frames', () => {
    // The control: time sync cannot put apex on apex when the turns take different times.
    const a = frontTurnsClip({ turns: 4, turnSeconds: 1.4 });
    const b = frontTurnsClip({ turns: 4, turnSeconds: 1.0 });
    const byTime = { mode: 'time', leftStart: 0, rightStart: 0, leftFps: 25, rightFps: 25 } as const;
    const last = a.events.apexes[3];
    expect(Math.abs(syncedRightFrame(byTime, last, b.frames.length) - b.events.apexes[3])).toBeGreaterThan(
      10,
    );
  });
});

const turn = (startFrame: number, apexFrame: number, endFrame: number) => ({
  startFrame,
  apexFrame,
  endFrame,
});

describe('turn sync mapping', () => {
  const left = [turn(0, 10, 20), turn(20, 30, 40), turn(40, 50, 60)];
  const right = [turn(5, 10, 25), turn(25, 45, 55), turn(55, 60, 70)];
  const plan: TurnSync = {
    mode: 'turn',
    leftTurns: left,
    rightTurns: right,
    shift: 0,
    leftFps: 25,
    rightFps: 25,
  };

  it('puts phase on phase and maps linearly inside each phase', () => {
    expect(rightFrameFor(plan, 10)).toBe(10);
    expect(rightFrameFor(plan, 30)).toBe(45);
    expect(rightFrameFor(plan, 25)).toBe(35); // half way from transition (25) to apex (45)
    expect(rightFrameFor(plan, 55)).toBe(65);
  });

  it('runs at real-time pace outside the matched turns, scaled by the frame rates', () => {
    expect(rightFrameFor(plan, 65)).toBe(75);
    expect(rightFrameFor({ ...plan, rightFps: 50 }, 65)).toBe(80);
    expect(syncedRightFrame(plan, 200, 80)).toBe(79); // kept inside the clip
  });

  it('shifts which turns are matched', () => {
    expect(matchedTurns(3, 3, 1)).toEqual([
      [0, 1],
      [1, 2],
    ]);
    expect(rightFrameFor({ ...plan, shift: 1 }, 10)).toBe(45);
    expect(matchedTurns(3, 3, -1)).toEqual([
      [1, 0],
      [2, 1],
    ]);
  });

  it('keeps the anchors increasing on both sides (a shared transition counts once)', () => {
    const anchors = turnAnchors(plan);
    expect(anchors.map((a) => a[0])).toEqual([0, 10, 20, 30, 40, 50, 60]);
    for (let k = 1; k < anchors.length; k++) {
      expect(anchors[k][0]).toBeGreaterThan(anchors[k - 1][0]);
      expect(anchors[k][1]).toBeGreaterThan(anchors[k - 1][1]);
    }
  });

  it('names where a frame is', () => {
    expect(phaseAt(left, 30)).toEqual({ turnIndex: 1, phase: 'apex' });
    expect(phaseAt(left, 20)).toEqual({ turnIndex: 0, phase: 'transition' });
    expect(phaseAt(left, 25)).toEqual({ turnIndex: 1, phase: 'turn' });
    expect(phaseAt(left, 60)).toBeNull();
  });
});
