import type { ClipAnalysisDto, ClipDto, ThumbnailStripDto } from '@shared/schemas/clip.schema';

// The workspace's names for the clip's media and analysis fields, kept so both halves of the page
// read them one way.

export type ClipThumbnails = ThumbnailStripDto;
export type ClipAnalysisInfo = ClipAnalysisDto;
export type WorkspaceClip = ClipDto;

export function clipExtras(clip: ClipDto): WorkspaceClip {
  return clip;
}
