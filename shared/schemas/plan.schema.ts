import { z } from 'zod';
import type { View } from '../keypoints';
import { FOCUS_PHASES, fixedPhaseOf, TARGET_DIRECTIONS, type FocusPhase, type PhaseValue } from '../plan';
import { BAND_METRICS, BAND_METRIC_KEYS, isBandMetricKey, type BandMetricKey } from '../tolerance';
import { isCalendarDate } from './session.schema';

const calendarDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-11-01')
  .refine(isCalendarDate, 'That day does not exist');

/** A club's season, e.g. "2026-27" from 1 November to 30 April; clips belong to it by session date. */
export const seasonInputSchema = z
  .object({
    name: z.string().trim().min(1, 'Name the season, e.g. 2026-27').max(40),
    startsOn: calendarDate,
    endsOn: calendarDate,
  })
  .strict()
  .refine((s) => s.startsOn <= s.endsOn, { path: ['endsOn'], message: 'The season ends before it starts' });
export type SeasonInput = z.infer<typeof seasonInputSchema>;

export interface SeasonDto {
  id: string;
  name: string;
  startsOn: string;
  endsOn: string;
}

export const FOCUS_STATUSES = ['planned', 'working', 'improving', 'reached'] as const;
export type FocusStatus = (typeof FOCUS_STATUSES)[number];
export const FOCUS_STATUS_LABELS: Record<FocusStatus, string> = {
  planned: 'Planned',
  working: 'Working on',
  improving: 'Improving',
  reached: 'Reached',
};

const targetEdge = z.number({ message: 'Enter a number, or leave it empty' }).nullable();

/**
 * A focus point as a coach writes it: a title and cue in their own words, and either a metric (with the
 * phase it is judged at and a target range or direction) or free text only. One schema for form and API.
 */
export const focusPointInputSchema = z
  .object({
    seasonId: z.string().uuid('Choose a season'),
    title: z.string().trim().min(1, 'Give the focus point a short title').max(120),
    cue: z.string().trim().max(500, 'Keep the cue under 500 characters').default(''),
    metric: z
      .string()
      .refine(isBandMetricKey, { message: `Unknown metric; one of ${BAND_METRIC_KEYS.join(', ')}` })
      .nullable()
      .default(null),
    phase: z.enum(FOCUS_PHASES).nullable().default(null),
    targetMin: targetEdge.default(null),
    targetMax: targetEdge.default(null),
    direction: z.enum(TARGET_DIRECTIONS).nullable().default(null),
    status: z.enum(FOCUS_STATUSES).default('planned'),
  })
  .strict()
  .superRefine((p, ctx) => {
    const issue = (path: string, message: string) => ctx.addIssue({ code: 'custom', path: [path], message });
    if (p.metric === null) {
      if (p.targetMin !== null || p.targetMax !== null || p.direction !== null)
        issue('metric', 'A target needs a metric; choose one, or clear the target');
      return;
    }
    if (!isBandMetricKey(p.metric)) return; // already reported by the field's own check
    const info = BAND_METRICS[p.metric];
    const fixed = fixedPhaseOf(p.metric);
    if (p.phase === null) issue('phase', 'Choose where in the turn it is judged');
    else if (fixed && p.phase !== fixed)
      issue('phase', `${info.label} is measured ${fixed === 'apex' ? 'at the apex' : 'at the transition'}`);
    else if (info.view === 'side' && p.phase !== 'turn')
      issue('phase', 'Side views have no turns found in them; judge it over the whole turn (the clip)');
    const [lo, hi] = info.range;
    for (const field of ['targetMin', 'targetMax'] as const) {
      const v = p[field];
      if (v !== null && (v < lo || v > hi)) issue(field, `${info.label} can only be between ${lo} and ${hi}`);
    }
    if (p.targetMin !== null && p.targetMax !== null && p.targetMin > p.targetMax)
      issue('targetMin', 'The lowest value is above the highest; swap them');
    const hasRange = p.targetMin !== null || p.targetMax !== null;
    if (hasRange && p.direction !== null) issue('direction', 'Give a range or a direction, not both');
    if (!hasRange && p.direction === null)
      issue('targetMin', 'Give a target range, or a direction to move in');
  });
export type FocusPointInput = z.infer<typeof focusPointInputSchema>;
export type FocusPointFormValues = z.input<typeof focusPointInputSchema>;

export const focusPointOrderSchema = z
  .object({ ids: z.array(z.string().uuid('Not a focus point id')).min(1).max(50) })
  .strict()
  .refine((o) => new Set(o.ids).size === o.ids.length, { message: 'A focus point appears twice' });

export const baselineInputSchema = z
  .object({
    seasonId: z.string().uuid('Choose a season'),
    clipId: z.string().uuid('Not a clip id').nullable(),
  })
  .strict();

export const planQuerySchema = z.object({ seasonId: z.string().uuid('Not a season id').optional() });

export interface FocusPointDto {
  id: string;
  athleteId: string;
  seasonId: string;
  rank: number;
  title: string;
  cue: string;
  metric: BandMetricKey | null;
  phase: FocusPhase | null;
  targetMin: number | null;
  targetMax: number | null;
  direction: (typeof TARGET_DIRECTIONS)[number] | null;
  status: FocusStatus;
  updatedAt: string;
}

/** One clip of the season on a focus point's chart. */
export interface ProgressPoint extends PhaseValue {
  clipId: string;
  clipName: string;
  sessionDate: string;
  view: View;
  baseline: boolean;
}

export interface FocusProgressDto {
  focusPointId: string;
  points: ProgressPoint[];
}

export interface SeasonClipDto {
  id: string;
  originalName: string;
  sessionDate: string;
  view: View;
  status: string;
  /** Whole-clip analysis stored (frames of the clip's model). */
  analysed: boolean;
  /** Turns found in the stored analysis. */
  turnCount: number;
}

export interface SeasonPlanResponse {
  seasons: SeasonDto[];
  /** The season shown: the one asked for, else the one holding today, else the latest. Null without any. */
  season: SeasonDto | null;
  focusPoints: FocusPointDto[];
  baselineClipId: string | null;
  /** The athlete's clips in the season, oldest first. */
  clips: SeasonClipDto[];
  progress: FocusProgressDto[];
  canEdit: boolean;
}

export interface CompareStillDto {
  id: string;
  clipAId: string;
  clipBId: string;
  frameA: number;
  frameB: number;
  caption: string;
  createdAt: string;
  createdBy: string | null;
}

/** PNG of both stages side by side, as a data URL (a few hundred kB; 6 MB at most). */
export const MAX_COMPARE_STILL_BYTES = 6 * 1024 * 1024;
export const compareStillInputSchema = z
  .object({
    clipAId: z.string().uuid('Not a clip id'),
    clipBId: z.string().uuid('Not a clip id'),
    frameA: z.number().int().min(0),
    frameB: z.number().int().min(0),
    caption: z.string().trim().max(200).default(''),
    png: z
      .string()
      .regex(/^data:image\/png;base64,[A-Za-z0-9+/]+=*$/, 'Send the still as a PNG data URL')
      .max(Math.ceil((MAX_COMPARE_STILL_BYTES * 4) / 3) + 32, 'The still is larger than 6 MB'),
  })
  .strict();
export type CompareStillInput = z.infer<typeof compareStillInputSchema>;

export const compareStillQuerySchema = z.object({
  a: z.string().uuid('Not a clip id'),
  b: z.string().uuid('Not a clip id'),
});
