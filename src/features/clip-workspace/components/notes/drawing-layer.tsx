import { useEffect, useRef, type PointerEvent as ReactPointerEvent } from 'react';
import { createPortal } from 'react-dom';
import { useAnnotations } from '../stage/annotations-context';
import { useStage, useStageFrame } from '../stage/stage-context';
import { drawDrawing } from './draw-drawing';
import { drawingDraft, useDrawingDraft, type DraftElement } from './drawing-draft';
import { manualAngleDegrees, type Drawing, type VideoPoint } from './drawing-geometry';
import { useFrameDrawings } from './use-frame-drawings';

/** The element in progress as a drawing of its own, so it renders with the same code as finished ones. */
function activeAsDrawing(active: DraftElement | null, color: string): Drawing | null {
  if (!active) return null;
  switch (active.kind) {
    case 'stroke':
      return { strokes: [{ points: active.points, color }], arrows: [], angles: [] };
    case 'arrow':
      return { strokes: [], arrows: [{ from: active.from, to: active.to, color }], angles: [] };
    case 'angle': {
      const b = active.b;
      const degrees = b ? manualAngleDegrees(active.a, active.vertex, b) : null;
      if (!b || degrees === null) {
        return { strokes: [{ points: [active.a, active.vertex], color }], arrows: [], angles: [] };
      }
      return { strokes: [], arrows: [], angles: [{ a: active.a, vertex: active.vertex, b, degrees }] };
    }
  }
}

/**
 * Freehand lines, arrows and measured angles over the frame, in video pixels. Saved notes' drawings
 * show on their frame; while drawing mode is on, the pointer draws the draft note's drawing.
 */
export function DrawingLayer() {
  const ws = useStage();
  const { drawingActive } = useAnnotations();
  const currentFrame = useStageFrame();
  const draft = useDrawingDraft();
  const { saved, draft: draftDrawing } = useFrameDrawings();
  const canvasRef = useRef<HTMLCanvasElement | null>(null);
  const { stageSize, videoToStage, stageToVideo } = ws;

  useEffect(() => {
    if (drawingDraft.get().clipId !== ws.clip.id) drawingDraft.reset(ws.clip.id);
  }, [ws.clip.id]);

  useEffect(() => {
    const canvas = canvasRef.current;
    const ctx = canvas?.getContext('2d');
    if (!canvas || !ctx) return;
    const dpr = window.devicePixelRatio || 1;
    const width = Math.round(stageSize.width * dpr);
    const height = Math.round(stageSize.height * dpr);
    if (canvas.width !== width || canvas.height !== height) {
      canvas.width = width;
      canvas.height = height;
    }
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.clearRect(0, 0, stageSize.width, stageSize.height);
    const options = { toCanvas: (p: VideoPoint) => videoToStage(p), unit: 1 };
    for (const d of saved) drawDrawing(ctx, d, { ...options, dimmed: draftDrawing !== null });
    if (draftDrawing) drawDrawing(ctx, draftDrawing, options);
    const onDraftFrame = draft.frameIndex === null || draft.frameIndex === currentFrame;
    const active = onDraftFrame ? activeAsDrawing(draft.active, draft.color) : null;
    if (active) drawDrawing(ctx, active, options);
  }, [
    saved,
    draftDrawing,
    draft.active,
    draft.color,
    draft.frameIndex,
    currentFrame,
    stageSize,
    videoToStage,
  ]);

  // Escape drops the element being drawn (not the whole drawing).
  useEffect(() => {
    if (!drawingActive) return;
    const onKey = (event: KeyboardEvent) => {
      if (event.key === 'Escape' && drawingDraft.get().active) {
        event.preventDefault();
        drawingDraft.cancelElement();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [drawingActive]);

  const toVideo = (event: ReactPointerEvent<HTMLCanvasElement>): VideoPoint => {
    const rect = event.currentTarget.getBoundingClientRect();
    return stageToVideo([event.clientX - rect.left, event.clientY - rect.top]);
  };
  // The draft belongs to one frame; marks on another frame would land in the wrong place.
  const canDraw = drawingActive && (draft.frameIndex === null || draft.frameIndex === currentFrame);

  const canvas = (
    <canvas
      ref={canvasRef}
      data-testid="drawing-layer"
      aria-label={drawingActive ? 'Drawing area over the frame' : undefined}
      aria-hidden={drawingActive ? undefined : true}
      className="absolute inset-0 h-full w-full"
      style={{
        pointerEvents: canDraw ? 'auto' : 'none',
        cursor: canDraw ? 'crosshair' : 'default',
        touchAction: 'none',
      }}
      onPointerDown={(event) => {
        if (!canDraw || event.button !== 0) return;
        event.preventDefault();
        event.currentTarget.setPointerCapture(event.pointerId);
        drawingDraft.press(toVideo(event), currentFrame);
      }}
      onPointerMove={(event) => {
        if (canDraw) drawingDraft.move(toVideo(event));
      }}
      onPointerUp={(event) => {
        if (!canDraw) return;
        if (event.currentTarget.hasPointerCapture(event.pointerId)) {
          event.currentTarget.releasePointerCapture(event.pointerId);
        }
        drawingDraft.release(toVideo(event));
      }}
      onPointerCancel={() => drawingDraft.cancelElement()}
    />
  );

  return ws.stageOverlaySlot ? createPortal(canvas, ws.stageOverlaySlot) : null;
}
