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
import type { ClipDto } from '@shared/schemas/clip.schema';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { clampFrame, frameFromMediaTime, seekTimeForFrame } from '../../lib/frame-time';
import { StageClock, useClock, type ClockState } from '../../lib/stage-clock';
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
} from '../../lib/stage-transform';

export const PLAYBACK_RATES = [0.25, 0.5, 1] as const;
const DEFAULT_FPS = 30;

/**
 * The video of one stage: playback commands, the frame box with zoom and pan, and the clock. The value
 * changes when the box is resized or zoomed, never while the video plays (the frame is in the clock).
 */
export interface StageState {
  clip: ClipDto;
  fps: number;
  frameCount: number;
  /** The signed-in role may change the clip's analysis (snow line, corrections, runs, model choice). */
  canEdit: boolean;
  /** Frame, time, play state, readiness and rate of the video; read it with useStageClock. */
  clock: StageClock;
  videoRef: RefObject<HTMLVideoElement | null>;
  /** Callback ref for the visible <video>; also fills videoRef. */
  setVideoElement(el: HTMLVideoElement | null): void;
  /** Callback ref for the stage box (the element the video is fitted in). */
  setStageElement(el: HTMLElement | null): void;
  /** Where the drawing layer mounts: an element over the video, same box as the overlay canvas. */
  stageOverlaySlot: HTMLElement | null;
  setStageOverlaySlot(el: HTMLElement | null): void;
  /** Stage box in CSS pixels and the video's own size in pixels. */
  stageSize: Size;
  videoSize: Size;
  /** Zoom and pan of the frame in the stage. */
  viewTransform: ViewTransform;
  zoomAt(nextZoom: number, anchor?: Point): void;
  panBy(dx: number, dy: number): void;
  resetZoom(): void;
  /** Maps video pixel coordinates to CSS pixels of the stage element (zoom and pan included), and back. */
  videoToStage(p: [number, number]): [number, number];
  stageToVideo(p: [number, number]): [number, number];
  play(): void;
  pause(): void;
  togglePlay(): void;
  /** Pauses, seeks exactly; the clock's frame follows when the frame is shown. */
  seekToFrame(frameIndex: number): void;
  seekToTimeMs(ms: number): void;
  /** Steps from the frame on screen (or the one being sought) by `delta` frames. */
  stepFrames(delta: number): void;
  setPlaybackRate(rate: number): void;
  /**
   * The media URL the visible player uses. It stays put when the clip is refetched (each fetch signs a
   * fresh URL, and swapping it would reload the video); it changes only through renewMedia.
   */
  mediaSrc: string;
  /** Fetches a fresh signed URL after a media error (an expired link) and switches the player to it. */
  renewMedia(): Promise<string | null>;
}

const StageContext = createContext<StageState | null>(null);

export function useStage(): StageState {
  const state = useContext(StageContext);
  if (!state) throw new Error('useStage must be used inside a clip stage (<ClipStageProvider>)');
  return state;
}

/** A slice of the stage's clock; the caller re-renders only when the slice changes. */
export function useStageClock<T>(select: (state: ClockState) => T): T {
  return useClock(useStage().clock, select);
}

/** The frame on screen; re-renders on every frame, so only for what shows the frame. */
export function useStageFrame(): number {
  return useStageClock((s) => s.frame);
}

function sizeOf(el: HTMLElement): Size {
  const rect = el.getBoundingClientRect();
  return { width: rect.width, height: rect.height };
}

interface StageProviderProps {
  clip: ClipDto;
  canEdit: boolean;
  /** Fetches a fresh signed media URL (the old one may expire while the page is open). */
  renewMedia: () => Promise<string | null>;
  /** A clock the page owns (to read or drive this stage from outside); by default the stage's own. */
  clock?: StageClock;
  children: ReactNode;
}

