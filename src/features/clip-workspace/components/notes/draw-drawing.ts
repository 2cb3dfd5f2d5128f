import { angleArc, angleLabelPosition, arrowHead, type Drawing, type VideoPoint } from './drawing-geometry';

/** Colours a coach can draw with: strong enough to read on sunlit snow and on dark trees. */
export const DRAWING_COLORS = [
  { name: 'Amber', value: '#f5b443' },
  { name: 'Red', value: '#d8452f' },
  { name: 'Navy', value: '#11243a' },
  { name: 'White', value: '#ffffff' },
] as const;

export const ANGLE_TOOL_COLOR = '#f5b443';

export interface DrawOptions {
  /** Maps a video pixel to the canvas' drawing space. */
  toCanvas: (p: VideoPoint) => VideoPoint;
  /** CSS pixels per canvas unit times any zoom: line widths and text stay readable at any size. */
  unit: number;
  /** Fainter rendering for drawings of saved notes under a draft. */
  dimmed?: boolean;
}

function outlined(ctx: CanvasRenderingContext2D, width: number, color: string, path: () => void): void {
  // A dark halo under every line keeps it visible on white snow and bright sky alike.
  ctx.beginPath();
  path();
  ctx.strokeStyle = 'rgba(17, 36, 58, 0.55)';
  ctx.lineWidth = width + 2.5;
  ctx.stroke();
  ctx.beginPath();
  path();
  ctx.strokeStyle = color;
  ctx.lineWidth = width;
  ctx.stroke();
}

export function formatDegrees(value: number): string {
  return `${value.toFixed(1)}°`;
}

export function drawDrawing(ctx: CanvasRenderingContext2D, drawing: Drawing, options: DrawOptions): void {
  const { toCanvas, unit } = options;
  const line = 3 * unit;
  ctx.save();
  ctx.lineCap = 'round';
  ctx.lineJoin = 'round';
  ctx.globalAlpha = options.dimmed ? 0.6 : 1;

  for (const stroke of drawing.strokes) {
    const pts = stroke.points.map(toCanvas);
    if (pts.length === 0) continue;
    outlined(ctx, line, stroke.color, () => {
      ctx.moveTo(pts[0][0], pts[0][1]);
      // A single tap still leaves a visible dot.
      if (pts.length === 1) ctx.lineTo(pts[0][0] + 0.01, pts[0][1]);
      for (const p of pts.slice(1)) ctx.lineTo(p[0], p[1]);
    });
  }

  for (const arrow of drawing.arrows) {
    const from = toCanvas(arrow.from);
    const to = toCanvas(arrow.to);
    const head = arrowHead(from, to, 14 * unit);
    outlined(ctx, line, arrow.color, () => {
      ctx.moveTo(from[0], from[1]);
      ctx.lineTo(to[0], to[1]);
      if (head) {
        ctx.moveTo(head[0][0], head[0][1]);
        ctx.lineTo(to[0], to[1]);
        ctx.lineTo(head[1][0], head[1][1]);
      }
    });
  }

  for (const angle of drawing.angles) {
    const a = toCanvas(angle.a);
    const v = toCanvas(angle.vertex);
    const b = toCanvas(angle.b);
    outlined(ctx, line, ANGLE_TOOL_COLOR, () => {
      ctx.moveTo(a[0], a[1]);
      ctx.lineTo(v[0], v[1]);
      ctx.lineTo(b[0], b[1]);
    });
    const radius = Math.min(
      28 * unit,
      Math.hypot(a[0] - v[0], a[1] - v[1]),
      Math.hypot(b[0] - v[0], b[1] - v[1]),
    );
    if (radius > 2) {
      const arc = angleArc(a, v, b);
      outlined(ctx, 2 * unit, ANGLE_TOOL_COLOR, () => ctx.arc(v[0], v[1], radius, arc.start, arc.end));
    }
    const label = formatDegrees(angle.degrees);
    const at = angleLabelPosition(a, v, b, radius + 22 * unit);
    ctx.font = `600 ${Math.round(15 * unit)}px "IBM Plex Mono", ui-monospace, monospace`;
    ctx.textAlign = 'center';
    ctx.textBaseline = 'middle';
    const w = ctx.measureText(label).width + 10 * unit;
    const h = 20 * unit;
    ctx.fillStyle = 'rgba(17, 36, 58, 0.85)';
    ctx.fillRect(at[0] - w / 2, at[1] - h / 2, w, h);
    ctx.fillStyle = '#ffffff';
    ctx.fillText(label, at[0], at[1]);
  }
  ctx.restore();
}
