import { useCallback } from 'react';
import { poseResultFor, useAnalysis } from '../stage/analysis-context';
import { lineInForce, useAnnotations } from '../stage/annotations-context';
import { useStage } from '../stage/stage-context';
import { drawOverlays } from './draw-overlays';

/**
 * Draws the overlays of the frame on screen (as toggled) onto any 2D canvas, e.g. a full-size still:
 * `map` takes video pixels to that canvas, `scale` multiplies line widths and text. Reads the frame
 * when called, so holding the function costs no re-render while the clip plays.
 */
export function useDrawOverlaysOn() {
  const { clip, clock, videoSize } = useStage();
  const annotations = useAnnotations();
  const { framePose, bands } = useAnalysis();
  return useCallback(
    (ctx: CanvasRenderingContext2D, map: (p: [number, number]) => [number, number], scale = 1) => {
      const frame = clock.get().frame;
      const line = lineInForce(annotations, frame);
      drawOverlays(
        ctx,
        {
          pose: poseResultFor(framePose.get().frameKeypoints, frame, clip.view, line),
          view: clip.view,
          referenceLine: line,
          toggles: annotations.overlays,
          bands,
          videoSize,
          snowLineHandles: false,
        },
        { map, scale },
      );
    },
    [clip.view, clock, videoSize, annotations, framePose, bands],
  );
}
