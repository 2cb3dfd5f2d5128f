import { randomUUID } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import { referenceFrame } from '@shared/geometry';
import type { Keypoint, PoseModelName, ReferenceLine, View } from '@shared/keypoints';
import { computeFrameMetrics, emptyFrameMetrics, type FrameMetrics, type MetricKey } from '@shared/metrics';
import type { ClipResponse, UpdateClipInput } from '@shared/schemas/clip.schema';
import type {
  ClipFramesResponse,
  ClipSeriesDto,
  FlagDto,
  FrameBatchInput,
  FrameBatchResponse,
  FrameCorrectionInput,
  FrameResultDto,
  FrameResultResponse,
} from '@shared/schemas/frames.schema';
import { analyzeSeries, type SeriesResult } from '@shared/series';
import {
  evaluateFrame,
  evaluateSeries,
  type ToleranceBand as SharedBand,
  type ToleranceFlag,
} from '@shared/tolerance';
import type { Clip } from '../entities/clip.entity';
import type { Flag } from '../entities/flag.entity';
import type { FrameResult } from '../entities/frame-result.entity';
import type { ToleranceBand } from '../entities/tolerance-band.entity';
import { HttpError, badRequest, conflict, forbidden } from '../errors';
import { AthleteRepository } from '../repositories/athlete.repository';
import { ClipMediaRepository } from '../repositories/clip-media.repository';
import { ClipRepository } from '../repositories/clip.repository';
import { FlagRepository } from '../repositories/flag.repository';
import { FrameResultRepository } from '../repositories/frame-result.repository';
import { ReferenceLineRepository } from '../repositories/reference-line.repository';
import type { AccessService } from './access.service';
import type { AuditService } from './audit.service';
import type { ClipService } from './clip.service';
import type { Clock, Principal } from './principal';
import type { ToleranceBandService } from './tolerance-band.service';

/** What metrics and flags of one clip depend on besides the keypoints. */
interface ClipMeasureContext {
  view: View;
  referenceLine: ReferenceLine | null;
  /** Lines set on single frames; each replaces the clip's line for its own frame. */
  frameLines: Map<number, ReferenceLine>;
  bands: { band: SharedBand; row: ToleranceBand }[];
}

interface CachedSeries {
  stamp: string;
  series: ClipSeriesDto | null;
}

const SERIES_CACHE_SIZE = 32;

export function toFrameDto(row: FrameResult): FrameResultDto {
  return {
    frameIndex: row.frameIndex,
    timeMs: row.timeMs,
    keypoints: row.keypoints,
    metrics: row.metrics as Record<MetricKey, number | null>,
    reasons: row.reasons as Partial<Record<MetricKey, string>>,
    corrected: row.corrected,
  };
}

export function toFlagDto(row: Flag): FlagDto {
  return {
    id: row.id,
    model: row.model,
    metric: row.metric as FlagDto['metric'],
    value: row.value,
    min: row.bandMin,
    max: row.bandMax,
    distance: row.distance,
    side: row.severity === 'low' ? 'below' : 'above',
    frameIndex: row.frameIndex,
    turnIndex: row.turnIndex,
  };
}

