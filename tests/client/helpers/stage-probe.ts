import { useAnalysis, useCurrentPose } from '@/features/clip-workspace/components/stage/analysis-context';
import { useAnnotations } from '@/features/clip-workspace/components/stage/annotations-context';
import { useStage, useStageFrame } from '@/features/clip-workspace/components/stage/stage-context';

/**
 * Everything a test probe reads of one clip stage in one object: the three contexts, the frame on
 * screen and its measured pose. The product's components each read only their own part.
 */
export function useStageProbe() {
  return {
    ...useStage(),
    ...useAnnotations(),
    ...useAnalysis(),
    currentFrame: useStageFrame(),
    currentPose: useCurrentPose(),
  };
}
