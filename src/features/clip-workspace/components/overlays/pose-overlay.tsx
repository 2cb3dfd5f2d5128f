import { useEffect, useRef, useState, type PointerEvent as ReactPointerEvent } from 'react';
import type { KeypointName, ReferenceLine } from '@shared/keypoints';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { cn } from '@/lib/format';
import { usePutClipFrame } from '../../api/put-clip-frame';
import { movePoint } from '../../lib/point-correction';
import { nearestPoint } from '../../lib/overlay-geometry';
import type { Point } from '../../lib/stage-transform';
import {
  useAnalysis,
  useCurrentPose,
  useFramePoseState,
  type FrameKeypoints,
} from '../stage/analysis-context';
import { useAnnotations, useEffectiveReferenceLine, useFrameHasOwnLine } from '../stage/annotations-context';
import { useStage, useStageClock } from '../stage/stage-context';
import { defaultSnowLine, drawOverlays } from './draw-overlays';

/** How close (CSS pixels) the pointer must come to grab a keypoint or a handle. */
const GRAB_RADIUS = 14;

type Drag =
  | { kind: 'point'; name: KeypointName; start: FrameKeypoints }
  | { kind: 'handle'; index: 0 | 1 }
  | { kind: 'pan'; last: Point };

/**
 * The canvas over the video: draws the overlays through videoToStage (sharp at any zoom) and takes the
 * pointer for three jobs: dragging a snow-line handle, dragging a misplaced keypoint, panning.
 */