/** The snow line in force on a frame: its own, else the clip's (null: the image horizontal). */
export function lineForFrame(
  ctx: Pick<ClipMeasureContext, 'referenceLine' | 'frameLines'>,
  frameIndex: number,
) {
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

/**
 * The keypoints turned about the image origin so that `from` takes the direction of `to`. Every
 * metric is measured against the snow line, so turning points and line together changes none:
 * a frame with its own line enters the clip's series as if filmed against the clip's line.
 */
export function alignToLine(
  keypoints: Keypoint[],
  from: ReferenceLine,
  to: ReferenceLine | null,
): Keypoint[] {
  const a = referenceFrame(from).along;
  const b = referenceFrame(to).along;
  // Angle from a to b in the y-up frame; image y points down, so the turn is applied to (x, -y).
  const phi = Math.atan2(a.x * b.y - a.y * b.x, a.x * b.x + a.y * b.y);
  if (phi === 0) return keypoints;
  const cos = Math.cos(phi);
  const sin = Math.sin(phi);
  return keypoints.map((k) => {
    const x = k.x;
    const y = -k.y;
    return { ...k, x: x * cos - y * sin, y: -(x * sin + y * cos) };
  });
}

/** Frames per second from the stored times when the clip's rate is unknown (median step). */
function rateOf(clip: Clip, frames: FrameResult[]): number | null {
  if (clip.fps && clip.fps > 0) return clip.fps;
  const steps: number[] = [];
  for (let i = 1; i < frames.length; i++) {
    const span = frames[i].frameIndex - frames[i - 1].frameIndex;
    const ms = frames[i].timeMs - frames[i - 1].timeMs;
    if (span > 0 && ms > 0) steps.push(ms / span);
  }
  if (steps.length === 0) return null;
  steps.sort((a, b) => a - b);
  return 1000 / steps[Math.floor(steps.length / 2)];
}

/**
 * Stored pose results of a clip: batches from the browser, corrections, the snow line and view.
 * Metrics are always recomputed here from keypoints (client numbers are never stored), and the
 * tolerance bands of the clip's age group turn them into flags. Callers check access first
 * (ClipAnalysisService); the demo seed writes through here too.
 */
export class FrameStore {
  private readonly seriesCache = new Map<string, CachedSeries>();

  constructor(
    private readonly dataSource: DataSource,
    private readonly bands: ToleranceBandService,
    private readonly clock: Clock,
  ) {}

  async storeBatch(clip: Clip, batch: FrameBatchInput): Promise<FrameBatchResponse> {
    this.requireReady(clip);
    this.checkFrameRange(
      clip,
      batch.frames.map((f, i) => ({ frameIndex: f.frameIndex, path: ['frames', i, 'frameIndex'] })),
    );
    const now = this.clock.now();
    const result = await this.dataSource.transaction(async (manager) => {
      const ctx = await this.measureContext(manager, clip);
      const repo = new FrameResultRepository(manager);
      const existing = new Map(
        (
          await repo.findByFrames(
            clip.id,
            batch.model,
            batch.frames.map((f) => f.frameIndex),
          )
        ).map((r) => [r.frameIndex, r]),
      );
      const inserts: FrameResult[] = [];
      const written: FrameResult[] = [];
      for (const frame of batch.frames) {
        const prior = existing.get(frame.frameIndex);
        // A coach's correction outranks any later detection of the same frame.
        if (prior?.corrected && !frame.corrected) continue;
        const m = measureFrame(frame.keypoints, ctx, frame.frameIndex);
        const row: FrameResult = {
          id: prior?.id ?? randomUUID(),
          clipId: clip.id,
          frameIndex: frame.frameIndex,
          timeMs: frame.timeMs,
          model: batch.model,
          keypoints: frame.keypoints,
          metrics: m.metrics,
          reasons: m.reasons as Record<string, string>,
          corrected: frame.corrected ?? false,
          createdAt: prior?.createdAt ?? now,
          updatedAt: now,
        };
        if (prior) {
          await repo.update(prior.id, {
            timeMs: row.timeMs,
            keypoints: row.keypoints,
            metrics: row.metrics,
            reasons: row.reasons,
            corrected: row.corrected,
            updatedAt: now,
          });
        } else inserts.push(row);
        written.push(row);
      }
      await repo.insertMany(inserts);
      await this.replaceFrameFlags(manager, clip, batch.model, ctx, written);
      // Turns need the whole clip: refresh them once the batch reaching the clip's end arrives.
      const last = clip.frameCount !== null ? clip.frameCount - 1 : null;
      if (last !== null && batch.frames.some((f) => f.frameIndex === last)) {
        await this.refreshSeries(manager, clip, batch.model, ctx);
      } else this.forget(clip.id, batch.model);
      return { stored: written.length, flags: await new FlagRepository(manager).count(clip.id, batch.model) };
    });
    return result;
  }

  async correct(
    clip: Clip,
    frameIndex: number,
    body: FrameCorrectionInput,
    record: (manager: EntityManager) => Promise<void>,
  ): Promise<FrameResultResponse> {
    this.requireReady(clip);
    this.checkFrameRange(clip, [{ frameIndex, path: ['frameIndex'] }]);
    const now = this.clock.now();
    return this.dataSource.transaction(async (manager) => {
      const ctx = await this.measureContext(manager, clip);
      const repo = new FrameResultRepository(manager);
      const prior = await repo.findOne(clip.id, body.model, frameIndex);
      const timeMs = body.timeMs ?? prior?.timeMs ?? (clip.fps ? (frameIndex * 1000) / clip.fps : null);
      if (timeMs === null)
        throw badRequest('time_unknown', 'Send timeMs: the clip’s frame rate is not known');
      const m = measureFrame(body.keypoints, ctx, frameIndex);
      const row: FrameResult = {
        id: prior?.id ?? randomUUID(),
        clipId: clip.id,
        frameIndex,
        timeMs,
        model: body.model,
        keypoints: body.keypoints,
        metrics: m.metrics,
        reasons: m.reasons as Record<string, string>,
        corrected: true,
        createdAt: prior?.createdAt ?? now,
        updatedAt: now,
      };
      if (prior) {
        await repo.update(prior.id, {
          timeMs,
          keypoints: row.keypoints,
          metrics: row.metrics,
          reasons: row.reasons,
          corrected: true,
          updatedAt: now,
        });
      } else await repo.insertMany([row]);
      await this.replaceFrameFlags(manager, clip, body.model, ctx, [row]);
      // Turns need the whole clip (about a second for 3,000 frames): they are refreshed on the
      // next read, so the corrected numbers come back at once.
      this.forget(clip.id, body.model);
      await record(manager);
      return { frame: toFrameDto(row) };
    });
  }

  async read(clip: Clip, model?: PoseModelName): Promise<ClipFramesResponse> {
    const chosen = model ?? clip.defaultModel;
    const manager = this.dataSource.manager;
    const frames = await new FrameResultRepository(manager).listByClip(clip.id, chosen);
    let series: ClipSeriesDto | null = null;
    if (frames.length > 0) {
      const ctx = await this.measureContext(manager, clip);
      const stamp = this.stampOf(clip, frames, ctx);
      const cached = this.seriesCache.get(this.cacheKey(clip.id, chosen));
      if (cached && cached.stamp === stamp) series = cached.series;
      else {
        series = await this.dataSource.transaction((m) => this.refreshSeries(m, clip, chosen, ctx, frames));
      }
    }
    const flags = await new FlagRepository(manager).list(clip.id, chosen);
    return { model: chosen, frames: frames.map(toFrameDto), series, flags: flags.map(toFlagDto) };
  }

  /** Every stored frame of every model of the clip, measured again with the clip's current view and line. */
  async recomputeClip(manager: EntityManager, clip: Clip, now: Date): Promise<void> {
    const ctx = await this.measureContext(manager, clip);
    const repo = new FrameResultRepository(manager);
    const all = await repo.listByClip(clip.id);
    const byModel = new Map<PoseModelName, FrameResult[]>();
    for (const row of all) {
      const m = measureFrame(row.keypoints, ctx, row.frameIndex);
      row.metrics = m.metrics;
      row.reasons = m.reasons as Record<string, string>;
      row.updatedAt = now;
      await repo.update(row.id, { metrics: row.metrics, reasons: row.reasons, updatedAt: now });
      const list = byModel.get(row.model) ?? [];
      list.push(row);
      byModel.set(row.model, list);
    }
    await new FlagRepository(manager).deleteAll(clip.id);
    for (const [model, rows] of byModel) {
      await this.replaceFrameFlags(manager, clip, model, ctx, rows);
      await this.refreshSeries(manager, clip, model, ctx, rows);
    }
  }

  private requireReady(clip: Clip): void {
    if (clip.status !== 'ready') {
      throw conflict(
        'clip_not_ready',
        clip.status === 'failed'
          ? `This clip could not be processed (${clip.failureReason ?? 'no reason recorded'}); results cannot be stored`
          : 'The clip is still being processed; store results once it is ready',
      );
    }
  }

  checkFrameRange(clip: Clip, frames: { frameIndex: number; path: (string | number)[] }[]): void {
    if (clip.frameCount === null) return;
    const count = clip.frameCount;
    const issues = frames
      .filter((f) => f.frameIndex >= count)
      .map((f) => ({
        path: f.path,
        code: 'too_big',
        message: `frame ${f.frameIndex} is past the clip's last frame (${count - 1})`,
      }));
    if (issues.length > 0) {
      throw new HttpError(
        400,
        'validation_failed',
        issues
          .slice(0, 5)
          .map((i) => `${i.path.join('.')}: ${i.message}`)
          .join('; '),
        { issues },
      );
    }
  }

  private async measureContext(manager: EntityManager, clip: Clip): Promise<ClipMeasureContext> {
    const lines = new ReferenceLineRepository(manager);
    const referenceLine = await lines.forClip(clip.id);
    const frameLines = await lines.forFrames(clip.id);
    const tagged = (await new ClipRepository(manager).athleteIdsByClip([clip.id])).get(clip.id) ?? [];
    const [first] = await new AthleteRepository(manager).findByIds(tagged.slice(0, 1));
    const bands = first ? await this.bands.forAgeGroup(manager, clip.clubId, first.ageGroupId) : [];
    // A band measured in the other view can never apply (its metric is null there).
    return {
      view: clip.view,
      referenceLine,
      frameLines,
      bands: bands.filter((b) => b.row.view === 'both' || b.row.view === clip.view),
    };
  }

  private flagRow(
    clip: Clip,
    model: PoseModelName,
    ctx: ClipMeasureContext,
    flag: ToleranceFlag,
    frameResultId: string | null,
  ): Flag {
    const band = ctx.bands.find((b) => b.band.metric === flag.metric);
    return {
      id: randomUUID(),
      clipId: clip.id,
      frameResultId,
      toleranceBandId: band?.row.id ?? null,
      model,
      frameIndex: flag.frameIndex ?? 0,
      turnIndex: flag.turnIndex,
      metric: flag.metric,
      value: flag.value,
      bandMin: flag.min,
      bandMax: flag.max,
      distance: flag.distance,
      severity: flag.side === 'below' ? 'low' : 'high',
      createdAt: this.clock.now(),
    };
  }

  private async replaceFrameFlags(
    manager: EntityManager,
    clip: Clip,
    model: PoseModelName,
    ctx: ClipMeasureContext,
    rows: FrameResult[],
  ): Promise<void> {
    const flags = new FlagRepository(manager);
    await flags.deleteFrameFlags(
      clip.id,
      model,
      rows.map((r) => r.frameIndex),
    );
    const bands = ctx.bands.map((b) => b.band);
    const fresh = rows.flatMap((row) =>
      evaluateFrame(row.metrics as Record<MetricKey, number | null>, bands, row.frameIndex).map((f) =>
        this.flagRow(clip, model, ctx, f, row.id),
      ),
    );
    await flags.insertMany(fresh);
  }

  /** Series over the stored frames (turns, transitions, summary), cached, with the per-turn flags stored. */
  private async refreshSeries(
    manager: EntityManager,
    clip: Clip,
    model: PoseModelName,
    ctx: ClipMeasureContext,
    known?: FrameResult[],
  ): Promise<ClipSeriesDto | null> {
    const frames = known ?? (await new FrameResultRepository(manager).listByClip(clip.id, model));
    const fps = rateOf(clip, frames);
    let result: SeriesResult | null = null;
    if (frames.length > 0 && fps) {
      result = analyzeSeries(
        frames.map((f) => {
          const own = ctx.frameLines.get(f.frameIndex);
          const keypoints = own ? alignToLine(f.keypoints, own, ctx.referenceLine) : f.keypoints;
          return { frameIndex: f.frameIndex, timeMs: f.timeMs, keypoints };
        }),
        { view: ctx.view, referenceLine: ctx.referenceLine, fps },
      );
    }
    const flags = new FlagRepository(manager);
    await flags.deleteTurnFlags(clip.id, model);
    if (result) {
      const turnBands = ctx.bands.filter((b) => b.band.metric === 'transitionRise').map((b) => b.band);
      const turnFlags = evaluateSeries({ ...result, frames: [] }, turnBands);
      await flags.insertMany(turnFlags.map((f) => this.flagRow(clip, model, ctx, f, null)));
    }
    const series: ClipSeriesDto | null = result
      ? {
          turns: result.turns,
          transitions: result.transitions,
          summary: result.summary,
          filter: result.filter,
        }
      : null;
    this.remember(clip.id, model, this.stampOf(clip, frames, ctx), series);
    return series;
  }

  private cacheKey(clipId: string, model: PoseModelName): string {
    return `${clipId}:${model}`;
  }

  /** Changes whenever anything the series depends on changes (also writes by another process). */
  private stampOf(clip: Clip, frames: FrameResult[], ctx: ClipMeasureContext): string {
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

  private remember(clipId: string, model: PoseModelName, stamp: string, series: ClipSeriesDto | null): void {
    const key = this.cacheKey(clipId, model);
    this.seriesCache.delete(key);
    this.seriesCache.set(key, { stamp, series });
    // Map keeps insertion order: the first key is the least recently refreshed.
    while (this.seriesCache.size > SERIES_CACHE_SIZE) {
      this.seriesCache.delete(this.seriesCache.keys().next().value as string);
    }
  }

  private forget(clipId: string, model: PoseModelName): void {
    this.seriesCache.delete(this.cacheKey(clipId, model));
  }
}

/** Access rules and audit around the FrameStore: who may read, post, correct and set up a clip. */
export class ClipAnalysisService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly access: AccessService,
    private readonly clips: ClipService,
    readonly frames: FrameStore,
    private readonly audit: AuditService,
    private readonly clock: Clock,
  ) {}

  /** The clip, if the caller may change its analysis: head coach, or a coach of a tagged athlete's group. */
  async findManageable(principal: Principal, clipId: string): Promise<Clip> {
    const clip = await this.clips.findVisible(principal, clipId);
    if (principal.role === 'head_coach') return clip;
    const tagged =
      (await new ClipRepository(this.dataSource.manager).athleteIdsByClip([clip.id])).get(clip.id) ?? [];
    const athletes = await new AthleteRepository(this.dataSource.manager).findByIds(tagged);
    if (!athletes.some((a) => this.access.canManageAthlete(principal, a))) {
      throw forbidden('Only coaches of the athlete’s age group can change this clip’s analysis');
    }
    return clip;
  }

  async ingest(principal: Principal, clipId: string, batch: FrameBatchInput): Promise<FrameBatchResponse> {
    return this.frames.storeBatch(await this.findManageable(principal, clipId), batch);
  }

  async correct(
    principal: Principal,
    clipId: string,
    frameIndex: number,
    body: FrameCorrectionInput,
  ): Promise<FrameResultResponse> {
    const clip = await this.findManageable(principal, clipId);
    return this.frames.correct(clip, frameIndex, body, (manager) =>
      this.audit.record(manager, {
        clubId: clip.clubId,
        actorUserId: principal.user.id,
        action: 'frame.correct',
        targetType: 'clip',
        targetId: clip.id,
        details: { model: body.model, frameIndex },
      }),
    );
  }

  async read(principal: Principal, clipId: string, model?: PoseModelName): Promise<ClipFramesResponse> {
    return this.frames.read(await this.clips.findVisible(principal, clipId), model);
  }

  /** View, default model and snow line; a new view or line recomputes every stored frame and flag. */
  async updateSettings(principal: Principal, clipId: string, input: UpdateClipInput): Promise<ClipResponse> {
    const clip = await this.findManageable(principal, clipId);
    const now = this.clock.now();
    await this.dataSource.transaction(async (manager) => {
      const lines = new ReferenceLineRepository(manager);
      const before = { view: clip.view, line: await lines.forClip(clip.id) };
      if (input.frameReferenceLines) {
        this.frames.checkFrameRange(
          clip,
          input.frameReferenceLines.map((f, i) => ({
            frameIndex: f.frameIndex,
            path: ['frameReferenceLines', i, 'frameIndex'],
          })),
        );
        for (const f of input.frameReferenceLines) {
          await lines.setForFrame(clip.id, f.frameIndex, f.referenceLine, {
            id: randomUUID(),
            userId: principal.user.id,
            at: now,
          });
        }
      }
      const patch: Partial<Clip> = {};
      if (input.view !== undefined) patch.view = input.view;
      if (input.defaultModel !== undefined) patch.defaultModel = input.defaultModel;
      if (Object.keys(patch).length > 0) await new ClipMediaRepository(manager).update(clip.id, patch);
      if (input.referenceLine !== undefined) {
        await lines.setForClip(clip.id, input.referenceLine, {
          id: randomUUID(),
          userId: principal.user.id,
          at: now,
        });
      }
      const updated: Clip = { ...clip, ...patch };
      const line = input.referenceLine !== undefined ? input.referenceLine : before.line;
      const measuresChanged =
        updated.view !== before.view ||
        JSON.stringify(line) !== JSON.stringify(before.line) ||
        input.frameReferenceLines !== undefined;
      if (measuresChanged) await this.frames.recomputeClip(manager, updated, now);
      await this.audit.record(manager, {
        clubId: clip.clubId,
        actorUserId: principal.user.id,
        action: 'clip.settings',
        targetType: 'clip',
        targetId: clip.id,
        details: { ...input, recomputed: measuresChanged },
      });
    });
    return this.clips.get(principal, clip.id);
  }
}
