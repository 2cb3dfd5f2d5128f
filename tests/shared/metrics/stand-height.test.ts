import { describe, expect, it } from 'vitest';
import { BLAZEPOSE33_NAMES, type Keypoint } from '@shared/keypoints';
import { computeFrameMetrics } from '@shared/metrics';
import { analyzeSeries, type SeriesFrameInput } from '@shared/series';
import { frontTurnsClip } from '../../../fixtures/phantom/phantom-clip';
import {
  phantomTruth,
  type PhantomFrameSpec,
  type PhantomTruth,
} from '../../../fixtures/phantom/render-phantom';

// Standing height seen from the front (docs/metrics.md, `standHeight` and transition rise), checked on
// the synthetic "phantom" skier, whose true pose is known by construction (fixtures/phantom): the
// truth is the construction's own leg height over hip width (phantom-truth.ts), never this project's
// metric code. Three clips: the demo's linked turns with one deliberate rise; the same turns with the
// legs equally flexed throughout and a strong lean; and a skier coming from far away (15 % of the
// frame height) to close (80 %).

/** Tolerance on a turn's rise, set from the phantom: the zero-lag smoothing shifts values by under 0.01. */
const RISE_TOLERANCE = 0.02;
const FPS = 25;

function framesOf(truths: PhantomTruth[]): SeriesFrameInput[] {
  return truths.map((truth, i) => ({
    frameIndex: i,
    timeMs: (i * 1000) / FPS,
    keypoints: BLAZEPOSE33_NAMES.map((name): Keypoint => ({
      name,
      x: truth.joints[name][0],
      y: truth.joints[name][1],
      score: 1,
    })),
  }));
}

function analyse(specs: PhantomFrameSpec[]) {
  const truths = specs.map((s) => phantomTruth(s));
  const series = analyzeSeries(framesOf(truths), {
    view: 'front',
    fps: FPS,
    referenceLine: truths[0].referenceLine,
  });
  return { truths, series };
}

/** Linked turns with a lean of ±`lean`°, the legs held at one flexion, seen at the given skier height. */
function steadyTurns(lean: number, skierHeightAt: (progress: number) => number): PhantomFrameSpec[] {
  const count = 150;
  return Array.from({ length: count }, (_, i) => {
    const s = i / (1.4 * FPS) + 0.3;
    const wave = Math.sin(Math.PI * s);
    const height = 720;
    return {
      pose: {
        view: 'front',
        facing: 'toward',
        inclination: lean * wave,
        angulation: 0.35 * lean * wave,
        hipTilt: -0.6 * lean * wave,
        shoulderTilt: -0.2 * lean * wave,
        kneeFlexion: 50,
        shinAngle: 22,
        stanceWidth: 1.1,
        kneeSeparation: 1,
      },
      width: 1280,
      height,
      skierHeight: height * skierHeightAt(i / (count - 1)),
      origin: [640 - 200 * Math.cos(Math.PI * s), height * 0.93],
      roll: 2,
    } satisfies PhantomFrameSpec;
  });
}

describe('standing height seen from the front', () => {
  it('reads the construction’s leg height in every frame of the demo clip', () => {
    const clip = frontTurnsClip();
    for (const spec of clip.frames) {
      const truth = phantomTruth(spec);
      const measured = computeFrameMetrics({
        keypoints: framesOf([truth])[0].keypoints,
        view: 'front',
        referenceLine: truth.referenceLine,
      }).metrics.standHeight!;
      expect(measured).toBeCloseTo(truth.metrics.standHeight!, 9);
    }
  });

  it('finds the known rise at the rise transition, and the sinks at the others, within the tolerance', () => {
    const clip = frontTurnsClip(); // rise at transition 2: knees 14° there against 48° at the apex
    const { truths, series } = analyse(clip.frames);
    const ending = series.turns.filter((t) => t.transitionRise !== null);
    expect(ending.length).toBe(clip.events.transitions.length);
    for (const turn of ending) {
      const truthRise =
        truths[turn.endFrame].metrics.standHeight! / truths[turn.apexFrame].metrics.standHeight! - 1;
      expect(Math.abs(turn.transitionRise! - truthRise), `turn ${turn.index}`).toBeLessThan(RISE_TOLERANCE);
    }
    const atRise = ending.find((t) => Math.abs(t.endFrame - clip.events.riseTransition!) <= 1)!;
    expect(atRise.transitionRise!).toBeGreaterThan(0.05); // above the "at most 0.05" band: flagged as standing tall
    for (const turn of ending.filter((t) => t !== atRise)) expect(turn.transitionRise!).toBeLessThan(0);
    // The side view's leg extension cannot see it: the legs stay nearly straight lines in the image.
    const ext = (i: number) => series.frames[i].metrics.legExtension!;
    expect(Math.abs(ext(atRise.endFrame) - ext(atRise.apexFrame))).toBeLessThan(0.02);
  });

  it('reports no rise for a skier who leans 40° into each turn with the same flexion', () => {
    const { truths, series } = analyse(steadyTurns(40, () => 0.5));
    const ending = series.turns.filter((t) => t.transitionRise !== null);
    expect(ending.length).toBeGreaterThanOrEqual(3);
    expect(Math.max(...series.turns.map((t) => Math.abs(t.apexValues.inclination!)))).toBeGreaterThan(38);
    for (const turn of ending)
      expect(Math.abs(turn.transitionRise!), `turn ${turn.index}`).toBeLessThan(0.005);
    // Per frame, the lean does not lower the reading.
    const heights = series.frames.map((f) => f.metrics.standHeight!);
    expect(Math.max(...heights) - Math.min(...heights)).toBeLessThan(0.01 * truths[0].metrics.standHeight!);
  });

  it('does not drift while the skier comes from 15 % to 80 % of the frame height', () => {
    const { truths, series } = analyse(steadyTurns(25, (p) => 0.15 + 0.65 * p));
    const truth = truths[0].metrics.standHeight!;
    const heights = series.frames.map((f) => f.metrics.standHeight!);
    const first = heights.slice(0, 10).reduce((a, b) => a + b, 0) / 10;
    const last = heights.slice(-10).reduce((a, b) => a + b, 0) / 10;
    expect(Math.abs(last - first) / truth).toBeLessThan(0.005);
    for (const turn of series.turns.filter((t) => t.transitionRise !== null))
      expect(Math.abs(turn.transitionRise!), `turn ${turn.index}`).toBeLessThan(0.005);
  });
});
