import type { ReactNode } from 'react';
import { Maximize, Minus, Plus } from 'lucide-react';
import { useStage } from './stage-context';

export const ZOOM_STEP = 1.25;

function ZoomButton({
  label,
  onClick,
  disabled,
  children,
}: {
  label: string;
  onClick(): void;
  disabled?: boolean;
  children: ReactNode;
}) {
  return (
    <button
      type="button"
      aria-label={label}
      title={label}
      onClick={onClick}
      disabled={disabled}
      className="inline-flex h-7 w-7 items-center justify-center rounded text-white hover:bg-white/15 focus-visible:outline-2 focus-visible:outline-white disabled:opacity-40"
    >
      {children}
    </button>
  );
}

/** Zoom buttons floating in the stage's corner, out of the way of the skier. */
export function ZoomControls() {
  const { viewTransform, zoomAt, resetZoom } = useStage();
  return (
    <div
      role="group"
      aria-label="Zoom"
      className="absolute right-2 bottom-2 flex items-center gap-0.5 rounded-md bg-glacier-950/70 p-0.5 backdrop-blur-sm"
    >
      <ZoomButton
        label="Zoom out"
        onClick={() => zoomAt(viewTransform.zoom / ZOOM_STEP)}
        disabled={viewTransform.zoom <= 1}
      >
        <Minus aria-hidden="true" className="h-4 w-4" />
      </ZoomButton>
      <span className="w-11 text-center font-mono text-xs text-white tabular-nums">
        {Math.round(viewTransform.zoom * 100)}%
      </span>
      <ZoomButton
        label="Zoom in"
        onClick={() => zoomAt(viewTransform.zoom * ZOOM_STEP)}
        disabled={viewTransform.zoom >= 8}
      >
        <Plus aria-hidden="true" className="h-4 w-4" />
      </ZoomButton>
      <ZoomButton label="Whole frame" onClick={resetZoom} disabled={viewTransform.zoom === 1}>
        <Maximize aria-hidden="true" className="h-4 w-4" />
      </ZoomButton>
    </div>
  );
}
