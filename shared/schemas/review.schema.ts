import { z } from 'zod';
import type { PhaseValue } from '../plan';
import type { ClipDto } from './clip.schema';
import type { NoteDto } from './note.schema';
import type { CompareStillDto, FocusPointDto } from './plan.schema';

export const REVIEW_STATUSES = ['draft', 'published', 'withdrawn'] as const;
export type ReviewStatus = (typeof REVIEW_STATUSES)[number];

export const REVIEW_ITEM_KINDS = ['note', 'focus_point', 'still'] as const;
export type ReviewItemKind = (typeof REVIEW_ITEM_KINDS)[number];

/** What the athlete sees drawn on the clip: the tilt gauge by default, the rest if the coach chooses. */
export const reviewOverlaysSchema = z
  .object({ tiltGauge: z.boolean(), skeleton: z.boolean(), angleArcs: z.boolean(), widthBars: z.boolean() })
  .strict();
export type ReviewOverlays = z.infer<typeof reviewOverlaysSchema>;
export const DEFAULT_REVIEW_OVERLAYS: ReviewOverlays = {
  tiltGauge: true,
  skeleton: false,
  angleArcs: false,
  widthBars: false,
};

export const MAX_REVIEW_SUMMARY = 2000;
const id = (what: string) => z.string().uuid(`Not a ${what} id`);

export const createReviewSchema = z.object({ clipId: id('clip'), athleteId: id('athlete') }).strict();

/** A draft as it is written: any subset of its fields, saved as the coach types. */
export const updateReviewSchema = z
  .object({
    title: z.string().trim().min(1, 'Give the review a title').max(120).optional(),
    summary: z
      .string()
      .trim()
      .max(MAX_REVIEW_SUMMARY, `Keep the summary under ${MAX_REVIEW_SUMMARY} characters`)
      .optional(),
    noteIds: z.array(id('note')).max(30, 'Choose at most 30 notes').optional(),
    focusPointIds: z.array(id('focus point')).max(20).optional(),
    stillIds: z.array(id('still')).max(10).optional(),
    compareClipId: id('clip').nullable().optional(),
    overlays: reviewOverlaysSchema.optional(),
    showCurves: z.boolean().optional(),
  })
  .strict()
  .refine((v) => Object.values(v).some((x) => x !== undefined), 'Change at least one field');
export type UpdateReviewInput = z.infer<typeof updateReviewSchema>;

export const reviewListQuerySchema = z.object({
  clipId: id('clip').optional(),
  athleteId: id('athlete').optional(),
});

export interface ReviewSummaryDto {
  id: string;
  clipId: string;
  clipName: string;
  athlete: { id: string; name: string };
  title: string;
  status: ReviewStatus;
  publishedAt: string | null;
  updatedAt: string;
  author: string | null;
  /** For the athlete or guardian reading the list: not opened since it was (re)published. */
  unread: boolean;
}

export interface ReviewDto extends ReviewSummaryDto {
  summary: string;
  overlays: ReviewOverlays;
  noteIds: string[];
  focusPointIds: string[];
  stillIds: string[];
  compareClipId: string | null;
  showCurves: boolean;
  withdrawnAt: string | null;
  createdAt: string;
}

/** A focus point as the athlete reads it: plain words and this clip's value against the target. */
export interface ReviewFocusPointDto {
  point: FocusPointDto;
  /** This clip's value (median over its turns at the point's phase); null for a point in words. */
  value: PhaseValue | null;
  /** "Knee separation 0.70 at the apex, target 1.00 to 1.30". */
  words: string;
}

/** Everything the review page shows, exactly as the athlete sees it (the coach's preview too). */
export interface ReviewViewResponse {
  review: ReviewDto;
  clip: ClipDto;
  compareClip: ClipDto | null;
  notes: NoteDto[];
  focusPoints: ReviewFocusPointDto[];
  stills: CompareStillDto[];
  /** The coach's view of a draft, not the athlete's own reading. */
  preview: boolean;
}

export interface ReviewReceiptDto {
  name: string;
  role: 'athlete' | 'guardian';
  firstOpenedAt: string;
  lastOpenedAt: string;
  opens: number;
}

export interface ReviewRecipientDto {
  name: string;
  email: string;
  role: 'athlete' | 'guardian';
  /** No password set yet: the e-mail carries a link to set one that lands on the review. */
  invited: boolean;
  /** False when consent covers no e-mail: the review waits on their Home instead. */
  emailed: boolean;
}

export interface PublishReviewResponse {
  review: ReviewDto;
  recipients: ReviewRecipientDto[];
}
