import {
  createContext,
  useCallback,
  useContext,
  useEffect,
  useMemo,
  useRef,
  useState,
  type ReactNode,
  type RefObject,
} from 'react';
import type { Keypoint, KeypointName, PoseModelName, ReferenceLine, View } from '@shared/keypoints';
import { computeFrameMetrics, type MetricKey } from '@shared/metrics';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { clipExtras } from '../api/clip-contract';
import { useToleranceBands, type ToleranceBandDto } from '../api/get-tolerance-bands';
import { useUpdateClip } from '../api/update-clip';
import { clampFrame, frameFromMediaTime, seekTimeForFrame } from '../lib/frame-time';
import { drawOverlays } from './overlays/draw-overlays';
import {
  clampView,
  fitContain,
  IDENTITY_VIEW,
  stageToVideoPoint,
  videoToStagePoint,
  zoomAround,
  type Point,
  type Size,
  type ViewTransform,
} from '../lib/stage-transform';

export type { ToleranceBandDto };

/** Where the keypoints of the frame on screen came from. */
export type PoseOrigin = 'live' | 'stored' | 'corrected';

/** Keypoints of one frame before metrics: what detection, the stored analysis or a correction gives. */
export interface FrameKeypoints {
  frameIndex: number;
  timeMs: number;
  model: PoseModelName;
  keypoints: Keypoint[];
  /** Video pixels of the frame the keypoints were found in. */
  width: number;
  height: number;
  origin: PoseOrigin;
  /** Points the coach moved by hand; drawn differently from detected points. */
  correctedPoints: readonly KeypointName[];
}

/**
 * The pose of the frame on screen with its metrics, recomputed in the browser from the keypoints with
 * the clip's view and the current snow line, so a moved point or a new snow line shows at once.
 */
export interface PoseFrameResult extends FrameKeypoints {
  metrics: Record<MetricKey, number | null>;
  reasons: Partial<Record<MetricKey, string>>;
  /** Lowest score among the points each metric used. */
  confidence: Partial<Record<MetricKey, number>>;
}

/** Overlays a coach can switch on and off. */
export type OverlayKey = 'skeleton' | 'angleArcs' | 'tiltGauge' | 'widthBars';
export type OverlayToggles = Record<OverlayKey, boolean>;
const ALL_OVERLAYS: OverlayToggles = { skeleton: true, angleArcs: true, tiltGauge: true, widthBars: true };

export type PoseStatus =
  | { state: 'idle' }
  | { state: 'detecting'; frameIndex: number }
  | { state: 'error'; frameIndex: number; message: string };

export interface WorkspaceState {
  clip: ClipDto;
  fps: number;
  frameCount: number;
  videoRef: RefObject<HTMLVideoElement | null>;
  /** The frame actually displayed (from requestVideoFrameCallback). */
  currentFrame: number;
  currentTimeMs: number;
  playing: boolean;
  /** The visible video has a decoded frame to show (readyState >= HAVE_CURRENT_DATA). */
  mediaReady: boolean;
  /** Pauses, seeks exactly, updates currentFrame when the frame is shown. */
  seekToFrame(frameIndex: number): void;
  seekToTimeMs(ms: number): void;
  model: PoseModelName;
  setModel(m: PoseModelName): void;
  view: View;
  referenceLine: ReferenceLine | null;
  /** Persists via PATCH /api/clips/:id. */
  setReferenceLine(line: ReferenceLine | null): void;
  /** A line being dragged: metrics follow it at once, nothing is saved. Null ends the preview. */
  previewReferenceLine(line: ReferenceLine | null): void;
  /** The line the numbers on screen use: the preview while dragging, else the frame's own, else the clip's. */
  effectiveReferenceLine: ReferenceLine | null;
  /** Lines set on single frames; each replaces the clip's line for its own frame. */
  frameReferenceLines: ReadonlyMap<number, ReferenceLine>;
  /** Sets (or, with null, removes) one frame's own snow line; persists via PATCH frameReferenceLines. */
  setFrameReferenceLine(frameIndex: number, line: ReferenceLine | null): void;
  bands: ToleranceBandDto[];
  /** Live result for currentFrame (or the stored/corrected one). */
  currentPose: PoseFrameResult | null;
  /** Maps video pixel coordinates to CSS pixels of the stage element (zoom and pan included), and back. */
  videoToStage(p: [number, number]): [number, number];
  stageToVideo(p: [number, number]): [number, number];
  /** Where the drawing layer mounts: an element over the video, same box as the overlay canvas. */
  stageOverlaySlot: HTMLElement | null;
  /** Draw-on-frame mode: while active, the pose overlay ignores pointer input. */
  drawingActive: boolean;
  setDrawingActive(v: boolean): void;

