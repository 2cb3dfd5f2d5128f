import { cn } from '@/lib/format';
import { useAnnotations, useFrameHasOwnLine, type OverlayKey } from '../stage/annotations-context';
import { useStage } from '../stage/stage-context';

const TOGGLES: { key: OverlayKey; label: string; front?: boolean }[] = [
  { key: 'skeleton', label: 'Skeleton' },
  { key: 'angleArcs', label: 'Angle arcs' },
  { key: 'tiltGauge', label: 'Tilt gauge', front: true },
  { key: 'widthBars', label: 'Width bars', front: true },
];

/** Overlay switches and the snow line tool, above the stage. */
export function OverlayToolbar() {
  const { clip, canEdit, clock } = useStage();
  const view = clip.view;
  const {
    overlays,
    setOverlay,
    snowLineEditing,
    setSnowLineEditing,
    referenceLine,
    setReferenceLine,
    setFrameReferenceLine,
    setSnowLineScope,
  } = useAnnotations();
  const ownLine = useFrameHasOwnLine();

  return (
    <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
      <fieldset className="flex flex-wrap items-center gap-x-3 gap-y-1">
        <legend className="sr-only">Overlays</legend>
        {TOGGLES.map((toggle) => {
          const unavailable = toggle.front === true && view !== 'front';
          return (
            <label
              key={toggle.key}
              className={cn(
                'flex items-center gap-1.5 text-sm',
                unavailable ? 'text-granite-400' : 'text-granite-800',
              )}
              title={unavailable ? 'Measured in front views only' : undefined}
            >
              <input
                type="checkbox"
                checked={overlays[toggle.key] && !unavailable}
                disabled={unavailable}
                onChange={(event) => setOverlay(toggle.key, event.target.checked)}
                className="h-4 w-4 accent-glacier-700"
              />
              {toggle.label}
            </label>
          );
        })}
      </fieldset>
      {canEdit ? (
        <div className="ml-auto flex items-center gap-2">
          <button
            type="button"
            aria-pressed={snowLineEditing}
            onClick={() => {
              // A frame with its own line opens on that line; otherwise the clip's line is edited.
              if (!snowLineEditing) setSnowLineScope(ownLine ? 'frame' : 'clip');
              setSnowLineEditing(!snowLineEditing);
            }}
            className={cn(
              'h-8 rounded-md border px-3 text-sm font-medium',
              snowLineEditing
                ? 'border-glacier-700 bg-glacier-700 text-white'
                : 'border-granite-200 bg-white text-granite-800 hover:border-glacier-300 hover:bg-glacier-50',
            )}
          >
            {snowLineEditing ? 'Done with snow line' : 'Set snow line'}
          </button>
          {ownLine ? (
            <button
              type="button"
              onClick={() => {
                setFrameReferenceLine(clock.get().frame, null);
                setSnowLineScope('clip');
              }}
              className="h-8 rounded-md px-2 text-sm text-glacier-700 hover:bg-glacier-50"
            >
              Clip’s line on this frame
            </button>
          ) : referenceLine ? (
            <button
              type="button"
              onClick={() => setReferenceLine(null)}
              className="h-8 rounded-md px-2 text-sm text-glacier-700 hover:bg-glacier-50"
            >
              Use image level
            </button>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
