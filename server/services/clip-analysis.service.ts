import { randomUUID } from 'node:crypto';
import type { PoseModelName } from '@shared/keypoints';
import type {
  ClipResponse,
  ServerAnalysisRequest,
  ServerAnalysisResponse,
  UpdateClipInput,
} from '@shared/schemas/clip.schema';
import { toServerAnalysisDto } from '../mappers/clip.mapper';
import type {
  ClipFramesResponse,
  FrameBatchInput,
  FrameBatchResponse,
  FrameCorrectionInput,
  FrameResultResponse,
} from '@shared/schemas/frames.schema';
import type { Clip } from '../entities/clip.entity';
import { conflict, fieldError, forbidden } from '../errors';
import { queueClipAnalysis } from './job-queue';
import type { AccessService } from './access.service';
import type { AuditService } from './audit.service';
import type { ClipService } from './clip.service';
import type { FrameStore } from './frame-store';
import type { Clock, Principal } from './principal';
import type { UnitOfWork } from '../repositories/unit-of-work';

/** Access rules and audit around the FrameStore: who may read, post, correct and set up a clip. */
export class ClipAnalysisService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly access: AccessService,
    private readonly clips: ClipService,
    readonly frames: FrameStore,
    private readonly audit: AuditService,
    private readonly clock: Clock,
    /** Wakes the server's analysis queue after a clip was queued. */
    private readonly wakeAnalyses: () => void = () => undefined,
    /** How long a browser's frames hold the clip's queued server analysis (ANALYSIS_BROWSER_HOLD). */
    private readonly browserHoldMs = 60_000,
  ) {}

  /** The clip's newest server analysis (polled by the clip page while one is queued or running). */
  async serverAnalysis(principal: Principal, clipId: string): Promise<ServerAnalysisResponse> {
    const clip = await this.clips.findVisible(principal, clipId);
    const job = (await this.uow.repos.jobs.latestAnalyses([clip.id])).get(clip.id) ?? null;
    const stored = (await this.uow.repos.frames.analysisByClip([clip.id])).get(clip.id) ?? [];
    return {
      serverAnalysis: toServerAnalysisDto(job),
      clipStatus: clip.status,
      storedFrames: stored.find((a) => a.model === clip.defaultModel)?.frameCount ?? 0,
      frameCount: clip.frameCount,
    };
  }

  /**
   * Queues the clip for pose analysis on the server (in the background, the same detector code as the
   * browser), unless it is queued or running already; the clip's `serverAnalysis` reports progress.
   */
  async queueServerAnalysis(
    principal: Principal,
    clipId: string,
    input: ServerAnalysisRequest,
  ): Promise<ClipResponse> {
    const clip = await this.findManageable(principal, clipId);
    if (input.holdForBrowser && clip.status !== 'failed') {
      // The browser analyses the clip from the uploaded file; the server waits while frames arrive.
      const until = new Date(this.clock.now().getTime() + this.browserHoldMs);
      await this.uow.transaction(async (manager) => {
        const held = await this.uow.of(manager).jobs.holdQueuedAnalysis(clip.id, until);
        const running = (await this.uow.of(manager).jobs.latestAnalyses([clip.id])).get(clip.id);
        if (!held && running?.status !== 'running')
          await queueClipAnalysis(this.uow, manager, {
            clip,
            model: input.model ?? clip.defaultModel,
            createdById: principal.user.id,
            now: this.clock.now(),
            notBefore: until,
          });
      });
      this.wakeAnalyses();
      return this.clips.get(principal, clip.id);
    }
    if (clip.status !== 'ready')
      throw conflict(
        'CLIP_NOT_READY',
        clip.status === 'failed'
          ? 'This clip could not be processed, so it cannot be analysed; upload it again'
          : 'This clip is still being prepared; it can be analysed once it is ready',
      );
    await this.uow.transaction(async (manager) => {
      // Asked for now: a hold a browser put on the queued job ends.
      await this.uow.of(manager).jobs.holdQueuedAnalysis(clip.id, this.clock.now());
      const job = await queueClipAnalysis(this.uow, manager, {
        clip,
        model: input.model ?? clip.defaultModel,
        createdById: principal.user.id,
        now: this.clock.now(),
        fromStart: input.fromStart,
        careful: input.careful,
      });
      await this.audit.record(manager, {
        clubId: clip.clubId,
        actorUserId: principal.user.id,
        action: 'clip.server_analysis',
        targetType: 'clip',
        targetId: clip.id,
        details: { model: job.payload.model, job: job.id },
      });
    });
    this.wakeAnalyses();
    return this.clips.get(principal, clip.id);
  }

  /** The clip, if the caller may change its analysis: head coach, or a coach of a tagged athlete's group. */
  async findManageable(principal: Principal, clipId: string): Promise<Clip> {
    const clip = await this.clips.findVisible(principal, clipId);
    if (principal.role === 'head_coach') return clip;
    const repos = this.uow.repos;
    const tagged = (await repos.clips.athleteIdsByClip([clip.id])).get(clip.id) ?? [];
    const athletes = await repos.athletes.findByIds(tagged);
    if (!athletes.some((a) => this.access.canManageAthlete(principal, a))) {
      throw forbidden('Only coaches of the athlete’s age group can change this clip’s analysis');
    }
    return clip;
  }

  async ingest(principal: Principal, clipId: string, batch: FrameBatchInput): Promise<FrameBatchResponse> {
    const clip = await this.findManageable(principal, clipId);
    const stored = await this.frames.storeBatch(clip, batch);
    // A browser is analysing this clip: a queued server analysis waits until it stops posting.
    await this.uow.repos.jobs.holdQueuedAnalysis(
      clip.id,
      new Date(this.clock.now().getTime() + this.browserHoldMs),
    );
    return stored;
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
    await this.uow.transaction(async (manager) => {
      const repos = this.uow.of(manager);
      const lines = repos.referenceLines;
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
      if (input.facing !== undefined && input.facing !== clip.facing) patch.facing = input.facing;
      if (input.athletePick !== undefined) {
        // The point must lie in the frame it names (the clip's own pixels and frames).
        if (input.athletePick) {
          this.frames.checkFrameRange(clip, [
            { frameIndex: input.athletePick.frameIndex, path: ['athletePick', 'frameIndex'] },
          ]);
          if (
            (clip.width !== null && input.athletePick.x > clip.width) ||
            (clip.height !== null && input.athletePick.y > clip.height)
          )
            throw fieldError(
              'athletePick',
              `The point must be inside the ${clip.width}×${clip.height} frame`,
            );
        }
        patch.athletePick = input.athletePick;
      }
      if (input.defaultModel !== undefined) patch.defaultModel = input.defaultModel;
      if (Object.keys(patch).length > 0) await repos.clipMedia.update(clip.id, patch);
      if (input.referenceLine !== undefined) {
        await lines.setForClip(clip.id, input.referenceLine, {
          id: randomUUID(),
          userId: principal.user.id,
          at: now,
        });
      }
      const updated: Clip = { ...clip, ...patch };
      const line = input.referenceLine !== undefined ? input.referenceLine : before.line;
      // The stored points are the skier's own sides: a new facing swaps them, then everything is measured again.
      const swapSides = patch.facing !== undefined;
      const measuresChanged =
        swapSides ||
        updated.view !== before.view ||
        JSON.stringify(line) !== JSON.stringify(before.line) ||
        input.frameReferenceLines !== undefined;
      if (measuresChanged) await this.frames.recomputeClip(manager, updated, now, { swapSides });
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
