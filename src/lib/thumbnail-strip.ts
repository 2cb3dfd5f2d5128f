import type { ThumbnailStripDto as ClipThumbnails } from '@shared/schemas/clip.schema';

export interface TileOffset {
  index: number;
  /** Top-left corner of the tile in the sprite sheet, sprite pixels. */
  x: number;
  y: number;
}

/** The sprite tile that shows the clip at `timeMs` (tile k covers k·interval to (k+1)·interval). */
export function tileForTime(timeMs: number, strip: ClipThumbnails): TileOffset {
  const raw = Math.floor(Math.max(0, timeMs) / strip.intervalMs);
  const index = Math.min(strip.count - 1, raw);
  const column = index % strip.columns;
  const row = Math.floor(index / strip.columns);
  return { index, x: column * strip.tileWidth, y: row * strip.tileHeight };
}

/**
 * Times (ms) of the tiles that fill a bar `barWidth` CSS pixels wide when each tile is scaled to
 * `barHeight`: one tile per slot, each showing the moment at the slot's centre.
 */
export function stripSlots(
  barWidth: number,
  barHeight: number,
  durationMs: number,
  strip: ClipThumbnails,
): { left: number; width: number; timeMs: number }[] {
  if (barWidth <= 0 || barHeight <= 0 || durationMs <= 0 || strip.count <= 0) return [];
  const tileWidth = (strip.tileWidth * barHeight) / strip.tileHeight;
  const count = Math.max(1, Math.ceil(barWidth / tileWidth));
  const width = barWidth / count;
  return Array.from({ length: count }, (_, i) => ({
    left: i * width,
    width,
    timeMs: ((i + 0.5) / count) * durationMs,
  }));
}
