import { drawDrawing } from '../notes/draw-drawing';
import type { Drawing } from '../notes/drawing-geometry';

export interface StillInput {
  /** The frame on screen: the visible, paused <video>. */
  video: HTMLVideoElement;
  /** Draws the pose overlays in video pixels, with line widths multiplied by `scale`. */
  drawOverlays(ctx: CanvasRenderingContext2D, scale: number): void;
  drawings: Drawing[];
  /** One line at the foot of the image: clip, frame, time. */
  caption: string;
}

/** Line widths and text are tuned for a stage about this wide; a full-size still scales them up. */
const STAGE_REFERENCE_WIDTH = 900;

/**
 * Full-resolution still of the frame on screen: the decoded frame, then the overlays, then the
 * drawings, all in video pixels (so zoom and pan on the stage do not crop or blur the still).
 */
export function composeStill(input: StillInput): HTMLCanvasElement {
  const { video } = input;
  const width = video.videoWidth;
  const height = video.videoHeight;
  if (!width || !height)
    throw new Error('the video has no frame to save yet; wait until it shows, then try again');
  const canvas = document.createElement('canvas');
  canvas.width = width;
  canvas.height = height;
  const ctx = canvas.getContext('2d');
  if (!ctx) throw new Error('this browser cannot draw the still (no 2D canvas)');
  const scale = Math.max(1, width / STAGE_REFERENCE_WIDTH);
  ctx.drawImage(video, 0, 0, width, height);
  input.drawOverlays(ctx, scale);
  for (const d of input.drawings) drawDrawing(ctx, d, { toCanvas: (p) => p, unit: scale });

  const size = Math.round(13 * scale);
  ctx.font = `500 ${size}px "IBM Plex Sans", system-ui, sans-serif`;
  ctx.textBaseline = 'middle';
  const pad = Math.round(6 * scale);
  const boxW = Math.min(width, ctx.measureText(input.caption).width + 2 * pad);
  const boxH = size + 2 * pad;
  ctx.fillStyle = 'rgba(17, 36, 58, 0.78)';
  ctx.fillRect(0, height - boxH, boxW, boxH);
  ctx.fillStyle = '#ffffff';
  ctx.fillText(input.caption, pad, height - boxH / 2, width - 2 * pad);
  return canvas;
}

export function canvasToPng(canvas: HTMLCanvasElement): Promise<Blob> {
  return new Promise((resolve, reject) =>
    canvas.toBlob(
      (blob) => (blob ? resolve(blob) : reject(new Error('the still could not be encoded as PNG'))),
      'image/png',
    ),
  );
}
