import { describe, expect, it } from 'vitest';
import { designCutoff, makeSmoother, oneEuro, twoPassCorrection, zeroLagButterworth } from '@shared/series';

/** Amplitude and phase (rad) of the component at `f` Hz, by projection over whole periods. */
function component(y: number[], f: number, fs: number, from: number, to: number) {
  let s = 0;
  let c = 0;
  for (let i = from; i < to; i++) {
    s += y[i] * Math.sin((2 * Math.PI * f * i) / fs);
    c += y[i] * Math.cos((2 * Math.PI * f * i) / fs);
  }
  return { amplitude: (2 * Math.hypot(s, c)) / (to - from), phase: Math.atan2(c, s) };
}

const sine = (f: number, fs: number, n: number) =>
  Array.from({ length: n }, (_, i) => Math.sin((2 * Math.PI * f * i) / fs));

describe('zero-lag Butterworth (2nd order, two passes; docs/metrics.md, Sources §3 after Winter 2009)', () => {
  it('uses the published two-pass correction C = (2^(1/2) − 1)^(1/4) ≈ 0.802', () => {
    expect(twoPassCorrection()).toBeCloseTo(0.802, 3);
  });

  it.each([
    [30, 6],
    [25, 5],
    [60, 6],
    [120, 10],
  ])(
    'attenuates a sine at the cut-off by 3.01 dB (gain 1/√2) with no phase shift: fs %d Hz, fc %d Hz',
    (fs, fc) => {
      // Butterworth: |H(fc)| = 1/√2 at the cut-off; the correction puts the two-pass response there.
      const y = zeroLagButterworth(sine(fc, fs, 40 * fs), fs, fc);
      const { amplitude, phase } = component(y, fc, fs, 10 * fs, 30 * fs);
      expect(amplitude).toBeCloseTo(Math.SQRT1_2, 6);
      expect(20 * Math.log10(amplitude)).toBeCloseTo(-3.0103, 3);
      expect(phase).toBeCloseTo(0, 6);
    },
  );

  it('follows the bilinear Butterworth magnitude 1 / (1 + (Ω/Ωc)^4) above and below the cut-off', () => {
    const fs = 30;
    const fc = 6;
    const warpedDesign = Math.tan((Math.PI * designCutoff(fc, fs)!) / fs);
    for (const f of [1.5, 3, 9, 12]) {
      // Per pass |H|² = 1/(1+(Ω/Ωc)^4) with Ω = tan(πf/fs); two passes multiply: |H|² overall.
      const expected = 1 / (1 + Math.pow(Math.tan((Math.PI * f) / fs) / warpedDesign, 4));
      const y = zeroLagButterworth(sine(f, fs, 40 * fs), fs, fc);
      expect(component(y, f, fs, 10 * fs, 30 * fs).amplitude, `${f} Hz`).toBeCloseTo(expected, 5);
    }
  });

  it('keeps a constant exactly and a straight ramp to 1e-5, ends included', () => {
    const constant = zeroLagButterworth(new Array(40).fill(7), 30, 6);
    for (const v of constant) expect(v).toBeCloseTo(7, 9);
    const ramp = Array.from({ length: 50 }, (_, i) => 3 + 0.5 * i);
    // Odd reflection continues the ramp past both ends; what is left is the start-up transient
    // of the padding, below 1e-5 here.
    zeroLagButterworth(ramp, 30, 6).forEach((v, i) => expect(v).toBeCloseTo(ramp[i], 5));
  });

  it('does nothing, and says so, when the cut-off is at or above Nyquist', () => {
    expect(designCutoff(6, 10)).toBeNull();
    const s = makeSmoother({ kind: 'butterworth', cutoffHz: 6 }, 10);
    expect(s.record.name).toBe('none');
    expect(s.run([1, 5, 2], [0, 100, 200])).toEqual([1, 5, 2]);
  });

  it('records its parameters', () => {
    const s = makeSmoother(undefined, 30);
    expect(s.record.name).toBe('butterworth-zero-lag');
    expect(s.record.parameters).toMatchObject({ cutoffHz: 6, order: 2, passes: 2, fps: 30 });
    expect(s.record.parameters.designCutoffHz).toBeCloseTo(designCutoff(6, 30)!, 12);
  });
});

describe('One Euro filter (Casiez, Roussel, Vogel, CHI 2012; the authors’ 1eurofilter package)', () => {
  // First rows of groundTruth.csv in the authors' repository (casiez/OneEuroFilter), made with
  // rate 120 Hz, mincutoff 1.0, beta 0.1, dcutoff 1.0: timestamp (s), noisy input, filtered output.
  const GOLDEN: [number, number, number][] = [
    [0, -0.0385099, -0.0385099],
    [0.00833333, -0.0280664, -0.0379872],
    [0.0166667, 0.048622, -0.0334427],
    [0.025, 0.111498, -0.0252696],
    [0.0333333, 0.053026, -0.0207099],
    [0.0416667, 0.120548, -0.0119912],
    [0.05, 0.00972308, -0.0106507],
    [0.0583333, 0.074193, -0.00526521],
    [0.0666667, -0.0236801, -0.00641239],
    [0.075, 0.0462396, -0.00308863],
    [0.0833333, 0.0892027, 0.00291027],
    [0.0916667, 0.158329, 0.0135545],
    [0.1, 0.0423086, 0.01552],
    [0.108333, 0.0887203, 0.0206024],
    [0.116667, 0.039102, 0.0218784],
    [0.125, 0.140277, 0.030313],
  ];

  it('reproduces the golden outputs (to the 6 significant digits they are printed with)', () => {
    const out = oneEuro(
      GOLDEN.map((r) => r[1]),
      GOLDEN.map((r) => r[0] * 1000),
      120,
      { minCutoff: 1, beta: 0.1, dCutoff: 1 },
    );
    out.forEach((v, i) => expect(Math.abs(v - GOLDEN[i][2]), `row ${i}`).toBeLessThan(1e-6));
  });

  it('uses the reference defaults (mincutoff 1 Hz, β 0, dcutoff 1 Hz) and records them', () => {
    const s = makeSmoother({ kind: 'one-euro' }, 30);
    expect(s.record).toEqual({
      name: 'one-euro',
      parameters: { minCutoff: 1, beta: 0, dCutoff: 1, fps: 30 },
    });
  });
});
