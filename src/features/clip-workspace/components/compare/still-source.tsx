import { useEffect } from 'react';
import { composeStill } from '../export/compose-still';
import { useDrawOverlaysOn } from '../overlays/use-draw-overlays-on';
import { useStage } from '../stage/stage-context';

export type ComposeFrame = () => HTMLCanvasElement;

/** Lends the page a way to draw this stage's frame with its overlays (for the side-by-side still). */
export function StillSource({ register }: { register(compose: ComposeFrame | null): void }) {
  const ws = useStage();
  const drawOverlaysOn = useDrawOverlaysOn();
  useEffect(() => {
    register(() => {
      const video = ws.videoRef.current;
      if (!video) throw new Error('a clip has no frame on screen yet; wait until both show, then try again');
      const frame = ws.clock.get().frame;
      return composeStill({
        video,
        drawOverlays: (ctx, scale) => drawOverlaysOn(ctx, (p) => p, scale),
        drawings: [],
        caption: `${ws.clip.originalName} · frame ${frame} · Stanceline, 2D estimate`,
      });
    });
    return () => register(null);
  }, [register, ws.videoRef, ws.clock, ws.clip.originalName, drawOverlaysOn]);
  return null;
}

/** Both frames on one canvas at the same height, left then right, with a thin gap. */
export function sideBySide(left: HTMLCanvasElement, right: HTMLCanvasElement): HTMLCanvasElement {
  const height = Math.max(left.height, right.height);
  const widthOf = (c: HTMLCanvasElement) => Math.round((c.width * height) / c.height);
  const gap = Math.round(height / 90);
  const canvas = document.createElement('canvas');
  canvas.width = widthOf(left) + gap + widthOf(right);
  canvas.height = height;
  const ctx = canvas.getContext('2d');
  if (!ctx) throw new Error('this browser cannot draw the still (no 2D canvas)');
  ctx.fillStyle = '#ffffff';
  ctx.fillRect(0, 0, canvas.width, canvas.height);
  ctx.drawImage(left, 0, 0, widthOf(left), height);
  ctx.drawImage(right, widthOf(left) + gap, 0, widthOf(right), height);
  return canvas;
}
