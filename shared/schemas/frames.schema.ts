import { z } from 'zod';
import {
  BLAZEPOSE33_NAMES,
  COCO17_NAMES,
  POSE_MODELS,
  SKIER_FACINGS,
  type Keypoint,
  type PoseModelName,
  type SkierFacing,
} from '../keypoints';
import type { MetricKey } from '../metrics';
import type { FilterRecord, SeriesSummary, Turn } from '../series';
import type { ClipFlagDto } from './flag.schema';

/** No training clip is longer: a time past it is a mistake (it also keeps WebVTT cues valid). */
export const MAX_CLIP_TIME_MS = 6 * 3600 * 1000;

/** Most frames one POST /api/clips/:id/frames may carry. */
export const MAX_FRAMES_PER_BATCH = 500;

/** Image pixels can lie a little outside the frame; anything this far out is a unit mistake. */
const COORDINATE_LIMIT = 100_000;

const COCO_NAMES: ReadonlySet<string> = new Set<string>(COCO17_NAMES);

export const poseModelSchema = z.enum(POSE_MODELS as [PoseModelName, ...PoseModelName[]], {
  message: `Choose a model: ${POSE_MODELS.join(', ')}`,
});

export const keypointSchema = z.object({
  name: z.enum(BLAZEPOSE33_NAMES, { message: 'Unknown keypoint name' }),
  x: z.number().min(-COORDINATE_LIMIT).max(COORDINATE_LIMIT),
  y: z.number().min(-COORDINATE_LIMIT).max(COORDINATE_LIMIT),
  score: z.number().min(0, 'score is 0..1').max(1, 'score is 0..1'),
});

const keypointListSchema = z.array(keypointSchema).max(BLAZEPOSE33_NAMES.length);

/** Names a model can emit: MoveNet gives COCO-17, BlazePose the 33-point set. */
function checkKeypointsForModel(
  model: PoseModelName,
  keypoints: readonly { name: string }[],
  ctx: z.RefinementCtx,
  path: (string | number)[],
): void {
  const seen = new Set<string>();
  keypoints.forEach((k, i) => {
    if (seen.has(k.name)) {
      ctx.addIssue({ code: 'custom', path: [...path, i, 'name'], message: `${k.name} appears twice` });
    }
    seen.add(k.name);
    if (model !== 'blazepose' && !COCO_NAMES.has(k.name)) {
      ctx.addIssue({
        code: 'custom',
        path: [...path, i, 'name'],
        message: `${k.name} is not a point the ${model} model has (it gives the 17 COCO points)`,
      });
    }
  });
}

export const frameUploadSchema = z.object({
  frameIndex: z.number().int('frameIndex is a whole number').min(0),
  timeMs: z.number().min(0).max(MAX_CLIP_TIME_MS, 'Times past 6 hours are not clip times'),
  keypoints: keypointListSchema,
  corrected: z.boolean().optional(),
  /** Accepted and ignored: the server computes every metric itself from the keypoints. */
  metrics: z.unknown().optional(),
});

export const frameBatchSchema = z
  .object({
    model: poseModelSchema,
    /** The frames were read carefully (with their mirror images, averaged). */
    careful: z.boolean({ message: 'careful is true or false' }).optional(),
    /**
     * The clip's facing the points were oriented for when they were read; when the coach has turned it
     * since (the stored frames were swapped then), the batch is swapped to match before it is stored.
     */
    facing: z
      .enum(SKIER_FACINGS as [SkierFacing, ...SkierFacing[]], { message: 'facing is toward or away' })
      .optional(),
    frames: z
      .array(frameUploadSchema)
      .min(1, 'Send at least one frame')
      .max(MAX_FRAMES_PER_BATCH, `Send at most ${MAX_FRAMES_PER_BATCH} frames a request`),
  })
  .superRefine((batch, ctx) => {
    const indices = new Set<number>();
    batch.frames.forEach((frame, i) => {
      if (indices.has(frame.frameIndex)) {
        ctx.addIssue({
          code: 'custom',
          path: ['frames', i, 'frameIndex'],
          message: `frame ${frame.frameIndex} appears twice in this batch`,
        });
      }
      indices.add(frame.frameIndex);
      checkKeypointsForModel(batch.model, frame.keypoints, ctx, ['frames', i, 'keypoints']);
    });
  });
export type FrameBatchInput = z.infer<typeof frameBatchSchema>;

export const frameCorrectionSchema = z
  .object({
    model: poseModelSchema,
    keypoints: keypointListSchema,
    /** Needed only when the frame has no stored result yet and the clip's frame rate is unknown. */
    timeMs: z.number().min(0).max(MAX_CLIP_TIME_MS, 'Times past 6 hours are not clip times').optional(),
  })
  .superRefine((body, ctx) => checkKeypointsForModel(body.model, body.keypoints, ctx, ['keypoints']));
export type FrameCorrectionInput = z.infer<typeof frameCorrectionSchema>;

export const frameListQuerySchema = z.object({ model: poseModelSchema.optional() });

/** One stored frame: keypoints as detected (or corrected) and the server's own metrics. */
export interface FrameResultDto {
  frameIndex: number;
  timeMs: number;
  keypoints: Keypoint[];
  metrics: Record<MetricKey, number | null>;
  reasons: Partial<Record<MetricKey, string>>;
  corrected: boolean;
  /** Read carefully: the frame and its mirror image, averaged (docs/accuracy.md). */
  careful: boolean;
}

export interface ClipSeriesDto {
  turns: Turn[];
  transitions: { frameIndex: number; timeMs: number }[];
  summary: SeriesSummary;
  filter: FilterRecord;
}

export interface ClipFramesResponse {
  model: PoseModelName;
  frames: FrameResultDto[];
  /** Null when no frames are stored yet (or the frame rate is not known). */
  series: ClipSeriesDto | null;
  /** Flags of this model: one per habit and turn (or stretch outside turns). */
  flags: ClipFlagDto[];
}

export interface FrameBatchResponse {
  /** Frames written; a corrected frame is never replaced by a detected one, so skipped ones are not counted. */
  stored: number;
  /** Flags now stored for this clip and model (they are refreshed with the turns, after the clip's last frame). */
  flags: number;
}

export interface FrameResultResponse {
  frame: FrameResultDto;
}
