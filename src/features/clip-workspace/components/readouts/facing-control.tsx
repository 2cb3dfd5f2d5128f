import { useMemo } from 'react';
import type { SkierFacing } from '@shared/keypoints';
import { suggestFacing } from '@shared/metrics';
import { Button } from '@/components/ui/button';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { cn } from '@/lib/format';
import { useClipFrames } from '../../api/get-clip-frames';
import { useUpdateClip } from '../../api/update-clip';
import { useAnalysis } from '../stage/analysis-context';
import { useStage } from '../stage/stage-context';

const FACING_WORDS: Record<SkierFacing, string> = {
  toward: 'Faces the camera',
  away: 'Filmed from behind',
};

/**
 * Front view only: which way the skier faces. From behind, the pose models read the skier as facing
 * the camera and swap left and right; marking the clip swaps them back everywhere (stored frames, live
 * readouts, overlays, flags, exports). The analysed frames' face scores suggest a choice, which the
 * coach confirms.
 */
export function FacingControl() {
  const { clip, canEdit } = useStage();
  const { model } = useAnalysis();
  const toast = useToast();
  const stored = useClipFrames(clip.id, model);
  const update = useUpdateClip(clip.id);
  const suggestion = useMemo(
    () =>
      stored.data
        ? suggestFacing(
            stored.data.frames.map((f) => f.keypoints),
            model,
          )
        : null,
    [stored.data, model],
  );
  if (clip.view !== 'front') return null;

  const choose = (facing: SkierFacing) =>
    update.mutate(
      { facing },
      {
        onSuccess: () =>
          toast.success(
            facing === 'away'
              ? 'Marked as filmed from behind: left and right are the skier’s own again.'
              : 'Marked as facing the camera.',
          ),
        onError: (error) => toast.error(`The facing was not saved: ${errorMessage(error)}`),
      },
    );
  // Clips stored before facing existed face the camera.
  const current: SkierFacing = clip.facing ?? 'toward';
  const disagrees = suggestion !== null && suggestion.facing !== current;

  return (
    <div className="space-y-1.5 text-xs">
      <div className="flex flex-wrap items-center gap-2">
        <span className="text-granite-600">Skier</span>
        {canEdit ? (
          <div role="radiogroup" aria-label="Skier faces" className="flex rounded-md bg-granite-100 p-0.5">
            {(['toward', 'away'] as const).map((facing) => (
              <button
                key={facing}
                type="button"
                role="radio"
                aria-checked={current === facing}
                disabled={update.isPending}
                onClick={() => current !== facing && choose(facing)}
                className={cn(
                  'rounded px-2 py-0.5',
                  current === facing
                    ? 'bg-white text-granite-900 shadow-sm'
                    : 'text-granite-600 hover:bg-white/60',
                )}
              >
                {FACING_WORDS[facing]}
              </button>
            ))}
          </div>
        ) : (
          <span className="text-granite-800">{FACING_WORDS[current].toLowerCase()}</span>
        )}
      </div>
      {disagrees ? (
        <div
          role="status"
          className="rounded-md border border-signal-400 bg-signal-400/10 px-2 py-1.5 text-granite-900"
        >
          <p>
            {suggestion.facing === 'away'
              ? `The face is barely seen in ${suggestion.frames} analysed frames: this clip looks filmed from behind. The pose model reads every skier as facing the camera, so left and right would be swapped.`
              : `A face is seen in ${suggestion.frames} analysed frames: this clip looks filmed from the front.`}
          </p>
          {canEdit ? (
            <Button
              size="sm"
              variant="secondary"
              className="mt-1"
              busy={update.isPending}
              onClick={() => choose(suggestion.facing)}
            >
              {suggestion.facing === 'away' ? 'Mark as filmed from behind' : 'Mark as facing the camera'}
            </Button>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