  // Fields beyond the shared interface, used by the player, stage and readouts.
  /** The signed-in role may change the clip's analysis (snow line, corrections, runs, model choice). */
  canEdit: boolean;
  /** Callback ref for the visible <video>; also fills videoRef. */
  setVideoElement(el: HTMLVideoElement | null): void;
  /** Callback ref for the stage box (the element the video is fitted in). */
  setStageElement(el: HTMLElement | null): void;
  setStageOverlaySlot(el: HTMLElement | null): void;
  /** Stage box in CSS pixels and the video's own size in pixels. */
  stageSize: Size;
  videoSize: Size;
  /** Zoom and pan of the frame in the stage. */
  viewTransform: ViewTransform;
  zoomAt(nextZoom: number, anchor?: Point): void;
  panBy(dx: number, dy: number): void;
  resetZoom(): void;
  play(): void;
  pause(): void;
  togglePlay(): void;
  /** Steps from the frame on screen (or the one being sought) by `delta` frames. */
  stepFrames(delta: number): void;
  playbackRate: number;
  setPlaybackRate(rate: number): void;
  /** The keypoints behind currentPose; set by detection, the stored analysis and corrections. */
  frameKeypoints: FrameKeypoints | null;
  setFrameKeypoints(next: FrameKeypoints | null): void;
  poseStatus: PoseStatus;
  setPoseStatus(status: PoseStatus): void;
  /** Corrections made on this page, by correctionKey(model, frame); they win over detection and storage. */
  corrections: ReadonlyMap<string, FrameKeypoints>;
  /** Shows corrected keypoints at once and remembers them for the frame (saving is the caller's). */
  applyCorrection(next: FrameKeypoints): void;
  overlays: OverlayToggles;
  setOverlay(key: OverlayKey, on: boolean): void;
  /** While on, the snow line's two handles can be dragged on the stage. */
  snowLineEditing: boolean;
  setSnowLineEditing(on: boolean): void;
  /** What a dragged snow line is saved for: the whole clip, or only the frame on screen. */
  snowLineScope: 'clip' | 'frame';
  setSnowLineScope(scope: 'clip' | 'frame'): void;
  /**
   * Draws the overlays of the frame on screen (as toggled) onto any 2D canvas, e.g. a full-size still:
   * `map` takes video pixels to that canvas, `scale` multiplies line widths and text.
   */
  drawOverlaysOn(
    ctx: CanvasRenderingContext2D,
    map: (p: [number, number]) => [number, number],
    scale?: number,
  ): void;
  /**
   * The media URL the visible player uses. It stays put when the clip is refetched (each fetch signs a
   * fresh URL, and swapping it would reload the video); it changes only through renewMedia.
   */
  mediaSrc: string;
  /** Fetches a fresh signed URL after a media error (an expired link) and switches the player to it. */
  renewMedia(): Promise<string | null>;
}

const WorkspaceContext = createContext<WorkspaceState | null>(null);

export function useWorkspace(): WorkspaceState {
  const state = useContext(WorkspaceContext);
  if (!state) throw new Error('useWorkspace must be used inside <WorkspaceProvider>');
  return state;
}

export const correctionKey = (model: PoseModelName, frameIndex: number) => `${model}:${frameIndex}`;

export const PLAYBACK_RATES = [0.25, 0.5, 1] as const;
const DEFAULT_FPS = 30;

function sizeOf(el: HTMLElement): Size {
  const rect = el.getBoundingClientRect();
  return { width: rect.width, height: rect.height };
}

interface WorkspaceProviderProps {
  clip: ClipDto;
  /** Fetches a fresh signed media URL (the old one may expire while the page is open). */
  renewMedia: () => Promise<string | null>;
  /** Coaches and the head coach; others get the same views without the editing tools. */
  canEdit: boolean;
  children: ReactNode;
}

