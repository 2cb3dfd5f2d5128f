import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { alignToLine } from '@shared/geometry';
import { swapLeftRight } from '@shared/pose/keypoint-mapping';
import { POSE_MODELS, type PoseModelName } from '@shared/keypoints';
import type {
  ClipFramesResponse,
  ClipSeriesDto,
  FrameBatchInput,
  FrameBatchResponse,
  FrameCorrectionInput,
  FrameResultResponse,
} from '@shared/schemas/frames.schema';
import { estimateFrameRate, stretchGapFrames, type SeriesResult } from '@shared/series';
import { groupFlags, turnWindow, type FlagGroup, type TurnWindow } from '@shared/tolerance';
import type { Clip } from '../entities/clip.entity';
import type { Flag } from '../entities/flag.entity';
import type { FrameResult } from '../entities/frame-result.entity';
import { HttpError, badRequest, conflict } from '../errors';
import { toClipFlagDto, toFrameDto } from '../mappers/frame.mapper';
import { loadMeasureContext, measureFrame, type BandSource, type ClipMeasureContext } from './clip-measure';
import type { Clock } from './principal';
import { sharedSeriesWorker, type SeriesAnalyzer } from '../workers/series-pool';
import { SeriesCache } from './series-cache';
import type { UnitOfWork } from '../repositories/unit-of-work';

/**
 * Stored pose results of a clip: batches from the browser, corrections, the snow line and view.
 * Metrics are always recomputed here from keypoints (client numbers are never stored). Once the
 * clip's turns are known (the series), the tolerance bands of the clip's age group turn the metrics
 * into flags, one per habit and turn. Callers check access first (ClipAnalysisService); the demo
 * seed writes through here too.
 */
/** Stored frames read per slice of a re-check (about 2 ms of work). */
const METRICS_PAGE = 500;

const yieldToEventLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

export class FrameStore {
  private readonly seriesCache = new SeriesCache();
  private readonly refreshing = new Map<string, Promise<void>>();
  private readonly stale = new Set<string>();

  constructor(
    private readonly uow: UnitOfWork,
    private readonly bands: BandSource,
    private readonly clock: Clock,
    private readonly series: SeriesAnalyzer = sharedSeriesWorker(),
  ) {}

