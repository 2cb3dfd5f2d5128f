import { useState } from 'react';
import { createPortal } from 'react-dom';
import { Crosshair } from 'lucide-react';
import { Button } from '@/components/ui/button';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { useUpdateClip } from '../../api/update-clip';
import { useStage, useStageFrame } from '../stage/stage-context';

/**
 * Picking the athlete when other people are in the frame: the coach clicks on them once, on any
 * frame; the whole-clip analysis then starts there and follows them frame to frame (shared/pose/
 * follow.ts), saying on each frame where they were lost.
 */
export function AthletePickControl() {
  const ws = useStage();
  const { clip, canEdit } = ws;
  const frame = useStageFrame();
  const toast = useToast();
  const update = useUpdateClip(clip.id);
  const [picking, setPicking] = useState(false);
  const pick = clip.athletePick ?? null;

  const save = (next: { frameIndex: number; x: number; y: number } | null) =>
    update.mutate(
      { athletePick: next },
      {
        onSuccess: () =>
          toast.success(
            next
              ? `Athlete picked at frame ${next.frameIndex}. Analyse the whole clip to follow them; frames before it are left out.`
              : 'Pick forgotten: whoever the model finds is measured.',
          ),
        onError: (error) => toast.error(`The pick was not saved: ${errorMessage(error)}`),
      },
    );

  const layer =
    picking && ws.stageOverlaySlot
      ? createPortal(
          <div
            role="button"
            tabIndex={0}
            aria-label="Click on the athlete"
            className="pointer-events-auto absolute inset-0 cursor-crosshair"
            onKeyDown={(event) => event.key === 'Escape' && setPicking(false)}
            onClick={(event) => {
              const rect = event.currentTarget.getBoundingClientRect();
              const [x, y] = ws.stageToVideo([event.clientX - rect.left, event.clientY - rect.top]);
              setPicking(false);
              if (x < 0 || y < 0 || x > ws.videoSize.width || y > ws.videoSize.height) {
                toast.error('That point is outside the video; click on the athlete.');
                return;
              }
              save({ frameIndex: frame, x: Math.round(x), y: Math.round(y) });
            }}
          >
            <p className="pointer-events-none absolute inset-x-0 top-0 bg-glacier-950/75 px-3 py-1.5 text-xs text-white">
              Click on the athlete in this frame (Esc to cancel). Others in the frame are then left alone.
            </p>
          </div>,
          ws.stageOverlaySlot,
        )
      : null;

  return (
    <div className="flex flex-wrap items-center gap-2 text-xs">
      <span className="text-granite-600">Athlete</span>
      <span className="text-granite-800">
        {pick ? `picked at frame ${pick.frameIndex}` : 'whoever the model finds'}
      </span>
      {canEdit ? (
        <>
          <Button
            size="sm"
            variant="secondary"
            icon={<Crosshair aria-hidden="true" className="h-3.5 w-3.5" />}
            busy={update.isPending}
            onClick={() => setPicking((on) => !on)}
            aria-pressed={picking}
          >
            {pick ? 'Pick again' : 'Pick the athlete'}
          </Button>
          {pick ? (
            <Button size="sm" variant="quiet" onClick={() => save(null)}>
              Forget
            </Button>
          ) : null}
        </>
      ) : null}
      {layer}
    </div>
  );
}
