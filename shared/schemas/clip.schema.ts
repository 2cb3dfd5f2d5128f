import { z } from 'zod';

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
});
export type UploadClipFields = z.input<typeof uploadClipFieldsSchema>;

export const clipListQuerySchema = z.object({
  athleteId: z.string().uuid().optional(),
  sessionId: z.string().uuid().optional(),
});

export const MAX_CLIP_BYTES_DEFAULT = 2 * 1024 * 1024 * 1024;
export const ACCEPTED_CLIP_EXTENSIONS = ['.mp4', '.mov', '.m4v', '.webm', '.avi', '.mkv'] as const;

export interface ClipDto {
  id: string;
  sessionId: string;
  athletes: { id: string; name: string }[];
  view: (typeof CLIP_VIEWS)[number];
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
  posterUrl: string | null;
}

export interface ClipListResponse {
  clips: ClipDto[];
}
export interface ClipResponse {
  clip: ClipDto;
}
