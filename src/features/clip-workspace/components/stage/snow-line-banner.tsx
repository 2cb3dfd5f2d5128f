import { cn } from '@/lib/format';
import { useAnnotations } from './annotations-context';
import { useStage, useStageFrame } from './stage-context';

/** Across the top of the stage while the snow line is edited: what to do, and what the line is for. */
export function SnowLineBanner() {
  const { view } = useStage().clip;
  const currentFrame = useStageFrame();
  const { snowLineScope, setSnowLineScope } = useAnnotations();
  return (
    <div className="pointer-events-none absolute inset-x-0 top-0 flex flex-wrap items-center gap-x-3 gap-y-1 bg-glacier-950/75 px-3 py-1.5 text-xs text-white">
      <p className="min-w-0 flex-1">
        Drag the two round handles onto the snow surface (
        {view === 'front' ? 'across the hill' : 'along the slope'}). Every tilt and lean is then measured
        against that line.
      </p>
      <div
        role="radiogroup"
        aria-label="Snow line applies to"
        className="pointer-events-auto flex rounded-md bg-glacier-950/60 p-0.5"
      >
        {(
          [
            ['clip', 'Whole clip'],
            ['frame', `Frame ${currentFrame} only`],
          ] as const
        ).map(([scope, label]) => (
          <button
            key={scope}
            type="button"
            role="radio"
            aria-checked={snowLineScope === scope}
            onClick={() => setSnowLineScope(scope)}
            className={cn(
              'rounded px-2 py-0.5',
              snowLineScope === scope ? 'bg-white text-glacier-900' : 'text-white hover:bg-white/15',
            )}
          >
            {label}
          </button>
        ))}
      </div>
    </div>
  );
}
