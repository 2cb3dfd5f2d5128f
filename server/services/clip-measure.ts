import type { EntityManager } from 'typeorm';
import type { Keypoint, ReferenceLine, View } from '@shared/keypoints';
import { computeFrameMetrics, emptyFrameMetrics, type FrameMetrics } from '@shared/metrics';
import type { ToleranceBand as SharedBand } from '@shared/tolerance';
import type { Clip } from '../entities/clip.entity';
import type { ToleranceBand } from '../entities/tolerance-band.entity';
import type { Repositories } from '../repositories/unit-of-work';
import type { ToleranceBandService } from './tolerance-band.service';

/** What metrics and flags of one clip depend on besides the keypoints. */
export interface ClipMeasureContext {
  view: View;
  referenceLine: ReferenceLine | null;
  /** Lines set on single frames; each replaces the clip's line for its own frame. */
  frameLines: Map<number, ReferenceLine>;
  bands: { band: SharedBand; row: ToleranceBand }[];
  /** The clip's first tagged athlete and their age group, whose bands apply (null: none tagged). */
  athleteId: string | null;
  ageGroupId: string | null;
}

/** The bands lookup a measure context needs (the tolerance-band service, or a test's stand-in). */
export type BandSource = Pick<ToleranceBandService, 'forAgeGroup'>;

/** The snow line in force on a frame: its own, else the clip's (null: the image horizontal). */
export function lineForFrame(
  ctx: Pick<ClipMeasureContext, 'referenceLine' | 'frameLines'>,
  frameIndex: number,
): ReferenceLine | null {
  return ctx.frameLines.get(frameIndex) ?? ctx.referenceLine;
}

/** Metrics of one frame exactly as the browser and the CLI compute them (shared/ metrics). */
export function measureFrame(
  keypoints: Keypoint[],
  ctx: Pick<ClipMeasureContext, 'view' | 'referenceLine' | 'frameLines'>,
  frameIndex: number,
): FrameMetrics {
  if (keypoints.length === 0) return emptyFrameMetrics('no skier found');
  return computeFrameMetrics({ keypoints, view: ctx.view, referenceLine: lineForFrame(ctx, frameIndex) });
}

/** The clip's view, snow lines and the bands of its (first tagged) athlete's age group. */
export async function loadMeasureContext(
  repos: Repositories,
  bands: BandSource,
  clip: Clip,
  manager: EntityManager,
): Promise<ClipMeasureContext> {
  const referenceLine = await repos.referenceLines.forClip(clip.id);
  const frameLines = await repos.referenceLines.forFrames(clip.id);
  const tagged = (await repos.clips.athleteIdsByClip([clip.id])).get(clip.id) ?? [];
  const [first] = await repos.athletes.findByIds(tagged.slice(0, 1));
  const rows = first ? await bands.forAgeGroup(manager, clip.clubId, first.ageGroupId) : [];
  // A band measured in the other view can never apply (its metric is null there).
  return {
    view: clip.view,
    referenceLine,
    frameLines,
    bands: rows.filter((b) => b.row.view === 'both' || b.row.view === clip.view),
    athleteId: first?.id ?? null,
    ageGroupId: first?.ageGroupId ?? null,
  };
}
