import { z } from 'zod';
import type { View } from '../keypoints';
import {
  BAND_METRICS,
  BAND_METRIC_KEYS,
  isBandMetricKey,
  type BandMetricKey,
  type ToleranceBand,
} from '../tolerance';

export const toleranceBandQuerySchema = z.object({
  ageGroupId: z.string().uuid('Choose an age group').optional(),
});

/** PUT/POST /api/tolerance-bands/:ageGroupId/:metric: a known age group id and band metric. */
export const toleranceBandParamsSchema = z.object({
  ageGroupId: z.string().uuid('Not an age group id'),
  metric: z.string().refine(isBandMetricKey, {
    message: `Unknown metric; one of ${BAND_METRIC_KEYS.join(', ')}`,
  }),
});

const bandEdge = z
  // zod 4 numbers refuse NaN and ±Infinity already.
  .number({ message: 'Enter a number, or leave it empty for no limit' })
  .nullable();

/**
 * A band's limits for one metric: numbers inside what the metric can take, lowest not above highest,
 * a target between them. The form and the server use this one schema.
 */
export function toleranceBandInputSchema(metric: BandMetricKey) {
  const info = BAND_METRICS[metric];
  const [lo, hi] = info.range;
  const within = (field: 'min' | 'max' | 'target', value: number | null, ctx: z.RefinementCtx) => {
    if (value !== null && (value < lo || value > hi))
      ctx.addIssue({
        code: 'custom',
        path: [field],
        message: `${info.label} can only be between ${lo} and ${hi}`,
      });
  };
  return z
    .object({ min: bandEdge, max: bandEdge, target: bandEdge.default(null) })
    .strict()
    .superRefine((band, ctx) => {
      within('min', band.min, ctx);
      within('max', band.max, ctx);
      within('target', band.target, ctx);
      if (band.min !== null && band.max !== null && band.min > band.max)
        ctx.addIssue({
          code: 'custom',
          path: ['min'],
          message: 'The lowest value is above the highest; swap them',
        });
      if (
        band.target !== null &&
        ((band.min !== null && band.target < band.min) || (band.max !== null && band.target > band.max))
      )
        ctx.addIssue({ code: 'custom', path: ['target'], message: 'The target lies outside the band' });
    });
}

export type ToleranceBandInput = z.infer<ReturnType<typeof toleranceBandInputSchema>>;
/** What a form holds before parsing (target may be left out). */
export type ToleranceBandFormValues = z.input<ReturnType<typeof toleranceBandInputSchema>>;

export const toleranceHistoryQuerySchema = z.object({
  ageGroupId: z.string().uuid('Choose an age group').optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});

/** A stored band: the shared ToleranceBand plus its row id, age group id, camera view and version. */
export interface ToleranceBandDto extends ToleranceBand {
  id: string;
  ageGroupId: string;
  metric: BandMetricKey;
  /** The view the metric is measured in ("both" for metrics of either view). */
  view: View | 'both';
  /** 1 when seeded; one more with every change. Flags record the version that raised them. */
  version: number;
  /** What "outside" means for this band, in words. */
  meaning: string;
  updatedAt: string;
  updatedBy: string | null;
}

export interface ToleranceBandListResponse {
  bands: ToleranceBandDto[];
  /** Age groups whose bands the caller may change (every group for the head coach). */
  editableAgeGroupIds: string[];
  /** The newest re-evaluation of this club still running, or the last one finished. */
  job: JobDto | null;
}

export interface ToleranceBandChangeDto {
  id: string;
  ageGroupId: string;
  ageGroupName: string;
  metric: BandMetricKey;
  version: number;
  action: 'edit' | 'reset';
  before: { min: number | null; max: number | null; target: number | null; source: string } | null;
  after: { min: number | null; max: number | null; target: number | null; source: string };
  changedBy: string | null;
  changedAt: string;
}

export interface ToleranceBandChangeResponse {
  band: ToleranceBandDto;
  /** The background job that re-evaluates the stored frames of the age group. */
  job: JobDto;
}

export interface JobDto {
  id: string;
  kind: 'flag-reevaluation' | 'clip-analysis';
  status: 'queued' | 'running' | 'done' | 'failed';
  /** Stored frames to evaluate, and how many are done. */
  total: number;
  done: number;
  /** What started it, in words ("U14 knee separation changed"). */
  label: string;
  error: string | null;
  createdAt: string;
  finishedAt: string | null;
}
