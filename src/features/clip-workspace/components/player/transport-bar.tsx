import type { ReactNode } from 'react';
import { ChevronLeft, ChevronRight, Pause, Play } from 'lucide-react';
import { cn } from '@/lib/format';
import { formatClipTime, frameStartMs } from '../../lib/frame-time';
import { PLAYBACK_RATES, useStage, useStageClock, useStageFrame } from '../stage/stage-context';
import { KeyboardHelp } from './keyboard-help';

function IconButton({
  label,
  onClick,
  children,
  disabled,
  primary,
}: {
  label: string;
  onClick(): void;
  children: ReactNode;
  disabled?: boolean;
  primary?: boolean;
}) {
  return (
    <button
      type="button"
      aria-label={label}
      title={label}
      onClick={onClick}
      disabled={disabled}
      className={cn(
        'inline-flex h-9 w-9 items-center justify-center rounded-md transition-colors focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-glacier-500 disabled:opacity-50',
        primary
          ? 'bg-glacier-700 text-white hover:bg-glacier-800'
          : 'border border-granite-200 bg-white text-granite-800 hover:border-glacier-300 hover:bg-glacier-50',
      )}
    >
      {children}
    </button>
  );
}

interface TransportBarProps {
  helpOpen: boolean;
  onHelpOpenChange(open: boolean): void;
  /** Extra controls at the end of the bar (export menu). */
  extra?: ReactNode;
}

/** Play/pause, exact frame steps, speed, the frame clock and zoom. */
export function TransportBar({ helpOpen, onHelpOpenChange, extra }: TransportBarProps) {
  const ws = useStage();
  const { frameCount } = ws;
  const playing = useStageClock((s) => s.playing);
  const playbackRate = useStageClock((s) => s.playbackRate);
  const atStart = useStageClock((s) => s.frame <= 0);
  const atEnd = useStageClock((s) => s.frame >= frameCount - 1);

  return (
    <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
      <div className="flex items-center gap-1.5">
        <IconButton label="Previous frame" onClick={() => ws.stepFrames(-1)} disabled={atStart}>
          <ChevronLeft aria-hidden="true" className="h-5 w-5" />
        </IconButton>
        {playing ? (
          <IconButton label="Pause" onClick={ws.pause} primary>
            <Pause aria-hidden="true" className="h-5 w-5" />
          </IconButton>
        ) : (
          <IconButton label="Play" onClick={ws.play} primary>
            <Play aria-hidden="true" className="h-5 w-5" />
          </IconButton>
        )}
        <IconButton label="Next frame" onClick={() => ws.stepFrames(1)} disabled={atEnd}>
          <ChevronRight aria-hidden="true" className="h-5 w-5" />
        </IconButton>
      </div>

      <div
        role="group"
        aria-label="Playback speed"
        className="flex rounded-md border border-granite-200 bg-white p-0.5"
      >
        {PLAYBACK_RATES.map((rate) => (
          <button
            key={rate}
            type="button"
            aria-pressed={playbackRate === rate}
            onClick={() => ws.setPlaybackRate(rate)}
            className={cn(
              'rounded px-2 py-1 font-mono text-xs tabular-nums',
              playbackRate === rate ? 'bg-glacier-700 text-white' : 'text-granite-600 hover:bg-glacier-50',
            )}
          >
            {rate}×
          </button>
        ))}
      </div>

      <FrameClock />

      <div className="ml-auto flex items-center gap-1.5">
        <KeyboardHelp open={helpOpen} onOpenChange={onHelpOpenChange} />
        {extra}
      </div>
    </div>
  );
}

/** Frame number and clip time of the frame on screen: the one part of the bar that changes per frame. */
function FrameClock() {
  const { frameCount, fps } = useStage();
  const currentFrame = useStageFrame();
  return (
    <p className="font-mono text-sm text-granite-800 tabular-nums" aria-live="off">
      <span className="text-granite-400">frame </span>
      <span data-testid="current-frame">{currentFrame}</span>
      <span className="text-granite-400"> / {frameCount - 1}</span>
      <span className="mx-2 text-granite-200">|</span>
      <span data-testid="current-time">{formatClipTime(frameStartMs(currentFrame, fps))}</span>
      <span className="ml-2 text-xs text-granite-400">{Number(fps.toFixed(3))} fps</span>
    </p>
  );
}