export function PoseOverlay() {
  // The overlay shows the frame, so it follows the frame; the page around it does not.
  const stage = useStage();
  const annotations = useAnnotations();
  const { bands, applyCorrection } = useAnalysis();
  const currentPose = useCurrentPose();
  const { frameKeypoints } = useFramePoseState();
  const effectiveReferenceLine = useEffectiveReferenceLine();
  const playing = useStageClock((s) => s.playing);
  const { stageSize, videoSize, videoToStage, stageToVideo, canEdit, clock } = stage;
  const view = stage.clip.view;
  const { overlays, snowLineEditing, drawingActive } = annotations;
  const toast = useToast();
  const putFrame = usePutClipFrame(stage.clip.id);
  const canvasRef = useRef<HTMLCanvasElement | null>(null);
  const [drag, setDrag] = useState<Drag | null>(null);
  const [hover, setHover] = useState<'point' | 'handle' | null>(null);
  const [activePoint, setActivePoint] = useState<KeypointName | null>(null);
  const [draftLine, setDraftLine] = useState<ReferenceLine | null>(null);

  const shownLine = draftLine ?? effectiveReferenceLine;
  const ownFrameLine = useFrameHasOwnLine();

  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas || stageSize.width <= 0) return;
    const dpr = window.devicePixelRatio || 1;
    canvas.width = Math.round(stageSize.width * dpr);
    canvas.height = Math.round(stageSize.height * dpr);
    const ctx = canvas.getContext('2d');
    if (!ctx) return;
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.clearRect(0, 0, stageSize.width, stageSize.height);
    drawOverlays(
      ctx,
      {
        pose: currentPose,
        view,
        referenceLine: shownLine,
        toggles: overlays,
        bands,
        videoSize,
        snowLineHandles: snowLineEditing,
        snowLineOwnFrame: ownFrameLine,
        activePoint,
      },
      { map: videoToStage },
    );
  }, [
    currentPose,
    view,
    shownLine,
    overlays,
    bands,
    videoSize,
    snowLineEditing,
    ownFrameLine,
    activePoint,
    stageSize,
    videoToStage,
  ]);

  const local = (event: ReactPointerEvent): Point => {
    const rect = event.currentTarget.getBoundingClientRect();
    return [event.clientX - rect.left, event.clientY - rect.top];
  };

  const handles = (): Point[] => {
    const line = shownLine ?? defaultSnowLine(videoSize);
    return [videoToStage(line[0]), videoToStage(line[1])];
  };

  const pointHit = (at: Point): KeypointName | null => {
    // Points move only on a still frame that has been measured.
    if (!canEdit || playing || !currentPose || currentPose.keypoints.length === 0) return null;
    const keypoints = currentPose.keypoints;
    const index = nearestPoint(
      keypoints.map((k) => videoToStage([k.x, k.y])),
      at,
      GRAB_RADIUS,
    );
    return index >= 0 ? keypoints[index].name : null;
  };

  const clampToVideo = (p: Point): [number, number] => [
    Math.min(videoSize.width, Math.max(0, p[0])),
    Math.min(videoSize.height, Math.max(0, p[1])),
  ];

  const onPointerDown = (event: ReactPointerEvent<HTMLCanvasElement>) => {
    if (event.button !== 0) return;
    const at = local(event);
    if (snowLineEditing) {
      const index = nearestPoint(handles(), at, GRAB_RADIUS);
      if (index === 0 || index === 1) {
        setDraftLine(shownLine ?? defaultSnowLine(videoSize));
        setDrag({ kind: 'handle', index });
        event.currentTarget.setPointerCapture(event.pointerId);
        return;
      }
    }
    const name = pointHit(at);
    if (name && frameKeypoints) {
      setDrag({ kind: 'point', name, start: frameKeypoints });
      setActivePoint(name);
      event.currentTarget.setPointerCapture(event.pointerId);
      return;
    }
    if (stage.viewTransform.zoom > 1) {
      setDrag({ kind: 'pan', last: at });
      event.currentTarget.setPointerCapture(event.pointerId);
    }
  };

  const onPointerMove = (event: ReactPointerEvent<HTMLCanvasElement>) => {
    const at = local(event);
    if (!drag) {
      const onHandle = snowLineEditing && nearestPoint(handles(), at, GRAB_RADIUS) >= 0;
      const name = onHandle ? null : pointHit(at);
      setHover(onHandle ? 'handle' : name ? 'point' : null);
      setActivePoint(name);
      return;
    }
    if (drag.kind === 'pan') {
      stage.panBy(at[0] - drag.last[0], at[1] - drag.last[1]);
      setDrag({ kind: 'pan', last: at });
    } else if (drag.kind === 'handle') {
      const line = draftLine ?? defaultSnowLine(videoSize);
      const moved = clampToVideo(stageToVideo(at));
      const next: ReferenceLine = drag.index === 0 ? [moved, line[1]] : [line[0], moved];
      setDraftLine(next);
      if (Math.hypot(next[0][0] - next[1][0], next[0][1] - next[1][1]) >= 4)
        annotations.previewReferenceLine(next);
    } else if (frameKeypoints) {
      const [x, y] = clampToVideo(stageToVideo(at));
      // Metrics follow the point at once: currentPose recomputes from these keypoints.
      applyCorrection(movePoint(frameKeypoints, drag.name, [x, y]));
    }
  };

  const finish = (event: ReactPointerEvent<HTMLCanvasElement>) => {
    if (!drag) return;
    if (event.currentTarget.hasPointerCapture(event.pointerId)) {
      event.currentTarget.releasePointerCapture(event.pointerId);
    }
    if (drag.kind === 'handle' && draftLine) {
      const [a, b] = draftLine;
      if (Math.hypot(a[0] - b[0], a[1] - b[1]) < 4) {
        toast.error('The two snow-line handles are on top of each other; drag them apart.');
      } else {
        if (annotations.snowLineScope === 'frame')
          annotations.setFrameReferenceLine(clock.get().frame, draftLine);
        else annotations.setReferenceLine(draftLine);
      }
      annotations.previewReferenceLine(null);
      setDraftLine(null);
    } else if (drag.kind === 'point' && frameKeypoints && frameKeypoints !== drag.start) {
      const saved = frameKeypoints;
      putFrame.mutate(
        { frameIndex: saved.frameIndex, model: saved.model, keypoints: saved.keypoints },
        {
          // The correction stays on screen and in this page's memory; only the save failed.
          onError: (error) =>
            toast.error(`The corrected point was not saved: ${errorMessage(error)}. Drag it again to retry.`),
        },
      );
    }
    setDrag(null);
  };

  const cursor =
    drag?.kind === 'pan'
      ? 'cursor-grabbing'
      : drag
        ? 'cursor-grabbing'
        : hover
          ? 'cursor-grab'
          : stage.viewTransform.zoom > 1
            ? 'cursor-move'
            : 'cursor-default';

  // data-snow-handles and data-points say where the handles and joints are on the stage, so browser
  // tests can drag them like a coach would.
  return (
    <canvas
      ref={canvasRef}
      data-testid="pose-overlay"
      data-snow-handles={
        snowLineEditing
          ? handles()
              .map((p) => p.map((v) => v.toFixed(1)).join(','))
              .join(' ')
          : undefined
      }
      data-points={
        currentPose && !playing
          ? currentPose.keypoints
              .map(
                (k) =>
                  `${k.name}:${videoToStage([k.x, k.y])
                    .map((v) => v.toFixed(1))
                    .join(',')}`,
              )
              .join(' ')
          : undefined
      }
      aria-hidden="true"
      className={cn('absolute inset-0 h-full w-full', cursor, drawingActive && 'pointer-events-none')}
      onPointerDown={onPointerDown}
      onPointerMove={onPointerMove}
      onPointerUp={finish}
      onPointerCancel={finish}
      onPointerLeave={() => {
        if (!drag) {
          setHover(null);
          setActivePoint(null);
        }
      }}
    />
  );
}
