// Minimal types for the parts of fili (MIT, no bundled types) that the smoothing code uses.
declare module 'fili' {
  export interface BiquadCoefficients {
    a: number[];
    b: number[];
    k: number;
    z: number[];
  }
  export interface CascadeParameters {
    order: number;
    characteristic: 'butterworth' | 'bessel';
    Fs: number;
    Fc: number;
    preGain?: boolean;
  }
  export class CalcCascades {
    lowpass(params: CascadeParameters): BiquadCoefficients[];
  }
  export class IirFilter {
    constructor(coefficients: BiquadCoefficients[]);
    singleStep(input: number): number;
    multiStep(input: number[], overwrite?: boolean): number[];
    responsePoint(params: { Fs: number; Fr: number }): {
      magnitude: number;
      phase: number;
      dBmagnitude: number;
    };
  }
  const Fili: { CalcCascades: typeof CalcCascades; IirFilter: typeof IirFilter };
  export default Fili;
}
