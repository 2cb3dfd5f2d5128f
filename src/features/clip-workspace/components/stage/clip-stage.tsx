import { useCallback, type ReactNode } from 'react';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { Notice } from '@/components/ui/notice';
import { QueryError } from '@/components/ui/query-error';
import { Spinner } from '@/components/ui/spinner';
import { useWorkspaceClip } from '../../api/get-workspace-clip';
import { useFramePose } from '../../hooks/use-frame-pose';
import type { StageClock } from '../../lib/stage-clock';
import { DrawingLayer } from '../notes/drawing-layer';
import { PoseOverlay } from '../overlays/pose-overlay';
import { AnalysisProvider } from './analysis-context';
import { AnnotationsProvider, type OverlayToggles } from './annotations-context';
import { StageProvider } from './stage-context';
import { VideoStage } from './video-stage';

export interface ClipStageProviderProps {
  clip: ClipDto;
  /** Fetches a fresh signed media URL (the old one may expire while the page is open). */
  renewMedia: () => Promise<string | null>;
  /** No snow-line edits, corrections, model saves or drawing: what athletes, guardians and analysts get. */
  readOnly: boolean;
  /** A clock the page owns, to read or drive this stage from outside (two stages in step). */
  clock?: StageClock;
  /** Overlays shown at first. */
  overlays?: OverlayToggles;
  children: ReactNode;
}

/**
 * The state of one clip stage, split by concern: the video and its clock (stage), the model, bands and
 * pose of the frame on screen (analysis), the snow line, overlays and drawing mode (annotations).
 * Everything inside reads only the context it needs; a page may hold several.
 */
export function ClipStageProvider({
  clip,
  renewMedia,
  readOnly,
  clock,
  overlays,
  children,
}: ClipStageProviderProps) {
  return (
    <StageProvider clip={clip} canEdit={!readOnly} renewMedia={renewMedia} clock={clock}>
      <AnnotationsProvider initialOverlays={overlays}>
        <AnalysisProvider>{children}</AnalysisProvider>
      </AnnotationsProvider>
    </StageProvider>
  );
}

/** Keeps the pose of the frame on screen current; a leaf, so only it re-renders as frames pass. */
function FramePoseTracker() {
  useFramePose();
  return null;
}

/** The picture of a stage inside a ClipStageProvider: video, overlays, drawings and zoom. */
export function StageView() {
  return (
    <>
      <VideoStage overlay={<PoseOverlay />} />
      {/* Portals itself into the stage's overlay slot. */}
      <DrawingLayer />
      <FramePoseTracker />
    </>
  );
}

interface ClipStageProps {
  clipId: string;
  readOnly: boolean;
  overlays?: OverlayToggles;
  clock?: StageClock;
  /** Controls and panels of this stage (a transport bar, readouts); they read the stage's contexts. */
  children?: ReactNode;
}

/**
 * One clip on a stage, loaded by id, with its own playback, zoom, overlays and pose: place it more than
 * once on a page and each plays, steps and zooms on its own (or in step, through clocks the page owns).
 */
export function ClipStage({ clipId, readOnly, overlays, clock, children }: ClipStageProps) {
  const query = useWorkspaceClip(clipId);
  const { refetch } = query;
  const renewMedia = useCallback(async () => (await refetch()).data?.clip.mediaUrl ?? null, [refetch]);

  if (query.isPending) {
    return (
      <div className="flex aspect-video items-center justify-center rounded-lg bg-glacier-950/5">
        <Spinner label="Loading the clip" />
      </div>
    );
  }
  if (query.isError) return <QueryError error={query.error} what="this clip" retry={() => void refetch()} />;
  const clip = query.data.clip;
  if (clip.status !== 'ready') {
    return (
      <Notice tone={clip.status === 'failed' ? 'error' : 'info'} title={clip.originalName}>
        {clip.status === 'failed'
          ? (clip.failureReason ?? 'The server could not read the video.')
          : 'The server is still making a playable copy of this clip; it opens here when it is done.'}
      </Notice>
    );
  }
  return (
    <ClipStageProvider
      key={clip.id}
      clip={clip}
      renewMedia={renewMedia}
      readOnly={readOnly}
      clock={clock}
      overlays={overlays}
    >
      <StageView />
      {children}
    </ClipStageProvider>
  );
}
