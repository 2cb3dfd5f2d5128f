import { frameFromMediaTime, seekTimeForFrame } from '../../lib/frame-time';

/** How long to wait for a presented frame after 'seeked' before grabbing what the element holds. */
const FRAME_CALLBACK_TIMEOUT_MS = 500;
const LOAD_TIMEOUT_MS = 20_000;

function abortError(): DOMException {
  return new DOMException('Analysis cancelled', 'AbortError');
}

/**
 * Frames of a clip, asked for by index in rising order (a jump back starts over): decoded in order
 * with WebCodecs, or grabbed by seeking a hidden video where WebCodecs cannot read the file.
 */
export interface FrameSource {
  readonly kind: 'webcodecs' | 'seek';
  /** Frames whose presented time pointed at a different frame than asked for (seeking only). */
  mismatches: number;
  open(signal: AbortSignal): Promise<void>;
  grab(frameIndex: number, signal: AbortSignal): Promise<ImageBitmap>;
  close(): void;
}

/** This browser cannot decode the clip's video at all (its codec or container is not supported here). */
export class VideoUndecodableError extends Error {
  override name = 'VideoUndecodableError';
}

function once(
  target: HTMLVideoElement,
  event: string,
  signal: AbortSignal,
  timeoutMs: number,
): Promise<void> {
  return new Promise((resolve, reject) => {
    const done = (fn: () => void) => {
      clearTimeout(timer);
      target.removeEventListener(event, onEvent);
      target.removeEventListener('error', onError);
      signal.removeEventListener('abort', onAbort);
      fn();
    };
    const onEvent = () => done(resolve);
    const onError = () =>
      done(() => {
        const code = target.error?.code;
        const text = target.error?.message || 'the video could not be decoded for analysis';
        // Not a passing hiccup: the browser has no decoder for this file.
        reject(
          code === MediaError.MEDIA_ERR_SRC_NOT_SUPPORTED || code === MediaError.MEDIA_ERR_DECODE
            ? new VideoUndecodableError(text)
            : new Error(text),
        );
      });
    const onAbort = () => done(() => reject(abortError()));
    const timer = setTimeout(
      () => done(() => reject(new Error(`the video did not answer within ${timeoutMs / 1000} s (${event})`))),
      timeoutMs,
    );
    target.addEventListener(event, onEvent);
    target.addEventListener('error', onError);
    signal.addEventListener('abort', onAbort);
  });
}

/**
 * Decodes frames of a clip for analysis through a second, hidden <video> with the same source, so
 * the visible player is never disturbed. Each grab seeks to the middle of the frame's presentation
 * span, waits for 'seeked' and for the frame to be presented, and copies it into an ImageBitmap.
 */
export class FrameGrabber implements FrameSource {
  readonly kind = 'seek' as const;
  private video: HTMLVideoElement | null = null;
  /** Frames whose presented media time pointed at a different frame than asked for. */
  mismatches = 0;

  constructor(
    private readonly src: string,
    private readonly fps: number,
  ) {}

  async open(signal: AbortSignal): Promise<void> {
    const video = document.createElement('video');
    video.muted = true;
    video.playsInline = true;
    video.preload = 'auto';
    video.setAttribute('aria-hidden', 'true');
    // In the document but out of sight: some browsers present no frames for detached or display:none videos.
    Object.assign(video.style, {
      position: 'fixed',
      left: '0',
      top: '0',
      width: '2px',
      height: '2px',
      opacity: '0',
      pointerEvents: 'none',
    });
    document.body.appendChild(video);
    this.video = video;
    const loaded = once(video, 'loadeddata', signal, LOAD_TIMEOUT_MS);
    video.src = this.src;
    video.load();
    await loaded;
  }

  get size(): { width: number; height: number } {
    return { width: this.video?.videoWidth ?? 0, height: this.video?.videoHeight ?? 0 };
  }

  async grab(frameIndex: number, signal: AbortSignal): Promise<ImageBitmap> {
    const video = this.video;
    if (!video) throw new Error('the frame grabber is not open');
    if (signal.aborted) throw abortError();
    const target = seekTimeForFrame(frameIndex, this.fps);
    // Ask for the presented frame before seeking, so its callback cannot be missed.
    const presented = this.nextPresentedFrame(video);
    try {
      const seeked = once(video, 'seeked', signal, LOAD_TIMEOUT_MS);
      video.currentTime = target;
      await seeked;
      const mediaTime = await Promise.race([
        presented.mediaTime,
        new Promise<null>((resolve) => setTimeout(() => resolve(null), FRAME_CALLBACK_TIMEOUT_MS)),
      ]);
      if (mediaTime !== null && frameFromMediaTime(mediaTime, this.fps) !== frameIndex) this.mismatches += 1;
    } finally {
      presented.cancel();
    }
    return createImageBitmap(video);
  }

  /** Media time of the next presented frame; null without frame callbacks (the 'seeked' frame is used). */
  private nextPresentedFrame(video: HTMLVideoElement): { mediaTime: Promise<number | null>; cancel(): void } {
    if (typeof video.requestVideoFrameCallback !== 'function') {
      return { mediaTime: Promise.resolve(null), cancel: () => undefined };
    }
    let handle = 0;
    let settled = false;
    const mediaTime = new Promise<number | null>((resolve) => {
      handle = video.requestVideoFrameCallback((_now, meta) => {
        settled = true;
        resolve(meta.mediaTime);
      });
    });
    return {
      mediaTime,
      cancel: () => {
        if (!settled) video.cancelVideoFrameCallback(handle);
      },
    };
  }

  close(): void {
    if (!this.video) return;
    this.video.removeAttribute('src');
    this.video.load();
    this.video.remove();
    this.video = null;
  }
}
