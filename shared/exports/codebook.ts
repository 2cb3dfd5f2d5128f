import { BLAZEPOSE33_NAMES } from '../keypoints';
import { METRIC_DEFINITIONS, METRIC_KEYS, type MetricKey, type MetricUnit } from '../metrics';

/** The three CSV exports an analyst can download. */
export const EXPORT_KINDS = ['frames', 'keypoints', 'turns'] as const;
export type ExportKind = (typeof EXPORT_KINDS)[number];

/** One column of an export, as the codebook lists it. */
export interface CodebookColumn {
  export: ExportKind;
  name: string;
  definition: string;
  /** Null for ids and text. */
  unit: string | null;
  /** What a positive value means; null where there is no sign. */
  sign: string | null;
  /** The camera view the value exists in; null for columns of every row. */
  view: 'front' | 'side' | 'both' | null;
  /** What an empty cell means. */
  empty: string | null;
}

/** Unit suffix of a metric column: `kneeFlexionLeft_deg`, `stanceWidthRatio_ratio`, `foreAftOffset_shin`. */
export const UNIT_SUFFIX: Record<MetricUnit, string> = {
  deg: 'deg',
  ratio: 'ratio',
  'shin lengths': 'shin',
  'hip widths': 'hipw',
};

const UNIT_WORDS: Record<MetricUnit, string> = {
  deg: 'degrees',
  ratio: 'ratio (no unit)',
  'shin lengths': 'shin lengths (knee-to-ankle distance)',
  'hip widths': 'hip widths (distance between the hip points)',
};

/** The sign of each metric, as docs/metrics.md states it. */
export const METRIC_SIGNS: Record<MetricKey, string> = {
  kneeFlexionLeft: '0 = straight leg, + = bent',
  kneeFlexionRight: '0 = straight leg, + = bent',
  hipFlexionLeft: '0 = straight hip, + = folded',
  hipFlexionRight: '0 = straight hip, + = folded',
  shinAngleLeft: '+ = knee ahead of the ankle',
  shinAngleRight: '+ = knee ahead of the ankle',
  torsoAngle: '+ = leaning forward',
  shinTorsoMismatch: '0 = back parallel to the shins, + = folded at the waist',
  ankleFlexionLeft: '+ = dorsiflexion (shin toward the toes)',
  ankleFlexionRight: '+ = dorsiflexion (shin toward the toes)',
  ankleFlexionDifference: '+ = left ankle more flexed',
  foreAftOffset: '+ = left foot ahead',
  legExtension: '1 = fully straight, less = bent',
  standHeight: 'larger = standing taller; about 3.3 for straight legs',
  stanceWidthRatio: '1 = feet as wide as the hips',
  kneeSeparationRatio: '1 = knees as wide as the hips, below = knees pinched in',
  shoulderTilt: '+ = left shoulder higher',
  hipTilt: '+ = left hip higher',
  inclination: '+ = toward the skier’s left',
  upperBodyInclination: '+ = toward the skier’s left',
  angulation: 'same sign as the lean',
  kneeAngulation: '+ = shins lean further toward the skier’s left than the thighs',
  comForeAft: '− = back, on the heels',
};

const NULL_METRIC =
  'Not measured on this frame: the other camera view, a keypoint not found or under the confidence floor (0.3), or no skier found. The reason is stored with the frame and shown in the app.';

export const metricColumn = (key: MetricKey) => `${key}_${UNIT_SUFFIX[METRIC_DEFINITIONS[key].unit]}`;
export const confidenceColumn = (key: MetricKey) => `${key}_conf`;
export const apexColumn = (key: MetricKey) => `apex_${metricColumn(key)}`;

const viewOf = (key: MetricKey) => {
  const views = METRIC_DEFINITIONS[key].views;
  return views.length === 1 ? views[0] : 'both';
};

const column = (
  kind: ExportKind,
  name: string,
  definition: string,
  extra: Partial<Omit<CodebookColumn, 'export' | 'name' | 'definition'>> = {},
): CodebookColumn => ({
  export: kind,
  name,
  definition,
  unit: null,
  sign: null,
  view: null,
  empty: null,
  ...extra,
});

function sharedColumns(kind: ExportKind): CodebookColumn[] {
  return [
    column(kind, 'clip_id', 'Id of the clip (stable; the same clip in every export).'),
    column(
      kind,
      'clip_name',
      'File name the clip was uploaded with. Text that a spreadsheet would run as a formula starts with an apostrophe.',
    ),
    column(kind, 'athlete_id', 'Id of the clip’s first tagged athlete (never a name or contact detail).', {
      empty: 'No athlete tagged, or the athlete is outside what you may see.',
    }),
    column(kind, 'session_date', 'Training-session day, YYYY-MM-DD.'),
    column(kind, 'view', 'Camera view the clip was filmed from: front or side.'),
    column(kind, 'model', 'Pose model whose keypoints were stored: lightning, thunder or blazepose.'),
  ];
}

const CAREFUL_TEXT =
  'true when the frame was read carefully: with its mirror image too, the two reads averaged (docs/accuracy.md, "Careful reading of clips").';

