import { useRef, useState } from 'react';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';

interface ClipPlayerProps {
  clip: ClipDto;
  /** Fetches a fresh signed media URL (the old one may have expired while the page was open). */
  onRenewUrl: () => Promise<unknown>;
}

// MediaError codes from the HTML standard (2 network, 3 decode, 4 source not supported).
const MEDIA_ERR_NETWORK = 2;
const MEDIA_ERR_DECODE = 3;
const MEDIA_ERR_SRC_NOT_SUPPORTED = 4;

function describeMediaError(error: MediaError | null): string {
  switch (error?.code) {
    case MEDIA_ERR_NETWORK:
      return 'The video stopped loading. Check your connection.';
    case MEDIA_ERR_DECODE:
    case MEDIA_ERR_SRC_NOT_SUPPORTED:
      return 'This browser cannot play the clip as it was filmed (some phones record HEVC). A playable copy is made on the server once processing is available.';
    default:
      return 'The video could not be played.';
  }
}

export function ClipPlayer({ clip, onRenewUrl }: ClipPlayerProps) {
  const videoRef = useRef<HTMLVideoElement>(null);
  const resumeAt = useRef(0);
  const renewed = useRef(false);
  const [error, setError] = useState<string | null>(null);

  const handleError = async () => {
    const video = videoRef.current;
    resumeAt.current = video?.currentTime ?? 0;
    // One silent retry with a fresh URL covers an expired media token; a second failure is real.
    if (!renewed.current) {
      renewed.current = true;
      await onRenewUrl();
      // Same URL back (token still valid): reload the element so it tries once more.
      videoRef.current?.load();
      return;
    }
    setError(describeMediaError(video?.error ?? null));
  };

  return (
    <div>
      <div className="overflow-hidden rounded-lg bg-glacier-950">
        <video
          ref={videoRef}
          key={clip.mediaUrl}
          src={clip.mediaUrl}
          poster={clip.posterUrl ?? undefined}
          controls
          playsInline
          preload="auto"
          aria-label={`Video of ${clip.originalName}`}
          className="aspect-video w-full bg-glacier-950 object-contain"
          onLoadedMetadata={(event) => {
            if (resumeAt.current > 0) event.currentTarget.currentTime = resumeAt.current;
            // Loaded fine: a later expiry of this URL gets its own silent renewal.
            renewed.current = false;
            setError(null);
          }}
          onError={() => void handleError()}
        />
      </div>
      {error ? (
        <Notice tone="error" title="Playback problem" className="mt-3">
          <p>{error}</p>
          <Button
            variant="secondary"
            size="sm"
            className="mt-2"
            onClick={() => {
              renewed.current = false;
              setError(null);
              void onRenewUrl();
            }}
          >
            Try again
          </Button>
        </Notice>
      ) : null}
    </div>
  );
}