  /**
   * Stores a batch of detected frames; `within` runs in the same transaction (a server analysis job
   * records its progress there, so a batch and its cursor are written together or not at all). A batch
   * read for the other facing than the clip's now is swapped first (the coach turned it meanwhile).
   */
  async storeBatch(
    clip: Clip,
    input: FrameBatchInput,
    within?: (manager: EntityManager) => Promise<void>,
  ): Promise<FrameBatchResponse> {
    this.requireReady(clip);
    const batch =
      input.facing && input.facing !== clip.facing
        ? { ...input, frames: input.frames.map((f) => ({ ...f, keypoints: swapLeftRight(f.keypoints) })) }
        : input;
    this.checkFrameRange(
      clip,
      batch.frames.map((f, i) => ({
        frameIndex: f.frameIndex,
        path: ['frames', i, 'frameIndex'],
        timeMs: f.timeMs,
        timePath: ['frames', i, 'timeMs'],
      })),
    );
    const now = this.clock.now();
    // Read and measured before the transaction, so it holds the database only for the writes. (A view
    // or snow-line change recomputes every stored frame in its own transaction afterwards.)
    const ctx = await this.measureContext(this.uow.repos.manager, clip);
    const measured = batch.frames.map((f) => measureFrame(f.keypoints, ctx, f.frameIndex));
    const result = await this.uow.transaction(async (manager) => {
      const repo = this.uow.of(manager).frames;
      const existing = new Map(
        (
          await repo.findByFrames(
            clip.id,
            batch.model,
            batch.frames.map((f) => f.frameIndex),
          )
        ).map((r) => [r.frameIndex, r]),
      );
      const written: FrameResult[] = [];
      for (const [i, frame] of batch.frames.entries()) {
        const prior = existing.get(frame.frameIndex);
        // A coach's correction outranks any later detection of the same frame.
        if (prior?.corrected && !frame.corrected) continue;
        const m = measured[i];
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
          careful: batch.careful ?? false,
          createdAt: prior?.createdAt ?? now,
          updatedAt: now,
        };
        written.push(row);
      }
      // New frames and frames posted again in one statement per chunk (the transaction stays short).
      await repo.upsertMany(written);
      await within?.(manager);
      this.forget(clip.id, batch.model);
      return { stored: written.length };
    });
    // Turns, and with them the flags, need the whole clip: they are refreshed once the batch reaching
    // the clip's end arrives, in the background (the series worker computes, a short transaction
    // stores turns and flags), so the answer does not wait and other writers and readers go on. A read
    // waits for it.
    const last = clip.frameCount !== null ? clip.frameCount - 1 : null;
    if (last !== null && batch.frames.some((f) => f.frameIndex === last))
      this.scheduleSeries(clip, batch.model);
    return { stored: result.stored, flags: await this.uow.repos.flags.count(clip.id, batch.model) };
  }

  /**
   * One background series refresh per clip and model at a time; a request during a run asks for one
   * more run after it (the frames changed meanwhile), never for a pile of them.
   */
  private scheduleSeries(clip: Clip, model: PoseModelName): void {
    const key = `${clip.id}:${model}`;
    if (this.refreshing.has(key)) {
      this.stale.add(key);
      return;
    }
    const run = async () => {
      do {
        this.stale.delete(key);
        const ctx = await this.measureContext(this.uow.repos.manager, clip);
        const frames = await this.uow.repos.frames.listByClip(clip.id, model);
        const computed = await this.computeSeries(clip, ctx, frames);
        await this.uow.transaction((m) => this.persistSeries(m, clip, model, ctx, frames, computed));
      } while (this.stale.has(key));
    };
    const done = run()
      // A failed refresh leaves no cached series, so the next read computes it again and reports why.
      .catch(() => this.forget(clip.id, model))
      .finally(() => this.refreshing.delete(key));
    this.refreshing.set(key, done);
  }

  /** Resolves when no background series refresh of this clip and model is running. */
  async seriesSettled(clipId: string, model: PoseModelName): Promise<void> {
    await this.refreshing.get(`${clipId}:${model}`);
  }

  async correct(
    clip: Clip,
    frameIndex: number,
    body: FrameCorrectionInput,
    record: (manager: EntityManager) => Promise<void>,
  ): Promise<FrameResultResponse> {
    this.requireReady(clip);
    this.checkFrameRange(clip, [{ frameIndex, path: ['frameIndex'], timeMs: body.timeMs }]);
    const now = this.clock.now();
    return this.uow
      .transaction(async (manager) => {
        const ctx = await this.measureContext(manager, clip);
        const repo = this.uow.of(manager).frames;
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
          // A hand correction keeps the record of how the rest of the frame was read.
          careful: prior?.careful ?? false,
          createdAt: prior?.createdAt ?? now,
          updatedAt: now,
        };
        await repo.upsertMany([row]);
        this.forget(clip.id, body.model);
        await record(manager);
        return { frame: toFrameDto(row) };
      })
      .then((answer) => {
        // Turns and flags need the whole clip (about a second for 3,000 frames): they are refreshed in
        // the background, so the corrected numbers come back at once; a read waits for the refresh.
        this.scheduleSeries(clip, body.model);
        return answer;
      });
  }

  async read(clip: Clip, model?: PoseModelName): Promise<ClipFramesResponse> {
    const chosen = model ?? clip.defaultModel;
    // A refresh the last batch started is waited for, so a read right after a run shows its turns.
    await this.seriesSettled(clip.id, chosen);
    const repos = this.uow.repos;
    const frames = await repos.frames.listByClip(clip.id, chosen);
    let series: ClipSeriesDto | null = null;
    if (frames.length > 0) {
      const ctx = await this.measureContext(repos.manager, clip);
      const cached = this.seriesCache.get(clip.id, chosen, SeriesCache.stampOf(clip, frames, ctx));
      if (cached !== undefined) series = cached;
      else {
        const computed = await this.computeSeries(clip, ctx, frames);
        series = await this.uow.transaction((m) =>
          this.persistSeries(m, clip, chosen, ctx, frames, computed),
        );
      }
    }
    const flags = await repos.flags.list(clip.id, chosen);
    return { model: chosen, frames: frames.map(toFrameDto), series, flags: flags.map(toClipFlagDto) };
  }

  /**
   * The clip's smoothed series over its stored frames (the values=smoothed export), computed in the
   * series worker; null without frames or a frame rate.
   */
  async smoothed(clip: Clip, model: PoseModelName): Promise<SeriesResult | null> {
    const repos = this.uow.repos;
    const frames = await repos.frames.listByClip(clip.id, model);
    const ctx = await this.measureContext(repos.manager, clip);
    return this.computeSeries(clip, ctx, frames, true);
  }

  /**
   * Every stored frame of every model of the clip, measured again with the clip's current view and line;
   * `swapSides` first swaps each frame's left and right points (the clip's facing changed).
   */
  async recomputeClip(
    manager: EntityManager,
    clip: Clip,
    now: Date,
    options: { swapSides?: boolean } = {},
  ): Promise<void> {
    const ctx = await this.measureContext(manager, clip);
    const repo = this.uow.of(manager).frames;
    const all = await repo.listByClip(clip.id);
    const byModel = new Map<PoseModelName, FrameResult[]>();
    for (const row of all) {
      if (options.swapSides) row.keypoints = swapLeftRight(row.keypoints);
      const m = measureFrame(row.keypoints, ctx, row.frameIndex);
      row.metrics = m.metrics;
      row.reasons = m.reasons as Record<string, string>;
      row.updatedAt = now;
      await repo.update(row.id, {
        ...(options.swapSides ? { keypoints: row.keypoints } : {}),
        metrics: row.metrics,
        reasons: row.reasons,
        updatedAt: now,
      });
      const list = byModel.get(row.model) ?? [];
      list.push(row);
      byModel.set(row.model, list);
    }
    for (const [model, rows] of byModel) await this.refreshSeries(manager, clip, model, ctx, rows);
  }

  /**
   * Judges the stored frames and turns of a clip again against its age group's bands as they are now,
   * and stores the flags; `record` runs in the same transaction (a job's progress, so a step is done
   * once or not at all). Turns come from the stored series; a clip whose turns were never found gets
   * its series computed first. Returns the number of frames judged.
   */
  async reevaluate(
    clip: Clip,
    model: PoseModelName,
    record: (manager: EntityManager) => Promise<void>,
  ): Promise<number> {
    const repos = this.uow.repos;
    const stored = await repos.clipTurns.find(clip.id, model);
    if (!stored) {
      const ctx = await this.measureContext(repos.manager, clip);
      const frames = await repos.frames.listByClip(clip.id, model);
      const computed = await this.computeSeries(clip, ctx, frames);
      await this.uow.transaction(async (manager) => {
        await this.persistSeries(manager, clip, model, ctx, frames, computed);
        await record(manager);
      });
      return frames.length;
    }
    // Read in pages, and between the reads, the judging and the write the event loop takes waiting
    // requests: on one thread with a synchronous database, a step that never yields would hold every
    // request back for its whole length.
    const frames: { frameIndex: number; metrics: Record<string, number | null> }[] = [];
    for (;;) {
      const afterFrame = frames.length > 0 ? frames[frames.length - 1].frameIndex : -1;
      const page = await repos.frames.listMetrics(clip.id, model, { afterFrame, limit: METRICS_PAGE });
      frames.push(...page);
      await yieldToEventLoop();
      if (page.length < METRICS_PAGE) break;
    }
    const ctx = await this.measureContext(repos.manager, clip);
    const stamp = this.clock.now();
    const rows = this.flagRows(clip, model, ctx, frames, stored.turns, stored.maxGapFrames, stamp);
    await yieldToEventLoop();
    await this.uow.transaction(async (manager) => {
      await this.uow.of(manager).flags.replace(clip.id, model, rows);
      await record(manager);
    });
    return frames.length;
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

  checkFrameRange(
    clip: Clip,
    frames: {
      frameIndex: number;
      path: (string | number)[];
      timeMs?: number;
      timePath?: (string | number)[];
    }[],
  ): void {
    const count = clip.frameCount;
    // A frame's time may run one frame past the container's duration (rounding at the end), not more.
    const lastMs = clip.durationMs === null ? null : clip.durationMs + (clip.fps ? 1000 / clip.fps : 0);
    const issues = [
      ...frames
        .filter((f) => count !== null && f.frameIndex >= count)
        .map((f) => ({
          path: f.path,
          code: 'too_big',
          message: `frame ${f.frameIndex} is past the clip's last frame (${(count ?? 0) - 1})`,
        })),
      ...frames
        .filter((f) => lastMs !== null && f.timeMs !== undefined && f.timeMs > lastMs)
        .map((f) => ({
          path: f.timePath ?? ['timeMs'],
          code: 'too_big',
          message: `${f.timeMs} ms is past the clip's end (${clip.durationMs} ms)`,
        })),
    ];
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

  private measureContext(manager: EntityManager, clip: Clip): Promise<ClipMeasureContext> {
    return loadMeasureContext(this.uow.of(manager), this.bands, clip, manager);
  }

  /** Flags of these frames and turns against the clip's bands, stored in place of the old ones. */
  private async storeFlags(
    manager: EntityManager,
    clip: Clip,
    model: PoseModelName,
    ctx: ClipMeasureContext,
    frames: readonly { frameIndex: number; metrics: Record<string, number | null> }[],
    turns: readonly TurnWindow[],
    maxGapFrames: number,
  ): Promise<void> {
    const stamp = this.clock.now();
    await this.uow
      .of(manager)
      .flags.replace(clip.id, model, this.flagRows(clip, model, ctx, frames, turns, maxGapFrames, stamp));
  }

  /** The flag rows of these frames and turns against the clip's bands (shared groupFlags). */
  private flagRows(
    clip: Clip,
    model: PoseModelName,
    ctx: ClipMeasureContext,
    frames: readonly { frameIndex: number; metrics: Record<string, number | null> }[],
    turns: readonly TurnWindow[],
    maxGapFrames: number,
    now: Date,
  ): Flag[] {
    const groups = groupFlags(
      frames,
      turns,
      ctx.bands.map((b) => b.band),
      { maxGapFrames },
    );
    return groups.map((g) => this.flagRow(clip, model, ctx, g, now));
  }

  private flagRow(
    clip: Clip,
    model: PoseModelName,
    ctx: ClipMeasureContext,
    group: FlagGroup,
    now: Date,
  ): Flag {
    const band = ctx.bands.find((b) => b.band.metric === group.metric);
    return {
      id: randomUUID(),
      clipId: clip.id,
      model,
      metric: group.metric,
      groupKey: group.groupKey,
      turnIndex: group.turnIndex,
      firstFrame: group.firstFrame,
      lastFrame: group.lastFrame,
      frameCount: group.frameCount,
      frameIndex: group.worstFrame,
      value: group.value,
      bandMin: group.min,
      bandMax: group.max,
      toleranceBandId: band?.row.id ?? null,
      bandVersion: band?.row.version ?? 1,
      distance: group.distance,
      severity: group.side === 'below' ? 'low' : 'high',
      athleteId: ctx.athleteId,
      ageGroupId: ctx.ageGroupId,
      status: 'unreviewed',
      statusComment: null,
      statusById: null,
      statusAt: null,
      createdAt: now,
      updatedAt: now,
    };
  }

  /** Series over the stored frames (turns, transitions, summary), cached, with the per-turn flags stored. */
  private async refreshSeries(
    manager: EntityManager,
    clip: Clip,
    model: PoseModelName,
    ctx: ClipMeasureContext,
    frames: FrameResult[],
  ): Promise<ClipSeriesDto | null> {
    return this.persistSeries(manager, clip, model, ctx, frames, await this.computeSeries(clip, ctx, frames));
  }

  /** The series of these frames, computed in the series worker (smoothing and turns take a while). */
  private async computeSeries(
    clip: Clip,
    ctx: ClipMeasureContext,
    frames: FrameResult[],
    withFrames = false,
  ): Promise<SeriesResult | null> {
    const fps = clip.fps && clip.fps > 0 ? clip.fps : estimateFrameRate(frames);
    if (frames.length === 0 || !fps) return null;
    return this.series.analyze(
      frames.map((f) => {
        const own = ctx.frameLines.get(f.frameIndex);
        const keypoints = own ? alignToLine(f.keypoints, own, ctx.referenceLine) : f.keypoints;
        return { frameIndex: f.frameIndex, timeMs: f.timeMs, keypoints };
      }),
      { view: ctx.view, referenceLine: ctx.referenceLine, fps },
      withFrames,
    );
  }

  /** Stores the turns of a computed series and the flags they group, and remembers the series. */
  private async persistSeries(
    manager: EntityManager,
    clip: Clip,
    model: PoseModelName,
    ctx: ClipMeasureContext,
    frames: FrameResult[],
    result: SeriesResult | null,
  ): Promise<ClipSeriesDto | null> {
    const turns: TurnWindow[] = (result?.turns ?? []).map(turnWindow);
    const fps = clip.fps && clip.fps > 0 ? clip.fps : (estimateFrameRate(frames) ?? 25);
    const maxGapFrames = stretchGapFrames(frames, fps);
    await this.uow.of(manager).clipTurns.save({
      id: randomUUID(),
      clipId: clip.id,
      model,
      turns,
      maxGapFrames,
      updatedAt: this.clock.now(),
    });
    await this.storeFlags(manager, clip, model, ctx, frames, turns, maxGapFrames);
    const series: ClipSeriesDto | null = result
      ? {
          turns: result.turns,
          transitions: result.transitions,
          summary: result.summary,
          filter: result.filter,
        }
      : null;
    this.seriesCache.remember(clip.id, model, SeriesCache.stampOf(clip, frames, ctx), series);
    return series;
  }

  /** Drops every cached series of a clip (an erased clip). */
  forgetClip(clipId: string): void {
    for (const model of POSE_MODELS) this.seriesCache.forget(clipId, model);
  }

  private forget(clipId: string, model: PoseModelName): void {
    this.seriesCache.forget(clipId, model);
  }
}
