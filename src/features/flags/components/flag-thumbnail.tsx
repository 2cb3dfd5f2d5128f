import type { ThumbnailStripDto } from '@shared/schemas/clip.schema';
import { tileForTime } from '@/lib/thumbnail-strip';

const WIDTH = 96;

/** The clip's thumbnail-strip tile nearest the flagged frame (at most a quarter second off). */
export function FlagThumbnail({ strip, timeMs }: { strip: ThumbnailStripDto | null; timeMs: number | null }) {
  const height = strip ? Math.round((WIDTH * strip.tileHeight) / strip.tileWidth) : 54;
  if (!strip || timeMs === null)
    return (
      <div aria-hidden="true" className="shrink-0 rounded bg-granite-100" style={{ width: WIDTH, height }} />
    );
  const tile = tileForTime(timeMs, strip);
  const scale = WIDTH / strip.tileWidth;
  const rows = Math.ceil(strip.count / strip.columns);
  return (
    <div
      role="img"
      aria-label="Frame of the flag"
      className="shrink-0 rounded bg-granite-200 bg-no-repeat"
      style={{
        width: WIDTH,
        height,
        backgroundImage: `url("${strip.url}")`,
        backgroundSize: `${strip.columns * strip.tileWidth * scale}px ${rows * strip.tileHeight * scale}px`,
        backgroundPosition: `-${tile.x * scale}px -${tile.y * scale}px`,
      }}
    />
  );
}
