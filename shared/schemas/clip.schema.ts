import { z } from 'zod';
import {
  POSE_MODELS,
  type AthletePick,
  type PoseModelName,
  type ReferenceLine,
  type SkierFacing,
} from '../keypoints';

export const CLIP_VIEWS = ['front', 'side'] as const;
export const CLIP_STATUSES = ['uploaded', 'processing', 'ready', 'failed'] as const;
export type ClipStatus = (typeof CLIP_STATUSES)[number];

/** Text fields of the multipart POST /api/clips (the file goes in the field "file"). */
export const uploadClipFieldsSchema = z.object({
  sessionId: z.string().uuid('Choose a training session'),
  /** One or more athletes in the clip, comma-separated in the form field. */
  athleteIds: z
    .union([z.string(), z.array(z.string())])
    .transform((v) => (Array.isArray(v) ? v : v.split(',')).map((s) => s.trim()).filter(Boolean))
    .pipe(z.array(z.string().uuid()).min(1, 'Tag at least one athlete')),
  view: z.enum(CLIP_VIEWS, { message: 'Choose front or side view' }),
  /** Front view filmed from behind: 'away'. */
  facing: z.enum(['toward', 'away'], { message: 'Choose toward or away from the camera' }).optional(),
});
export type UploadClipFields = z.input<typeof uploadClipFieldsSchema>;

export const clipListQuerySchema = z.object({
  athleteId: z.string().uuid().optional(),
  sessionId: z.string().uuid().optional(),
});

export const MAX_CLIP_BYTES_DEFAULT = 2 * 1024 * 1024 * 1024;
/** Longest side of a clip, in pixels: 4K phone video (3840 × 2160) and its portrait form fit. */
export const MAX_CLIP_SIDE_PX = 4096;
export const ACCEPTED_CLIP_EXTENSIONS = ['.mp4', '.mov', '.m4v', '.webm', '.avi', '.mkv'] as const;

export interface ClipDto {
  id: string;
  sessionId: string;
  athletes: { id: string; name: string }[];
  view: (typeof CLIP_VIEWS)[number];
  /** Front view: toward the camera, or away from it (filmed from behind; left and right swapped back). */
  facing: SkierFacing;
  /** The athlete picked among several people (followed from that frame on), or null. */
  athletePick: AthletePick | null;
  status: ClipStatus;
  failureReason: string | null;
  originalName: string;
  sizeBytes: number;
  codec: string | null;
  width: number | null;
  height: number | null;
  fps: number | null;
  frameCount: number | null;
  durationMs: number | null;
  createdAt: string;
  /** Short-lived signed URL usable by a <video> element (Range requests supported). */
  mediaUrl: string;
  /** JPEG still from the first second; null until processing is done. */
  posterUrl: string | null;
  thumbnails: ThumbnailStripDto | null;
  /** Rotation of the uploaded file in degrees; the playable copy has it applied already. */
  rotation: number;
  /** Snow line in the playable video's pixel space; null means the image horizontal. */
  referenceLine: ReferenceLine | null;
  /** Snow lines set on single frames (a camera that panned); each holds for its frame only. */
  frameReferenceLines: FrameReferenceLineDto[];
  defaultModel: PoseModelName;
  /** Age group of the first tagged athlete: its tolerance bands apply to the clip. */
  ageGroup: { id: string; name: string } | null;
  /** Stored pose results of the clip's default model (or the latest model when it has none). */
  analysis: ClipAnalysisDto | null;
  /** The newest analysis of the clip on the server (queued, running, done or failed), or null. */
  serverAnalysis: ServerAnalysisDto | null;
}

/** A clip analysed on the server in the background: frames done of total, stored as they come. */
export interface ServerAnalysisDto {
  jobId: string;
  model: PoseModelName;
  status: 'queued' | 'running' | 'done' | 'failed';
  done: number;
  total: number;
  /** Why it failed, in words for the coach. */
  error: string | null;
  updatedAt: string;
  /** Queued but held until then: a coach's browser is analysing the clip and posting its frames. */
  heldUntil: string | null;
  /** Each frame read with its mirror image too. */
  careful: boolean;
}

