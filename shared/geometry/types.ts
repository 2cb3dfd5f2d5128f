// Branded units so a degree value cannot be passed where radians are expected (and back).
declare const degreesBrand: unique symbol;
declare const radiansBrand: unique symbol;

export type Degrees = number & { readonly [degreesBrand]: true };
export type Radians = number & { readonly [radiansBrand]: true };

/** A point or vector in the measurement frame: x to the right, y UP (image y negated). */
export interface Vec2 {
  readonly x: number;
  readonly y: number;
}

export const degrees = (value: number): Degrees => value as Degrees;
export const radians = (value: number): Radians => value as Radians;

export function toDegrees(angle: Radians): Degrees {
  return ((angle * 180) / Math.PI) as Degrees;
}

export function toRadians(angle: Degrees): Radians {
  return ((angle * Math.PI) / 180) as Radians;
}