export function StageProvider({
  clip,
  canEdit,
  renewMedia: fetchMediaUrl,
  clock: externalClock,
  children,
}: StageProviderProps) {
  const toast = useToast();
  const [ownClock] = useState(() => new StageClock());
  const clock = externalClock ?? ownClock;

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
  const [videoSize, setVideoSize] = useState<Size>({ width: clip.width ?? 0, height: clip.height ?? 0 });
  const [viewTransform, setViewTransform] = useState<ViewTransform>(IDENTITY_VIEW);

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
      clock.set({ frame, timeMs: mediaTimeS * 1000 });
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
    const onReady = () => clock.set({ mediaReady: videoEl.readyState >= 2 });
    const onPlay = () => clock.set({ playing: true });
    const onPause = () => clock.set({ playing: false });
    const onRate = () => clock.set({ playbackRate: videoEl.playbackRate });
    onMetadata();
    onReady();
    clock.set({ playing: !videoEl.paused });
    const events: [string, () => void][] = [
      ['loadeddata', onReady],
      ['canplay', onReady],
      ['emptied', onReady],
      ['loadedmetadata', onMetadata],
      ['resize', onMetadata],
      ['seeked', onClock],
      ['timeupdate', onClock],
      ['play', onPlay],
      ['pause', onPause],
      ['ended', onPause],
      ['ratechange', onRate],
    ];
    for (const [name, fn] of events) videoEl.addEventListener(name, fn);
    return () => {
      cancelled = true;
      if (handle !== null) videoEl.cancelVideoFrameCallback(handle);
      for (const [name, fn] of events) videoEl.removeEventListener(name, fn);
    };
  }, [videoEl, fps, frameCount, clock]);

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
    (delta: number) => seekToFrame((targetFrame.current ?? clock.get().frame) + delta),
    [clock, seekToFrame],
  );

  const play = useCallback(() => {
    const video = videoRef.current;
    if (!video) return;
    targetFrame.current = null;
    if (video.ended || clock.get().frame >= frameCount - 1) video.currentTime = 0;
    video.play().catch((error: unknown) => {
      // A pause() during the start rejects play(); that is the coach's choice, not a failure.
      if (error instanceof DOMException && error.name === 'AbortError') return;
      toast.error(`The clip could not play: ${errorMessage(error)}`);
    });
  }, [clock, frameCount, toast]);

  const pause = useCallback(() => videoRef.current?.pause(), []);

  const togglePlay = useCallback(() => {
    if (videoRef.current?.paused ?? true) play();
    else pause();
  }, [pause, play]);

  const setPlaybackRate = useCallback(
    (rate: number) => {
      if (videoRef.current) videoRef.current.playbackRate = rate;
      clock.set({ playbackRate: rate });
    },
    [clock],
  );

  useEffect(
    () => clock.attach({ play, pause, seekToFrame, stepFrames, setPlaybackRate }),
    [clock, play, pause, seekToFrame, stepFrames, setPlaybackRate],
  );

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

  const value = useMemo<StageState>(
    () => ({
      clip,
      fps,
      frameCount,
      canEdit,
      clock,
      videoRef,
      setVideoElement,
      setStageElement: setStageEl,
      stageOverlaySlot,
      setStageOverlaySlot,
      stageSize,
      videoSize,
      viewTransform,
      zoomAt,
      panBy,
      resetZoom,
      videoToStage,
      stageToVideo,
      play,
      pause,
      togglePlay,
      seekToFrame,
      seekToTimeMs,
      stepFrames,
      setPlaybackRate,
      mediaSrc,
      renewMedia,
    }),
    [
      clip,
      fps,
      frameCount,
      canEdit,
      clock,
      setVideoElement,
      stageOverlaySlot,
      stageSize,
      videoSize,
      viewTransform,
      zoomAt,
      panBy,
      resetZoom,
      videoToStage,
      stageToVideo,
      play,
      pause,
      togglePlay,
      seekToFrame,
      seekToTimeMs,
      stepFrames,
      setPlaybackRate,
      mediaSrc,
      renewMedia,
    ],
  );

  return <StageContext.Provider value={value}>{children}</StageContext.Provider>;
}
