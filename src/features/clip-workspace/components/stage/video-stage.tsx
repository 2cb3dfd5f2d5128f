import { useEffect, useRef, useState, type ReactNode } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { cn } from '@/lib/format';
import { cssTransform } from '../../lib/stage-transform';
import { SnowLineBanner } from './snow-line-banner';
import { ZoomControls } from './zoom-controls';
import { useAnnotations } from './annotations-context';
import { useStage } from './stage-context';

// MediaError codes (HTML standard), spelled out so the stage does not need the MediaError global.
const MEDIA_ERR_NETWORK = 2;
const MEDIA_ERR_DECODE = 3;
const MEDIA_ERR_SRC_NOT_SUPPORTED = 4;

function describeMediaError(error: MediaError | null): string {
  switch (error?.code) {
    case MEDIA_ERR_NETWORK:
      return 'The video stopped loading. Check your connection.';
    case MEDIA_ERR_DECODE:
    case MEDIA_ERR_SRC_NOT_SUPPORTED:
      return 'This browser cannot play the clip as it was filmed. The server makes a playable copy after upload; if this stays, upload the clip again.';
    default:
      return 'The video could not be played.';
  }
}

const WHEEL_ZOOM_STEP = 1.15;

/**
 * The stage: the video fitted in a box, zoomed and panned by a CSS transform, with the overlay layer
 * and the drawing slot on top in the untransformed box (they draw through videoToStage).
 */
export function VideoStage({ overlay }: { overlay: ReactNode }) {
  const ws = useStage();
  const { snowLineEditing, drawingActive } = useAnnotations();
  const { clip, videoSize, setStageElement, setVideoElement, zoomAt, viewTransform, renewMedia } = ws;
  const boxRef = useRef<HTMLDivElement | null>(null);
  const renewed = useRef(false);
  const resumeAt = useRef(0);
  const [mediaError, setMediaError] = useState<string | null>(null);
  const aspect = videoSize.width > 0 && videoSize.height > 0 ? videoSize.width / videoSize.height : 16 / 9;

  // Wheel zoom needs a non-passive listener to keep the page from scrolling under the pointer.
  useEffect(() => {
    const box = boxRef.current;
    if (!box) return;
    const onWheel = (event: WheelEvent) => {
      // Plain wheel scrolls the page; Ctrl/⌘ + wheel (and a trackpad pinch, which sets ctrlKey) zooms.
      if (!event.ctrlKey && !event.metaKey) return;
      event.preventDefault();
      const rect = box.getBoundingClientRect();
      const factor = event.deltaY < 0 ? WHEEL_ZOOM_STEP : 1 / WHEEL_ZOOM_STEP;
      zoomAt(viewTransform.zoom * factor, [event.clientX - rect.left, event.clientY - rect.top]);
    };
    box.addEventListener('wheel', onWheel, { passive: false });
    return () => box.removeEventListener('wheel', onWheel);
  }, [zoomAt, viewTransform.zoom]);

  const handleError = async (video: HTMLVideoElement) => {
    resumeAt.current = video.currentTime;
    // One silent retry with a fresh URL covers an expired media token; a second failure is real.
    if (!renewed.current) {
      renewed.current = true;
      const url = await renewMedia();
      // Same URL back (token still valid): reload the element so it tries once more.
      if (url === null || url === ws.mediaSrc) video.load();
      return;
    }
    setMediaError(describeMediaError(video.error));
  };

  return (
    <div>
      <div
        ref={(el) => {
          boxRef.current = el;
          setStageElement(el);
        }}
        data-testid="stage"
        className="relative mx-auto w-full touch-none overflow-hidden rounded-lg bg-glacier-950 select-none"
        style={{ aspectRatio: `${aspect}`, maxWidth: `calc(68vh * ${aspect})` }}
      >
        <video
          ref={setVideoElement}
          src={ws.mediaSrc}
          poster={clip.posterUrl ?? undefined}
          muted
          playsInline
          preload="auto"
          aria-label={`Video of ${clip.originalName}`}
          className="absolute inset-0 h-full w-full origin-top-left object-contain"
          style={{ transform: cssTransform(viewTransform) }}
          onLoadedMetadata={(event) => {
            if (resumeAt.current > 0) event.currentTarget.currentTime = resumeAt.current;
            // A link that loaded may expire later in a long review: allow one more silent renewal.
            renewed.current = false;
            setMediaError(null);
          }}
          onError={(event) => void handleError(event.currentTarget)}
        />
        {overlay}
        {snowLineEditing ? <SnowLineBanner /> : null}
        <ZoomControls />
        <div
          ref={ws.setStageOverlaySlot}
          data-testid="stage-overlay-slot"
          className={cn('absolute inset-0', !drawingActive && 'pointer-events-none')}
        />
      </div>
      {mediaError ? (
        <Notice tone="error" title="Playback problem" className="mt-3">
          <p>{mediaError}</p>
          <Button
            variant="secondary"
            size="sm"
            className="mt-2"
            onClick={() => {
              renewed.current = false;
              setMediaError(null);
              void renewMedia().then(() => ws.videoRef.current?.load());
            }}
          >
            Try again
          </Button>
        </Notice>
      ) : null}
    </div>
  );
}