/** One JPEG sprite: tile i shows the frame at i * intervalMs, row-major, `columns` tiles a row. */
export interface ThumbnailStripDto {
  url: string;
  count: number;
  tileWidth: number;
  tileHeight: number;
  columns: number;
  intervalMs: number;
}

export interface FrameReferenceLineDto {
  frameIndex: number;
  referenceLine: ReferenceLine;
}

export interface ClipAnalysisDto {
  frameCount: number;
  model: PoseModelName;
  updatedAt: string;
}

const COORDINATE_LIMIT = 100_000;
const pixelSchema = z.number().min(-COORDINATE_LIMIT).max(COORDINATE_LIMIT);

/** Two points along the snow surface; they must be apart, or the line has no direction. */
export const referenceLineSchema = z
  .tuple([z.tuple([pixelSchema, pixelSchema]), z.tuple([pixelSchema, pixelSchema])])
  .refine(
    ([[x1, y1], [x2, y2]]) => Math.hypot(x2 - x1, y2 - y1) >= 1,
    'Set the snow line with two points at least a pixel apart',
  );

export const updateClipSchema = z
  .object({
    view: z.enum(CLIP_VIEWS, { message: 'Choose front or side view' }).optional(),
    facing: z.enum(['toward', 'away'], { message: 'Choose toward or away from the camera' }).optional(),
    /** null forgets the pick: whoever the model finds is measured. */
    athletePick: z
      .object({
        frameIndex: z.number().int('frameIndex is a whole number').min(0),
        x: z.number().finite().min(0, 'The point must be inside the frame'),
        y: z.number().finite().min(0, 'The point must be inside the frame'),
      })
      .strict()
      .nullable()
      .optional(),
    defaultModel: z
      .enum(POSE_MODELS as [PoseModelName, ...PoseModelName[]], {
        message: `Choose a model: ${POSE_MODELS.join(', ')}`,
      })
      .optional(),
    /** null puts the snow line back to the image horizontal. */
    referenceLine: referenceLineSchema.nullable().optional(),
    /** Lines for single frames, over the clip's line; null removes a frame's own line. */
    frameReferenceLines: z
      .array(
        z.object({
          frameIndex: z.number().int('frameIndex is a whole number').min(0),
          referenceLine: referenceLineSchema.nullable(),
        }),
      )
      .min(1)
      .max(1000)
      .optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), 'Change at least one setting');
export type UpdateClipInput = z.input<typeof updateClipSchema>;

export interface ClipListResponse {
  clips: ClipDto[];
}
export interface ClipResponse {
  clip: ClipDto;
}

export interface ServerAnalysisResponse {
  serverAnalysis: ServerAnalysisDto | null;
  /** While the clip is still being prepared its analysis cannot start yet. */
  clipStatus: ClipStatus;
  /** Frames stored with the clip's default model (by the browser or the server). */
  storedFrames: number;
  frameCount: number | null;
}

/** Ask the server to analyse a clip in the background. */
export const serverAnalysisRequestSchema = z
  .object({
    /** Default: the clip's default model. */
    model: z
      .enum(POSE_MODELS as [PoseModelName, ...PoseModelName[]], {
        message: `Choose a model: ${POSE_MODELS.join(', ')}`,
      })
      .optional(),
    /** Read every frame again (after a new pick, say); otherwise only frames not stored yet. */
    fromStart: z.boolean().optional(),
    /**
     * The coach's browser is analysing this clip from the uploaded file: the server waits while it
     * posts frames and reads only what the browser leaves (allowed while the clip is still prepared).
     */
    holdForBrowser: z.boolean().optional(),
    /** Read each frame with its mirror image too (slower; docs/accuracy.md). */
    careful: z.boolean({ message: 'careful is true or false' }).optional(),
  })
  .strict();
export type ServerAnalysisRequest = z.infer<typeof serverAnalysisRequestSchema>;