/** Every column of every export, from the metric definitions the code itself uses. */
export function codebook(): CodebookColumn[] {
  const frames: CodebookColumn[] = [
    ...sharedColumns('frames'),
    column('frames', 'frame', 'Frame index in the clip, from 0.'),
    column('frames', 'time_ms', 'Presentation time of the frame in the clip.', { unit: 'milliseconds' }),
    column('frames', 'corrected', 'true when a coach moved the keypoints of this frame by hand.'),
    column('frames', 'careful', CAREFUL_TEXT),
    ...METRIC_KEYS.flatMap((key) => {
      const d = METRIC_DEFINITIONS[key];
      return [
        column('frames', metricColumn(key), `${d.label}: ${d.description}`, {
          unit: UNIT_WORDS[d.unit],
          sign: METRIC_SIGNS[key],
          view: viewOf(key),
          empty: NULL_METRIC,
        }),
        column(
          'frames',
          confidenceColumn(key),
          `${d.label}: mean detection score (0 to 1) of the keypoints this metric reads (${d.keypoints.join(', ')}), among those found.`,
          { unit: 'score 0 to 1', view: viewOf(key), empty: 'None of its keypoints was found.' },
        ),
      ];
    }),
  ];
  const keypoints: CodebookColumn[] = [
    ...sharedColumns('keypoints'),
    column('keypoints', 'frame', 'Frame index in the clip, from 0.'),
    column('keypoints', 'time_ms', 'Presentation time of the frame in the clip.', { unit: 'milliseconds' }),
    column('keypoints', 'keypoint', `Keypoint name: ${BLAZEPOSE33_NAMES.join(', ')}.`),
    column('keypoints', 'x_px', 'Horizontal position in the playable video, pixels from the left edge.', {
      unit: 'pixels',
      sign: '+ = right',
    }),
    column('keypoints', 'y_px', 'Vertical position in the playable video, pixels from the top edge.', {
      unit: 'pixels',
      sign: '+ = down',
    }),
    column('keypoints', 'score', 'How sure the model is of the point, 0 to 1.', { unit: 'score 0 to 1' }),
    column('keypoints', 'corrected', 'true when a coach moved the keypoints of this frame by hand.'),
    column('keypoints', 'careful', CAREFUL_TEXT),
    column('keypoints', 'frame_width_px', 'Width of the playable video.', { unit: 'pixels' }),
    column('keypoints', 'frame_height_px', 'Height of the playable video.', { unit: 'pixels' }),
  ];
  const turns: CodebookColumn[] = [
    ...sharedColumns('turns'),
    column('turns', 'turn', 'Turn number in the clip, from 0 (docs/metrics.md "Turns").'),
    column('turns', 'direction', 'left or right: the way the skier turns (leans).'),
    column('turns', 'complete', 'false when the clip cuts the turn at its start or end.'),
    column('turns', 'start_ms', 'Start of the turn (a transition, or the clip’s start).', {
      unit: 'milliseconds',
    }),
    column('turns', 'apex_ms', 'Apex: the frame of largest |inclination| in the turn.', {
      unit: 'milliseconds',
    }),
    column('turns', 'end_ms', 'End of the turn (a transition, or the clip’s end).', { unit: 'milliseconds' }),
    column('turns', 'duration_ms', 'end_ms − start_ms.', { unit: 'milliseconds' }),
    ...METRIC_KEYS.filter((key) => viewOf(key) !== 'side').map((key) =>
      column('turns', apexColumn(key), `${METRIC_DEFINITIONS[key].label} at the apex (smoothed series).`, {
        unit: UNIT_WORDS[METRIC_DEFINITIONS[key].unit],
        sign: METRIC_SIGNS[key],
        view: viewOf(key),
        empty: NULL_METRIC,
      }),
    ),
    column(
      'turns',
      'transition_rise_ratio',
      'legExtension at the transition ending the turn minus at its apex.',
      {
        unit: UNIT_WORDS.ratio,
        sign: '+ = standing taller at the transition',
        view: 'front',
        empty: 'The turn does not end in a transition (the clip ends first).',
      },
    ),
    column(
      'turns',
      'inside_shoulder_drop_deg',
      'shoulderTilt at the apex with the inside shoulder lower positive.',
      {
        unit: UNIT_WORDS.deg,
        sign: '+ = inside shoulder lower',
        view: 'front',
        empty: 'Shoulders not measured at the apex.',
      },
    ),
    column('turns', 'flags', 'How many habits were outside their age-group band in this turn.'),
    column('turns', 'flag_metrics', 'Which: band metric keys separated by a semicolon.'),
  ];
  return [...frames, ...keypoints, ...turns];
}

/** Column names of one export, in file order; a frames export may be narrowed to some metrics. */
export function exportColumns(kind: ExportKind, metrics: readonly MetricKey[] = METRIC_KEYS): string[] {
  const all = codebook().filter((c) => c.export === kind);
  if (kind !== 'frames') return all.map((c) => c.name);
  const chosen = new Set(metrics.flatMap((k) => [metricColumn(k), confidenceColumn(k)]));
  const metricNames = new Set(METRIC_KEYS.flatMap((k) => [metricColumn(k), confidenceColumn(k)]));
  return all.filter((c) => !metricNames.has(c.name) || chosen.has(c.name)).map((c) => c.name);
}

/**
 * A number as every export writes it: decimal point, no grouping, no exponent, at most six decimals,
 * trailing zeros dropped, never "-0".
 */
export function formatExportNumber(value: number): string {
  if (!Number.isFinite(value)) return '';
  // Rounded to a whole number of millionths, the shortest decimal that reads back as it: never an
  // exponent for the magnitudes measured here (|value| < 1e9), and -0 reads as 0.
  const rounded = Math.round(value * 1e6) / 1e6;
  return rounded === 0 ? '0' : String(rounded);
}

/** OWASP CSV Injection: text a spreadsheet would run as a formula gets a leading apostrophe. */
export function neutraliseFormula(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}
