import type { PoseModelName } from '@shared/keypoints';
import type { ClipSeriesDto } from '@shared/schemas/frames.schema';
import type { Clip } from '../entities/clip.entity';
import type { FrameResult } from '../entities/frame-result.entity';
import type { ClipMeasureContext } from './clip-measure';

const DEFAULT_SIZE = 32;

/**
 * The last series (turns, transitions, summary) computed per clip and model, least recently refreshed
 * dropped first. An entry is used only while its stamp matches: any change of the frames, view, snow
 * lines or rate (also a write by another process) gives a new stamp.
 */
export class SeriesCache {
  private readonly entries = new Map<string, { stamp: string; series: ClipSeriesDto | null }>();

  constructor(private readonly size = DEFAULT_SIZE) {}

  static stampOf(clip: Clip, frames: FrameResult[], ctx: ClipMeasureContext): string {
    let latest = 0;
    for (const f of frames) latest = Math.max(latest, f.updatedAt.getTime());
    return JSON.stringify([
      frames.length,
      latest,
      ctx.view,
      ctx.referenceLine,
      [...ctx.frameLines],
      clip.fps,
    ]);
  }

  /** The cached series when its stamp is `stamp`; undefined when it must be computed. */
  get(clipId: string, model: PoseModelName, stamp: string): ClipSeriesDto | null | undefined {
    const entry = this.entries.get(key(clipId, model));
    return entry && entry.stamp === stamp ? entry.series : undefined;
  }

  remember(clipId: string, model: PoseModelName, stamp: string, series: ClipSeriesDto | null): void {
    const k = key(clipId, model);
    this.entries.delete(k);
    this.entries.set(k, { stamp, series });
    // Map keeps insertion order: the first key is the least recently refreshed.
    while (this.entries.size > this.size) {
      this.entries.delete(this.entries.keys().next().value as string);
    }
  }

  forget(clipId: string, model: PoseModelName): void {
    this.entries.delete(key(clipId, model));
  }
}

const key = (clipId: string, model: PoseModelName) => `${clipId}:${model}`;
