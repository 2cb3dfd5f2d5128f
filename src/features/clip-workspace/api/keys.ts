import type { PoseModelName } from '@shared/keypoints';

// One key factory for the whole workspace slice, so the player, analysis and notes invalidate each
// other's data by the same keys.
export const clipWorkspaceKeys = {
  all: ['clip-workspace'] as const,
  clip: (clipId: string) => [...clipWorkspaceKeys.all, 'clip', clipId] as const,
  /** Every stored analysis of a clip, whatever the model (prefix for invalidation). */
  framesAll: (clipId: string) => [...clipWorkspaceKeys.clip(clipId), 'frames'] as const,
  frames: (clipId: string, model: PoseModelName) => [...clipWorkspaceKeys.framesAll(clipId), model] as const,
  notes: (clipId: string) => [...clipWorkspaceKeys.clip(clipId), 'notes'] as const,
  bands: (ageGroupId: string | null) => [...clipWorkspaceKeys.all, 'bands', ageGroupId ?? 'none'] as const,
};
