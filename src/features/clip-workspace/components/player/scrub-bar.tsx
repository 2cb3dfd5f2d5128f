import { useEffect, useRef, useState } from 'react';
import { clipExtras } from '../../api/clip-contract';
import { formatClipTime, frameStartMs } from '../../lib/frame-time';
import { stripSlots, tileForTime } from '@/lib/thumbnail-strip';
import { useAnnotations } from '../stage/annotations-context';
import { useStage, useStageFrame } from '../stage/stage-context';

const BAR_HEIGHT = 44;

/** A frame slider laid over the clip's thumbnail strip; hovering previews the frame under the pointer. */
export function ScrubBar() {
  const { clip, fps, frameCount, seekToFrame } = useStage();
  const { frameReferenceLines } = useAnnotations();
  // The slider shows the frame on screen, so it follows every frame.
  const currentFrame = useStageFrame();
  const strip = clipExtras(clip).thumbnails ?? null;
  const barRef = useRef<HTMLDivElement | null>(null);
  const [barWidth, setBarWidth] = useState(0);
  const [hover, setHover] = useState<{ x: number; frame: number } | null>(null);
  const durationMs = clip.durationMs ?? frameStartMs(frameCount, fps);

  useEffect(() => {
    const bar = barRef.current;
    if (!bar) return;
    const observer = new ResizeObserver(() => setBarWidth(bar.clientWidth));
    observer.observe(bar);
    setBarWidth(bar.clientWidth);
    return () => observer.disconnect();
  }, []);

  const slots = strip ? stripSlots(barWidth, BAR_HEIGHT, durationMs, strip) : [];
  const tileScale = strip ? BAR_HEIGHT / strip.tileHeight : 1;
  const lastFrame = Math.max(0, frameCount - 1);
  const position = lastFrame > 0 ? currentFrame / lastFrame : 0;

  const frameAtX = (clientX: number): number => {
    const rect = barRef.current?.getBoundingClientRect();
    if (!rect || rect.width <= 0) return 0;
    const fraction = Math.min(1, Math.max(0, (clientX - rect.left) / rect.width));
    return Math.round(fraction * lastFrame);
  };

  return (
    <div className="relative">
      <div
        ref={barRef}
        className="relative overflow-hidden rounded-md border border-granite-200 bg-glacier-900"
        style={{ height: BAR_HEIGHT }}
        onPointerMove={(event) => {
          const rect = event.currentTarget.getBoundingClientRect();
          setHover({ x: event.clientX - rect.left, frame: frameAtX(event.clientX) });
        }}
        onPointerLeave={() => setHover(null)}
      >
        {strip
          ? slots.map((slot) => {
              const tile = tileForTime(slot.timeMs, strip);
              return (
                <div
                  key={slot.left}
                  aria-hidden="true"
                  className="absolute top-0 bg-no-repeat opacity-80"
                  style={{
                    left: slot.left,
                    width: slot.width + 1,
                    height: BAR_HEIGHT,
                    backgroundImage: `url(${strip.url})`,
                    backgroundSize: `${strip.columns * strip.tileWidth * tileScale}px auto`,
                    backgroundPosition: `${-tile.x * tileScale - (strip.tileWidth * tileScale - slot.width) / 2}px ${-tile.y * tileScale}px`,
                  }}
                />
              );
            })
          : null}
        <div
          aria-hidden="true"
          className="pointer-events-none absolute inset-y-0 left-0 bg-glacier-400/25"
          style={{ width: `${position * 100}%` }}
        />
        {[...frameReferenceLines.keys()].map((frame) => (
          <div
            key={frame}
            aria-hidden="true"
            title={`Frame ${frame} has its own snow line`}
            className="pointer-events-none absolute bottom-0 h-1.5 w-1 -translate-x-1/2 rounded-t-sm bg-glacier-200"
            style={{ left: `${lastFrame > 0 ? (frame / lastFrame) * 100 : 0}%` }}
          />
        ))}
        <div
          aria-hidden="true"
          className="pointer-events-none absolute inset-y-0 w-0.5 -translate-x-1/2 bg-signal-400 shadow-[0_0_0_1px_rgba(17,36,58,0.8)]"
          style={{ left: `${position * 100}%` }}
        />
        <input
          type="range"
          aria-label="Frame"
          aria-valuetext={`Frame ${currentFrame} of ${lastFrame}, ${formatClipTime(frameStartMs(currentFrame, fps))}`}
          min={0}
          max={lastFrame}
          step={1}
          value={currentFrame}
          onChange={(event) => seekToFrame(Number(event.target.value))}
          className="absolute inset-0 h-full w-full cursor-pointer appearance-none bg-transparent opacity-0"
        />
      </div>
      {hover && strip ? (
        <HoverPreview
          x={hover.x}
          barWidth={barWidth}
          frame={hover.frame}
          timeMs={frameStartMs(hover.frame, fps)}
        />
      ) : null}
    </div>
  );
}

function HoverPreview({
  x,
  barWidth,
  frame,
  timeMs,
}: {
  x: number;
  barWidth: number;
  frame: number;
  timeMs: number;
}) {
  const { clip } = useStage();
  const strip = clipExtras(clip).thumbnails;
  if (!strip) return null;
  const width = 160;
  const scale = width / strip.tileWidth;
  const tile = tileForTime(timeMs, strip);
  const left = Math.min(Math.max(0, x - width / 2), Math.max(0, barWidth - width));
  return (
    <div
      aria-hidden="true"
      className="pointer-events-none absolute bottom-full z-10 mb-2 overflow-hidden rounded-md border border-granite-200 bg-white shadow-lg"
      style={{ left, width }}
    >
      <div
        className="bg-no-repeat"
        style={{
          height: strip.tileHeight * scale,
          backgroundImage: `url(${strip.url})`,
          backgroundSize: `${strip.columns * strip.tileWidth * scale}px auto`,
          backgroundPosition: `${-tile.x * scale}px ${-tile.y * scale}px`,
        }}
      />
      <p className="px-2 py-1 font-mono text-xs text-granite-800 tabular-nums">
        {frame} · {formatClipTime(timeMs)}
      </p>
    </div>
  );
}
