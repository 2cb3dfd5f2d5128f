import { useEffect } from 'react';
import { syncedRightFrame, type SyncPlan } from '@shared/compare/turn-sync';
import { useClock, type StageClock } from '../../lib/stage-clock';

/**
 * Keeps the right stage on the frame the plan matches with the left one: the left clock leads (play,
 * pause, steps, jumps) and the right follows by exact seeks, frame by frame.
 */
export function useSyncFollow(
  left: StageClock,
  right: StageClock,
  plan: SyncPlan | null,
  rightFrameCount: number,
): void {
  const rightReady = useClock(right, (s) => s.mediaReady);
  useEffect(() => {
    if (!plan || !rightReady) return;
    let last = -1;
    const follow = () => {
      const { frame } = left.get();
      if (frame === last) return;
      last = frame;
      const target = syncedRightFrame(plan, frame, rightFrameCount);
      if (right.get().frame !== target) right.seekToFrame(target);
    };
    follow();
    return left.subscribe(follow);
  }, [left, right, plan, rightFrameCount, rightReady]);
}
