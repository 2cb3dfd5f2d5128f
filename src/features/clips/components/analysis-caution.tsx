import { Notice } from '@/components/ui/notice';

export function AnalysisCaution() {
  return (
    <Notice tone="info" title="2D estimates, not medical advice">
      Angles come from a single camera and depend on where it stood and how sure the pose model is of each
      joint. They are a coaching aid, not a medical or injury assessment: pain or injury goes to a licensed
      professional. Defer to certified coaching standards and local rules.
    </Notice>
  );
}
