import type { ThumbnailLayout } from '../entities/clip.entity';
import { runFfmpeg, FfmpegError } from './ffmpeg-run';
import { nonEmpty } from './poster';
import { probeImageSize } from './probe';

export const THUMBNAIL_TILE_WIDTH = 160;
export const THUMBNAIL_COLUMNS = 10;
export const THUMBNAIL_MAX_TILES = 100;
/** Finest spacing: closer than this the tiles of a short clip would all look the same. */
export const THUMBNAIL_MIN_INTERVAL_MS = 250;

/** Tiles every intervalMs from 0, at most THUMBNAIL_MAX_TILES, the interval a multiple of 250 ms. */
export function thumbnailPlan(durationMs: number): { count: number; intervalMs: number } {
  const step = THUMBNAIL_MIN_INTERVAL_MS;
  const intervalMs = Math.max(step, Math.ceil(durationMs / THUMBNAIL_MAX_TILES / step) * step);
  const count = Math.max(1, Math.min(THUMBNAIL_MAX_TILES, Math.ceil(durationMs / intervalMs)));
  return { count, intervalMs };
}

/**
 * One JPEG sprite: ffmpeg's fps filter picks the frame at each interval, scale makes the tiles
 * THUMBNAIL_TILE_WIDTH wide, tile lays them out row by row. Tile height is read back from the
 * sprite rather than assumed, so the layout always matches the image.
 */
export async function makeThumbnailStrip(
  input: string,
  output: string,
  durationMs: number,
  signal?: AbortSignal,
): Promise<ThumbnailLayout> {
  const { count, intervalMs } = thumbnailPlan(durationMs);
  const columns = Math.min(THUMBNAIL_COLUMNS, count);
  const rows = Math.ceil(count / columns);
  await runFfmpeg(
    [
      '-i',
      input,
      '-vf',
      `fps=1000/${intervalMs},scale=${THUMBNAIL_TILE_WIDTH}:-2,tile=${columns}x${rows}`,
      '-frames:v',
      '1',
      '-q:v',
      '4',
      '-f',
      'image2',
      output,
    ],
    { signal },
  );
  if (!(await nonEmpty(output)))
    throw new FfmpegError('no thumbnails could be made', 'empty thumbnail strip');
  const size = await probeImageSize(output);
  return {
    count,
    tileWidth: size.width / columns,
    tileHeight: size.height / rows,
    columns,
    intervalMs,
  };
}
