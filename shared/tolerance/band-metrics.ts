import { METRIC_DEFINITIONS, METRIC_KEYS, type MetricKey, type MetricUnit } from '../metrics';
import type { View } from '../keypoints';

/**
 * Values measured once per turn (docs/metrics.md "Over a clip"): the rise at the transition that ends
 * the turn, and values at the turn's apex. Apex lean and angulation are taken unsigned (into the turn),
 * so one band serves left and right turns alike.
 */
export const TURN_VALUE_KEYS = [
  'transitionRise',
  'apexInclination',
  'apexAngulation',
  'insideShoulderDrop',
] as const;
export type TurnValueKey = (typeof TURN_VALUE_KEYS)[number];

export type BandMetricKey = MetricKey | TurnValueKey;

export const BAND_METRIC_KEYS: readonly BandMetricKey[] = [...METRIC_KEYS, ...TURN_VALUE_KEYS];

export function isBandMetricKey(key: string): key is BandMetricKey {
  return (BAND_METRIC_KEYS as readonly string[]).includes(key);
}

export function isTurnValueKey(key: string): key is TurnValueKey {
  return (TURN_VALUE_KEYS as readonly string[]).includes(key);
}

export interface BandMetricInfo {
  key: BandMetricKey;
  label: string;
  unit: MetricUnit;
  /** Judged on every frame, or once per turn. */
  per: 'frame' | 'turn';
  /** The view the value exists in; "both" for either. */
  view: View | 'both';
  /** The per-frame readout that shows this value (a per-turn value is read from one). */
  readout: MetricKey;
  /** The values the metric can take at all; a band edge outside them is refused. */
  range: readonly [number, number];
  /** What a value under `v` means, in words ("knees closer together than 0.80 of hip width"). */
  below: (v: string, raw: number) => string;
  /** What a value over `v` means. */
  above: (v: string, raw: number) => string;
}

/** A value with its unit as every screen shows it: degrees to 0.1°, ratios and shin lengths to 0.01. */
export function formatUnitValue(value: number, unit: MetricUnit): string {
  switch (unit) {
    case 'deg':
      return `${value.toFixed(1)}°`;
    case 'ratio':
      return value.toFixed(2);
    case 'shin lengths':
      return `${value.toFixed(2)} shin lengths`;
    case 'hip widths':
      return `${value.toFixed(2)} hip widths`;
  }
}

/** "0.80 to 1.30", "at most 0.05", "at least 2.0°", "no limits" for a band's edges. */
export function formatBandRange(band: { min: number | null; max: number | null }, unit: MetricUnit): string {
  const f = (v: number) => formatUnitValue(v, unit);
  if (band.min !== null && band.max !== null) return `${f(band.min)} to ${f(band.max)}`;
  if (band.max !== null) return `at most ${f(band.max)}`;
  if (band.min !== null) return `at least ${f(band.min)}`;
  return 'no limits';
}

type Words = Pick<BandMetricInfo, 'below' | 'above'>;

/** Plain words for an unsigned quantity: less than / more than. */
const amount = (less: string, more: string): Words => ({
  below: (v) => `${less} ${v}`,
  above: (v) => `${more} ${v}`,
});

/**
 * Words for a signed quantity whose positive side reads `positive` and negative side `negative`:
 * "right shoulder higher by more than 8.0°" for shoulder tilt under −8°.
 */
const signed = (positive: string, negative: string, unit: MetricUnit): Words => {
  const magnitude = (raw: number) => formatUnitValue(Math.abs(raw), unit);
  return {
    below: (_v, raw) =>
      raw <= 0 ? `${negative} by more than ${magnitude(raw)}` : `${positive} by less than ${magnitude(raw)}`,
    above: (_v, raw) =>
      raw >= 0 ? `${positive} by more than ${magnitude(raw)}` : `${negative} by less than ${magnitude(raw)}`,
  };
};

const READOUT_OF_TURN_VALUE: Record<TurnValueKey, MetricKey> = {
  transitionRise: 'standHeight',
  apexInclination: 'inclination',
  apexAngulation: 'angulation',
  insideShoulderDrop: 'shoulderTilt',
};

const ANGLE: readonly [number, number] = [-180, 180];
const LEAN: readonly [number, number] = [-90, 90];

function frameMetric(key: MetricKey, range: readonly [number, number], words: Words): BandMetricInfo {
  const d = METRIC_DEFINITIONS[key];
  return {
    key,
    label: d.label,
    unit: d.unit,
    per: 'frame',
    view: d.views.length === 1 ? d.views[0] : 'both',
    readout: key,
    range,
    ...words,
  };
}

const side = (key: MetricKey) => (key.endsWith('Left') ? 'left' : 'right');

