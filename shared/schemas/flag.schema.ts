import { z } from 'zod';
import type { PoseModelName } from '../keypoints';
import type { ThumbnailStripDto } from './clip.schema';
import { BAND_METRIC_KEYS, isBandMetricKey, type BandMetricKey } from '../tolerance';

export const FLAG_STATUSES = ['unreviewed', 'reviewed', 'dismissed'] as const;
export type FlagStatus = (typeof FLAG_STATUSES)[number];

const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-12-24');

/** GET /api/flags: filters and a page. Dates are training-session days, both ends included. */
export const flagQuerySchema = z
  .object({
    athleteId: z.string().uuid('Not an athlete id').optional(),
    clipId: z.string().uuid('Not a clip id').optional(),
    ageGroupId: z.string().uuid('Not an age group id').optional(),
    metric: z
      .string()
      .refine(isBandMetricKey, { message: `Unknown metric; one of ${BAND_METRIC_KEYS.join(', ')}` })
      .optional(),
    status: z.enum(FLAG_STATUSES, { message: `One of ${FLAG_STATUSES.join(', ')}` }).optional(),
    from: day.optional(),
    to: day.optional(),
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(100).default(20),
  })
  .strict()
  .refine((q) => !q.from || !q.to || q.from <= q.to, {
    path: ['to'],
    message: 'The end is before the start',
  });

export type FlagQuery = z.infer<typeof flagQuerySchema>;

/** PATCH /api/flags/:id: mark a flag reviewed or dismissed (or open again), with an optional comment. */
export const flagUpdateSchema = z
  .object({
    status: z.enum(FLAG_STATUSES, { message: `One of ${FLAG_STATUSES.join(', ')}` }),
    comment: z.string().trim().max(1000, 'Keep the comment under 1,000 characters').nullable().default(null),
  })
  .strict();

export type FlagUpdateInput = z.infer<typeof flagUpdateSchema>;

/** A flag as the clip workspace reads it. */
export interface ClipFlagDto {
  id: string;
  model: PoseModelName;
  metric: BandMetricKey;
  /** The worst value in the turn or stretch. */
  value: number;
  min: number | null;
  max: number | null;
  /** How far outside the band, in the metric's unit; always positive. */
  distance: number;
  side: 'below' | 'above';
  /** The worst frame. */
  frameIndex: number;
  turnIndex: number | null;
  firstFrame: number;
  lastFrame: number;
  frameCount: number;
  bandVersion: number;
  status: FlagStatus;
}

/** A flag in the club's list (Home inbox, athlete pages). */
export interface FlagDto extends ClipFlagDto {
  clipId: string;
  clipName: string;
  sessionDate: string | null;
  athlete: { id: string; name: string } | null;
  ageGroup: { id: string; name: string } | null;
  /** Time of the worst frame in the clip. */
  timeMs: number | null;
  comment: string | null;
  statusBy: string | null;
  statusAt: string | null;
  createdAt: string;
  /** The clip's thumbnail strip (the tile at timeMs pictures the flag); null before processing. */
  thumbnails: ThumbnailStripDto | null;
}

export interface FlagListResponse {
  flags: FlagDto[];
  total: number;
  page: number;
  pageSize: number;
}
