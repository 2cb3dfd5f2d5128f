import type { PoseModelName, ReferenceLine } from '@shared/keypoints';
import type {
  ClipAnalysisDto,
  ClipDto,
  FrameReferenceLineDto,
  ServerAnalysisDto,
} from '@shared/schemas/clip.schema';
import type { Athlete } from '../entities/athlete.entity';
import type { Clip } from '../entities/clip.entity';
import type { Job } from '../entities/job.entity';
import type { AnalysisInfo } from '../repositories/frame-result.repository';

export interface ClipLinks {
  media: string;
  poster: string;
  thumbnails: string;
}

export interface ClipExtras {
  referenceLine: ReferenceLine | null;
  frameReferenceLines: FrameReferenceLineDto[];
  ageGroup: { id: string; name: string } | null;
  analyses: AnalysisInfo[];
  /** The clip's newest server-side analysis job, if any. */
  serverJob: Job | null;
}

export function toServerAnalysisDto(job: Job | null): ServerAnalysisDto | null {
  if (!job || !job.payload.model) return null;
  return {
    jobId: job.id,
    model: job.payload.model,
    status: job.status,
    done: Math.min(job.done, job.total),
    total: job.total,
    error: job.error,
    updatedAt: job.updatedAt.toISOString(),
    heldUntil: job.status === 'queued' && job.payload.notBefore ? job.payload.notBefore : null,
    careful: job.payload.careful ?? false,
  };
}

/** The default model's stored results, else the most recently written model's. */
export function pickAnalysis(defaultModel: PoseModelName, analyses: AnalysisInfo[]): ClipAnalysisDto | null {
  const chosen =
    analyses.find((a) => a.model === defaultModel) ??
    [...analyses].sort((a, b) => b.updatedAt.getTime() - a.updatedAt.getTime())[0];
  if (!chosen) return null;
  return { frameCount: chosen.frameCount, model: chosen.model, updatedAt: chosen.updatedAt.toISOString() };
}

export function toClipDto(clip: Clip, athletes: Athlete[], links: ClipLinks, extras: ClipExtras): ClipDto {
  return {
    id: clip.id,
    sessionId: clip.sessionId,
    athletes: athletes.map((a) => ({ id: a.id, name: `${a.firstName} ${a.lastName}` })),
    view: clip.view,
    facing: clip.facing,
    athletePick: clip.athletePick ?? null,
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
    mediaUrl: links.media,
    posterUrl: clip.posterKey ? links.poster : null,
    thumbnails: clip.thumbnailsKey && clip.thumbnails ? { url: links.thumbnails, ...clip.thumbnails } : null,
    rotation: clip.rotation,
    referenceLine: extras.referenceLine,
    frameReferenceLines: extras.frameReferenceLines,
    defaultModel: clip.defaultModel,
    ageGroup: extras.ageGroup,
    analysis: pickAnalysis(clip.defaultModel, extras.analyses),
    serverAnalysis: toServerAnalysisDto(extras.serverJob),
  };
}