function buildCatalogue(): Record<BandMetricKey, BandMetricInfo> {
  const frame: Record<MetricKey, BandMetricInfo> = {} as Record<MetricKey, BandMetricInfo>;
  for (const key of ['kneeFlexionLeft', 'kneeFlexionRight'] as const)
    frame[key] = frameMetric(
      key,
      [-30, 180],
      amount(`${side(key)} knee straighter than`, `${side(key)} knee bent more than`),
    );
  for (const key of ['hipFlexionLeft', 'hipFlexionRight'] as const)
    frame[key] = frameMetric(
      key,
      [-90, 180],
      amount(`${side(key)} hip more open than`, `${side(key)} hip folded more than`),
    );
  for (const key of ['shinAngleLeft', 'shinAngleRight'] as const)
    frame[key] = frameMetric(
      key,
      LEAN,
      signed(`${side(key)} knee ahead of the ankle`, `${side(key)} knee behind the ankle`, 'deg'),
    );
  for (const key of ['ankleFlexionLeft', 'ankleFlexionRight'] as const)
    frame[key] = frameMetric(
      key,
      LEAN,
      amount(`${side(key)} ankle flexed less than`, `${side(key)} ankle flexed more than`),
    );
  frame.torsoAngle = frameMetric(
    'torsoAngle',
    LEAN,
    signed('upper body leaning forward', 'upper body leaning back', 'deg'),
  );
  frame.shinTorsoMismatch = frameMetric(
    'shinTorsoMismatch',
    ANGLE,
    signed('folded at the waist, back ahead of the shins', 'back more upright than the shins', 'deg'),
  );
  frame.ankleFlexionDifference = frameMetric(
    'ankleFlexionDifference',
    ANGLE,
    signed('left ankle more flexed than the right', 'right ankle more flexed than the left', 'deg'),
  );
  frame.foreAftOffset = frameMetric(
    'foreAftOffset',
    [-5, 5],
    signed('left foot ahead', 'right foot ahead', 'shin lengths'),
  );
  frame.legExtension = frameMetric('legExtension', [0, 1], {
    below: (v) => `legs more bent (extension under ${v})`,
    above: (v) => `legs straighter (extension over ${v})`,
  });
  frame.standHeight = frameMetric('standHeight', [0, 10], {
    below: (v) => `standing lower than ${v}`,
    above: (v) => `standing taller than ${v}`,
  });
  frame.stanceWidthRatio = frameMetric('stanceWidthRatio', [-5, 5], {
    below: (v) => `feet closer together than ${v} of hip width`,
    above: (v) => `feet wider apart than ${v} of hip width`,
  });
  frame.kneeSeparationRatio = frameMetric('kneeSeparationRatio', [-5, 5], {
    below: (v) => `knees closer together than ${v} of hip width`,
    above: (v) => `knees wider apart than ${v} of hip width`,
  });
  frame.shoulderTilt = frameMetric(
    'shoulderTilt',
    LEAN,
    signed('left shoulder higher', 'right shoulder higher', 'deg'),
  );
  frame.hipTilt = frameMetric('hipTilt', LEAN, signed('left hip higher', 'right hip higher', 'deg'));
  frame.inclination = frameMetric(
    'inclination',
    LEAN,
    signed('leaning to the skier’s left', 'leaning to the skier’s right', 'deg'),
  );
  frame.upperBodyInclination = frameMetric(
    'upperBodyInclination',
    LEAN,
    signed('upper body leaning to the left', 'upper body leaning to the right', 'deg'),
  );
  frame.angulation = frameMetric(
    'angulation',
    ANGLE,
    signed('angulated toward the left', 'angulated toward the right', 'deg'),
  );
  frame.kneeAngulation = frameMetric(
    'kneeAngulation',
    ANGLE,
    signed('knees angulated toward the left', 'knees angulated toward the right', 'deg'),
  );
  frame.comForeAft = frameMetric(
    'comForeAft',
    [-5, 5],
    signed('centre of mass ahead of the feet', 'centre of mass behind the feet', 'shin lengths'),
  );
  const turn = (
    key: TurnValueKey,
    label: string,
    unit: MetricUnit,
    range: readonly [number, number],
    words: Words,
  ): BandMetricInfo => ({
    key,
    label,
    unit,
    per: 'turn',
    view: 'front',
    readout: READOUT_OF_TURN_VALUE[key],
    range,
    ...words,
  });
  return {
    ...frame,
    transitionRise: turn('transitionRise', 'Transition rise', 'ratio', [-1, 1], {
      below: (v) => `sinking between turns (rise under ${v})`,
      above: (v) => `standing tall between turns (rise over ${v})`,
    }),
    apexInclination: turn('apexInclination', 'Lean into the turn at the apex', 'deg', [0, 90], {
      below: (v) => `leaning into the turn less than ${v} at the apex`,
      above: (v) => `leaning into the turn more than ${v} at the apex`,
    }),
    apexAngulation: turn('apexAngulation', 'Angulation at the apex', 'deg', [0, 90], {
      below: (v) => `angulation under ${v} at the apex`,
      above: (v) => `angulation over ${v} at the apex`,
    }),
    insideShoulderDrop: turn(
      'insideShoulderDrop',
      'Inside shoulder drop at the apex',
      'deg',
      LEAN,
      signed('inside shoulder lower', 'outside shoulder lower', 'deg'),
    ),
  };
}

export const BAND_METRICS: Record<BandMetricKey, BandMetricInfo> = buildCatalogue();

/**
 * What "outside" means for a band, in one sentence: "knees closer together than 0.80 of hip width,
 * or knees wider apart than 1.30 of hip width".
 */
export function outsideMeaning(metric: BandMetricKey, min: number | null, max: number | null): string {
  const info = BAND_METRICS[metric];
  const parts: string[] = [];
  if (min !== null) parts.push(info.below(formatUnitValue(min, info.unit), min));
  if (max !== null) parts.push(info.above(formatUnitValue(max, info.unit), max));
  if (parts.length === 0) return 'No band set: nothing is flagged';
  const sentence = parts.join(', or ');
  return sentence.charAt(0).toUpperCase() + sentence.slice(1);
}
