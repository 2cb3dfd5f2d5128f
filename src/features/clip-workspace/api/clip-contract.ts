import type { PoseModelName, ReferenceLine } from '@shared/keypoints';
import type { ClipDto } from '@shared/schemas/clip.schema';

// Fields the clip API is gaining (poster, thumbnail strip, snow line, model, age group, analysis).
// Until every server returns them they are read as optional, so an older server still opens the clip.

export interface ClipThumbnails {
  url: string;
  count: number;
  tileWidth: number;
  tileHeight: number;
  columns: number;
  intervalMs: number;
}

export interface ClipAnalysisInfo {
  frameCount: number;
  model: PoseModelName;
  updatedAt: string;
}

export type WorkspaceClip = ClipDto & {
  thumbnails?: ClipThumbnails | null;
  rotation?: number;
  referenceLine?: ReferenceLine | null;
  defaultModel?: PoseModelName;
  ageGroup?: { id: string; name: string } | null;
  analysis?: ClipAnalysisInfo | null;
};

export function clipExtras(clip: ClipDto): WorkspaceClip {
  return clip as WorkspaceClip;
}
