import { z } from 'zod';
import { CLIP_VIEWS } from './clip.schema';
import { METRIC_KEYS, isMetricKey, type MetricKey } from '../metrics';
import { EXPORT_KINDS, type CodebookColumn, type ExportKind } from '../exports/codebook';

const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-12-24');
const id = (what: string) => z.string().uuid(`Not ${what} id`).optional();

/** The filters every export takes (GET /api/exports/*.csv and /api/exports/count). */
const exportFilters = z.object({
  clipId: id('a clip'),
  athleteId: id('an athlete'),
  sessionId: id('a session'),
  ageGroupId: id('an age group'),
  from: day.optional(),
  to: day.optional(),
  view: z.enum(CLIP_VIEWS, { message: 'Choose front or side' }).optional(),
  /** Comma-separated metric keys (frames export); all when left out. */
  metrics: z
    .string()
    .optional()
    .transform((text, ctx) => {
      if (text === undefined || text.trim() === '') return undefined;
      const keys = text.split(',').map((k) => k.trim());
      const unknown = keys.filter((k) => !isMetricKey(k));
      if (unknown.length > 0) {
        ctx.addIssue({
          code: 'custom',
          message: `Unknown metric ${unknown.join(', ')}; one of ${METRIC_KEYS.join(', ')}`,
        });
        return z.NEVER;
      }
      return [...new Set(keys)] as MetricKey[];
    }),
  /** raw: each frame's own metrics; smoothed: the clip's filtered series (codebook "smoothing"). */
  values: z.enum(['raw', 'smoothed'], { message: 'Choose raw or smoothed' }).default('raw'),
});

const datesInOrder = (q: { from?: string; to?: string }) => !q.from || !q.to || q.from <= q.to;
const outOfOrder = { path: ['to'], message: 'The end is before the start' };

export const exportQuerySchema = exportFilters.strict().refine(datesInOrder, outOfOrder);
export type ExportQuery = z.infer<typeof exportQuerySchema>;

export const exportCountQuerySchema = exportFilters
  .extend({ kind: z.enum(EXPORT_KINDS, { message: 'Choose frames, keypoints or turns' }) })
  .strict()
  .refine(datesInOrder, outOfOrder);
export type ExportCountQuery = z.infer<typeof exportCountQuerySchema>;

export interface ExportCountResponse {
  kind: ExportKind;
  clips: number;
  rows: number;
  /** Estimated file size from the columns and rows, before download. */
  approxBytes: number;
  columns: string[];
}

export interface CodebookResponse {
  columns: CodebookColumn[];
  /** How values=smoothed is smoothed, and gaps filled. */
  smoothing: string;
  numbers: string;
}