export function WorkspaceProvider({
  clip,
  renewMedia: fetchMediaUrl,
  canEdit,
  children,
}: WorkspaceProviderProps) {
  const extras = clipExtras(clip);
  const toast = useToast();
  const updateClip = useUpdateClip(clip.id);

  const fps = clip.fps && clip.fps > 0 ? clip.fps : DEFAULT_FPS;
  const frameCount =
    clip.frameCount && clip.frameCount > 0
      ? clip.frameCount
      : Math.max(1, Math.round(((clip.durationMs ?? 0) / 1000) * fps));

  const [mediaSrc, setMediaSrc] = useState(clip.mediaUrl);
  const renewMedia = useCallback(async () => {
    const url = await fetchMediaUrl();
    if (url) setMediaSrc(url);
    return url;
  }, [fetchMediaUrl]);
  const videoRef = useRef<HTMLVideoElement | null>(null);
  const [videoEl, setVideoEl] = useState<HTMLVideoElement | null>(null);
  const [stageEl, setStageEl] = useState<HTMLElement | null>(null);
  const [stageOverlaySlot, setStageOverlaySlot] = useState<HTMLElement | null>(null);
  const [stageSize, setStageSize] = useState<Size>({ width: 0, height: 0 });
  const [videoSize, setVideoSize] = useState<Size>({
    width: clip.width ?? 0,
    height: clip.height ?? 0,
  });
  const [viewTransform, setViewTransform] = useState<ViewTransform>(IDENTITY_VIEW);
  const [currentFrame, setCurrentFrame] = useState(0);
  const [currentTimeMs, setCurrentTimeMs] = useState(0);
  const [playing, setPlaying] = useState(false);
  const [mediaReady, setMediaReady] = useState(false);
  const [playbackRate, setRate] = useState(1);
  const [model, setModelState] = useState<PoseModelName>(extras.defaultModel ?? 'lightning');
  const [referenceLine, setReferenceLineState] = useState<ReferenceLine | null>(extras.referenceLine ?? null);
  const [frameReferenceLines, setFrameLines] = useState<ReadonlyMap<number, ReferenceLine>>(
    () => new Map((clip.frameReferenceLines ?? []).map((f) => [f.frameIndex, f.referenceLine])),
  );
  const [linePreview, previewReferenceLine] = useState<ReferenceLine | null>(null);
  const [drawingActive, setDrawingActive] = useState(false);
  const [frameKeypoints, setFrameKeypoints] = useState<FrameKeypoints | null>(null);
  const [poseStatus, setPoseStatus] = useState<PoseStatus>({ state: 'idle' });
  const [overlays, setOverlays] = useState<OverlayToggles>(ALL_OVERLAYS);
  const [corrections, setCorrections] = useState<ReadonlyMap<string, FrameKeypoints>>(new Map());
  const applyCorrection = useCallback((next: FrameKeypoints) => {
    setCorrections((all) => new Map(all).set(correctionKey(next.model, next.frameIndex), next));
    setFrameKeypoints(next);
  }, []);
  const [snowLineEditing, setSnowLineEditing] = useState(false);
  const [snowLineScope, setSnowLineScope] = useState<'clip' | 'frame'>('clip');
  const setOverlay = useCallback(
    (key: OverlayKey, on: boolean) => setOverlays((all) => ({ ...all, [key]: on })),
    [],
  );

  // The frame last asked for; steps count from it so quick presses are not lost while a seek runs.
  const targetFrame = useRef<number | null>(null);

  const setVideoElement = useCallback((el: HTMLVideoElement | null) => {
    videoRef.current = el;
    setVideoEl(el);
  }, []);

  useEffect(() => {
    if (!stageEl) return;
    setStageSize(sizeOf(stageEl));
    const observer = new ResizeObserver(() => setStageSize(sizeOf(stageEl)));
    observer.observe(stageEl);
    return () => observer.disconnect();
  }, [stageEl]);

  // Zoom and pan limits depend on the stage size; keep them valid when the window changes.
  useEffect(() => {
    setViewTransform((view) => clampView(view, stageSize));
  }, [stageSize]);

  useEffect(() => {
    if (!videoEl) return;
    let cancelled = false;
    let handle: number | null = null;

    const report = (mediaTimeS: number) => {
      const frame = clampFrame(frameFromMediaTime(mediaTimeS, fps), frameCount);
      setCurrentFrame(frame);
      setCurrentTimeMs(mediaTimeS * 1000);
      if (targetFrame.current === frame) targetFrame.current = null;
    };
    const hasFrameCallback = typeof videoEl.requestVideoFrameCallback === 'function';
    const onFrame: VideoFrameRequestCallback = (_now, meta) => {
      if (cancelled) return;
      report(meta.mediaTime);
      handle = videoEl.requestVideoFrameCallback(onFrame);
    };
    if (hasFrameCallback) handle = videoEl.requestVideoFrameCallback(onFrame);

    const onMetadata = () => {
      if (videoEl.videoWidth > 0) setVideoSize({ width: videoEl.videoWidth, height: videoEl.videoHeight });
    };
    // Without frame callbacks the element's clock is the best available stand-in.
    const onClock = () => {
      if (!hasFrameCallback) report(videoEl.currentTime);
    };
    const onReady = () => setMediaReady(videoEl.readyState >= 2);
    const onPlay = () => setPlaying(true);
    const onPause = () => setPlaying(false);
    const onRate = () => setRate(videoEl.playbackRate);
    onMetadata();
    onReady();
    setPlaying(!videoEl.paused);
    videoEl.addEventListener('loadeddata', onReady);
    videoEl.addEventListener('canplay', onReady);
    videoEl.addEventListener('emptied', onReady);
    videoEl.addEventListener('loadedmetadata', onMetadata);
    videoEl.addEventListener('resize', onMetadata);
    videoEl.addEventListener('seeked', onClock);
    videoEl.addEventListener('timeupdate', onClock);
    videoEl.addEventListener('play', onPlay);
    videoEl.addEventListener('pause', onPause);
    videoEl.addEventListener('ended', onPause);
    videoEl.addEventListener('ratechange', onRate);
    return () => {
      cancelled = true;
      if (handle !== null) videoEl.cancelVideoFrameCallback(handle);
      videoEl.removeEventListener('loadeddata', onReady);
      videoEl.removeEventListener('canplay', onReady);
      videoEl.removeEventListener('emptied', onReady);
      videoEl.removeEventListener('loadedmetadata', onMetadata);
      videoEl.removeEventListener('resize', onMetadata);
      videoEl.removeEventListener('seeked', onClock);
      videoEl.removeEventListener('timeupdate', onClock);
      videoEl.removeEventListener('play', onPlay);
      videoEl.removeEventListener('pause', onPause);
      videoEl.removeEventListener('ended', onPause);
      videoEl.removeEventListener('ratechange', onRate);
    };
  }, [videoEl, fps, frameCount]);

  const seekToFrame = useCallback(
    (frameIndex: number) => {
      const video = videoRef.current;
      if (!video) return;
      const frame = clampFrame(frameIndex, frameCount);
      video.pause();
      targetFrame.current = frame;
      video.currentTime = seekTimeForFrame(frame, fps);
    },
    [fps, frameCount],
  );

  const seekToTimeMs = useCallback(
    (ms: number) => seekToFrame(frameFromMediaTime(ms / 1000, fps)),
    [fps, seekToFrame],
  );

  const stepFrames = useCallback(
    (delta: number) => seekToFrame((targetFrame.current ?? currentFrame) + delta),
    [currentFrame, seekToFrame],
  );

  const play = useCallback(() => {
    const video = videoRef.current;
    if (!video) return;
    targetFrame.current = null;
    if (video.ended || currentFrame >= frameCount - 1) video.currentTime = 0;
    video.play().catch((error: unknown) => {
      // A pause() during the start rejects play(); that is the coach's choice, not a failure.
      if (error instanceof DOMException && error.name === 'AbortError') return;
      toast.error(`The clip could not play: ${errorMessage(error)}`);
    });
  }, [currentFrame, frameCount, toast]);

  const pause = useCallback(() => videoRef.current?.pause(), []);

  const togglePlay = useCallback(() => {
    if (videoRef.current?.paused ?? true) play();
    else pause();
  }, [pause, play]);

  const setPlaybackRate = useCallback((rate: number) => {
    if (videoRef.current) videoRef.current.playbackRate = rate;
    setRate(rate);
  }, []);

  const fit = useMemo(() => fitContain(stageSize, videoSize), [stageSize, videoSize]);
  const videoToStage = useCallback(
    (p: [number, number]) => videoToStagePoint(p, fit, viewTransform),
    [fit, viewTransform],
  );
  const stageToVideo = useCallback(
    (p: [number, number]) => stageToVideoPoint(p, fit, viewTransform),
    [fit, viewTransform],
  );

  const zoomAt = useCallback(
    (nextZoom: number, anchor?: Point) => {
      const at: Point = anchor ?? [stageSize.width / 2, stageSize.height / 2];
      setViewTransform((view) => zoomAround(view, nextZoom, at, stageSize));
    },
    [stageSize],
  );
  const panBy = useCallback(
    (dx: number, dy: number) =>
      setViewTransform((view) =>
        clampView({ ...view, panX: view.panX + dx, panY: view.panY + dy }, stageSize),
      ),
    [stageSize],
  );
  const resetZoom = useCallback(() => setViewTransform(IDENTITY_VIEW), []);

  const { mutate: patchClip } = updateClip;
  const setModel = useCallback(
    (next: PoseModelName) => {
      setModelState(next);
      // A viewer may look through another model on this page; only an editor's choice is stored.
      if (!canEdit) return;
      patchClip(
        { defaultModel: next },
        { onError: (error) => toast.error(`The model choice was not saved: ${errorMessage(error)}`) },
      );
    },
    [canEdit, patchClip, toast],
  );

  const setReferenceLine = useCallback(
    (line: ReferenceLine | null) => {
      setReferenceLineState(line);
      patchClip(
        { referenceLine: line },
        {
          // The line stays on screen so the coach's work is not lost; the message says it is not stored.
          onError: (error) =>
            toast.error(
              `The snow line was not saved: ${errorMessage(error)}. It is used on this page only; move a handle to try again.`,
            ),
        },
      );
    },
    [patchClip, toast],
  );

  const setFrameReferenceLine = useCallback(
    (frameIndex: number, line: ReferenceLine | null) => {
      setFrameLines((all) => {
        const next = new Map(all);
        if (line) next.set(frameIndex, line);
        else next.delete(frameIndex);
        return next;
      });
      patchClip(
        { frameReferenceLines: [{ frameIndex, referenceLine: line }] },
        {
          onError: (error) =>
            toast.error(
              `The snow line of frame ${frameIndex} was not saved: ${errorMessage(error)}. It is used on this page only; move a handle to try again.`,
            ),
        },
      );
    },
    [patchClip, toast],
  );
  const effectiveReferenceLine = linePreview ?? frameReferenceLines.get(currentFrame) ?? referenceLine;

  const bandsQuery = useToleranceBands(extras.ageGroup?.id ?? null);
  const bands = useMemo(() => bandsQuery.data?.bands ?? [], [bandsQuery.data]);

  const currentPose = useMemo<PoseFrameResult | null>(() => {
    if (!frameKeypoints || frameKeypoints.frameIndex !== currentFrame) return null;
    const computed = computeFrameMetrics({
      keypoints: frameKeypoints.keypoints,
      view: clip.view,
      referenceLine: effectiveReferenceLine,
      width: frameKeypoints.width,
      height: frameKeypoints.height,
    });
    return {
      ...frameKeypoints,
      metrics: computed.metrics,
      reasons: computed.reasons,
      confidence: computed.confidence,
    };
  }, [frameKeypoints, currentFrame, clip.view, effectiveReferenceLine]);

  const drawOverlaysOn = useCallback(
    (ctx: CanvasRenderingContext2D, map: (p: [number, number]) => [number, number], scale = 1) =>
      drawOverlays(
        ctx,
        {
          pose: currentPose,
          view: clip.view,
          referenceLine: effectiveReferenceLine,
          toggles: overlays,
          bands,
          videoSize,
          snowLineHandles: false,
        },
        { map, scale },
      ),
    [currentPose, clip.view, effectiveReferenceLine, overlays, bands, videoSize],
  );

  const value: WorkspaceState = {
    canEdit,
    clip,
    fps,
    frameCount,
    videoRef,
    currentFrame,
    currentTimeMs,
    playing,
    mediaReady,
    seekToFrame,
    seekToTimeMs,
    model,
    setModel,
    view: clip.view,
    referenceLine,
    setReferenceLine,
    previewReferenceLine,
    effectiveReferenceLine,
    frameReferenceLines,
    setFrameReferenceLine,
    bands,
    currentPose,
    videoToStage,
    stageToVideo,
    stageOverlaySlot,
    drawingActive,
    setDrawingActive,
    setVideoElement,
    setStageElement: setStageEl,
    setStageOverlaySlot,
    stageSize,
    videoSize,
    viewTransform,
    zoomAt,
    panBy,
    resetZoom,
    play,
    pause,
    togglePlay,
    stepFrames,
    playbackRate,
    setPlaybackRate,
    frameKeypoints,
    setFrameKeypoints,
    poseStatus,
    setPoseStatus,
    corrections,
    applyCorrection,
    overlays,
    setOverlay,
    snowLineEditing,
    setSnowLineEditing,
    snowLineScope,
    setSnowLineScope,
    drawOverlaysOn,
    mediaSrc,
    renewMedia,
  };

  return <WorkspaceContext.Provider value={value}>{children}</WorkspaceContext.Provider>;
}
