import type { ClipDto } from '@shared/schemas/clip.schema';
import type { Athlete } from '../entities/athlete.entity';
import type { Clip } from '../entities/clip.entity';

export function toClipDto(clip: Clip, athletes: Athlete[], mediaUrl: string): ClipDto {
  return {
    id: clip.id,
    sessionId: clip.sessionId,
    athletes: athletes.map((a) => ({ id: a.id, name: `${a.firstName} ${a.lastName}` })),
    view: clip.view,
    status: clip.status,
    failureReason: clip.failureReason,
    originalName: clip.originalName,
    sizeBytes: clip.sizeBytes,
    codec: clip.codec,
    width: clip.width,
    height: clip.height,
    fps: clip.fps,
    frameCount: clip.frameCount,
    durationMs: clip.durationMs,
    createdAt: clip.createdAt.toISOString(),
    mediaUrl,
    // Poster frames arrive with the media pipeline; until then there is none.
    posterUrl: null,
  };
}
