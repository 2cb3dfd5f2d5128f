import Fili from 'fili';
import { OneEuroFilter } from '1eurofilter';

export type FilterOptions =
  | { kind: 'butterworth'; cutoffHz?: number }
  | { kind: 'one-euro'; minCutoff?: number; beta?: number; dCutoff?: number }
  | { kind: 'none' };

export interface FilterRecord {
  name: string;
  parameters: Record<string, number>;
}

/** 6 Hz zero-lag Butterworth, "often considered a standard" for human motion (docs/metrics.md, Sources §3). */
export const DEFAULT_CUTOFF_HZ = 6;
/** One Euro defaults of the reference implementation (Casiez et al. 2012; docs/metrics.md, Sources §3). */
export const ONE_EURO_DEFAULTS = { minCutoff: 1, beta: 0, dCutoff: 1 } as const;

/**
 * Per-pass cut-off correction for a Butterworth run n times: C = (2^(1/n) - 1)^(1/4); n = 2 gives
 * 0.802 (Winter 2009, via docs/metrics.md, Sources §3). It is applied to the pre-warped frequency so the
 * two passes together are at -3 dB exactly at the wanted cut-off.
 */
export const twoPassCorrection = (): number => Math.pow(Math.pow(2, 1 / 2) - 1, 1 / 4);

/** Single-pass design cut-off (Hz) for a wanted two-pass cut-off; null at or above Nyquist. */
export function designCutoff(wantedHz: number, sampleRateHz: number): number | null {
  if (!(wantedHz > 0) || wantedHz >= sampleRateHz / 2) return null;
  const warped = Math.tan((Math.PI * wantedHz) / sampleRateHz) / twoPassCorrection();
  return (Math.atan(warped) * sampleRateHz) / Math.PI;
}

function butterworthCoefficients(designHz: number, sampleRateHz: number) {
  // fili's `order` counts biquads: one biquad is a 2nd-order Butterworth section.
  return new Fili.CalcCascades().lowpass({
    order: 1,
    characteristic: 'butterworth',
    Fs: sampleRateHz,
    Fc: designHz,
    preGain: false,
  });
}

/** One causal pass with the state started at the steady state for the first sample (as scipy's lfilter_zi). */
function causalPass(values: number[], coefficients: ReturnType<typeof butterworthCoefficients>): number[] {
  const filter = new Fili.IirFilter(coefficients);
  // Complex-conjugate poles have |p|^2 = a2; run a constant until their transient is below 1e-12.
  const radius = Math.sqrt(Math.abs(coefficients[0].a[1]));
  const settle =
    radius > 0 && radius < 1 ? Math.min(100_000, Math.ceil(Math.log(1e-12) / Math.log(radius))) : 10;
  filter.multiStep(new Array<number>(Math.max(settle, 10)).fill(values[0]));
  return filter.multiStep(values);
}

/**
 * Zero-lag 2nd-order Butterworth low-pass (forward and backward: 4th order overall) with odd
 * reflection padding at both ends to tame end effects.
 */
export function zeroLagButterworth(
  values: readonly number[],
  sampleRateHz: number,
  cutoffHz: number,
): number[] {
  const design = designCutoff(cutoffHz, sampleRateHz);
  if (design === null || values.length < 2) return [...values];
  const coefficients = butterworthCoefficients(design, sampleRateHz);
  const n = values.length;
  const pad = Math.min(n - 1, Math.max(9, Math.ceil((3 * sampleRateHz) / cutoffHz)));
  const padded: number[] = [];
  for (let i = pad; i >= 1; i--) padded.push(2 * values[0] - values[i]);
  padded.push(...values);
  for (let i = 1; i <= pad; i++) padded.push(2 * values[n - 1] - values[n - 1 - i]);
  const forward = causalPass(padded, coefficients);
  const backward = causalPass(forward.reverse(), coefficients).reverse();
  return backward.slice(pad, pad + n);
}

/** One Euro filter over samples with timestamps in milliseconds (the authors' package). */
export function oneEuro(
  values: readonly number[],
  timesMs: readonly number[],
  sampleRateHz: number,
  parameters: { minCutoff: number; beta: number; dCutoff: number },
): number[] {
  const filter = new OneEuroFilter(sampleRateHz, parameters.minCutoff, parameters.beta, parameters.dCutoff);
  return values.map((v, i) => filter.filter(v, timesMs[i] / 1000));
}

export interface Smoother {
  record: FilterRecord;
  /** Smooths one gap-free run of samples. */
  run(values: readonly number[], timesMs: readonly number[]): number[];
}

export function makeSmoother(options: FilterOptions | undefined, fps: number): Smoother {
  const kind = options?.kind ?? 'butterworth';
  if (kind === 'none') return { record: { name: 'none', parameters: {} }, run: (v) => [...v] };
  if (kind === 'one-euro') {
    const o = options as Extract<FilterOptions, { kind: 'one-euro' }>;
    const parameters = {
      minCutoff: o.minCutoff ?? ONE_EURO_DEFAULTS.minCutoff,
      beta: o.beta ?? ONE_EURO_DEFAULTS.beta,
      dCutoff: o.dCutoff ?? ONE_EURO_DEFAULTS.dCutoff,
    };
    return {
      record: { name: 'one-euro', parameters: { ...parameters, fps } },
      run: (v, t) => oneEuro(v, t, fps, parameters),
    };
  }
  const cutoffHz =
    (options as Extract<FilterOptions, { kind: 'butterworth' }> | undefined)?.cutoffHz ?? DEFAULT_CUTOFF_HZ;
  const design = designCutoff(cutoffHz, fps);
  if (design === null) {
    // At or above Nyquist a low-pass cannot act; say so rather than pretend.
    return { record: { name: 'none', parameters: { requestedCutoffHz: cutoffHz, fps } }, run: (v) => [...v] };
  }
  return {
    record: {
      name: 'butterworth-zero-lag',
      parameters: { cutoffHz, designCutoffHz: design, order: 2, passes: 2, fps },
    },
    run: (v) => zeroLagButterworth(v, fps, cutoffHz),
  };
}
