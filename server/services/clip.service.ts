import { randomUUID } from 'node:crypto';
import fs from 'node:fs/promises';
import {
  uploadClipFieldsSchema,
  type ClipDto,
  type ClipListResponse,
  type ClipResponse,
} from '@shared/schemas/clip.schema';
import type { Athlete } from '../entities/athlete.entity';
import type { Clip } from '../entities/clip.entity';
import { HttpError, badRequest, conflict, notFound } from '../errors';
import { toClipDto } from '../mappers/clip.mapper';
import { oversizeReason, probeVideo } from '../media/probe';
import { ACCEPTED_CONTAINER_LABEL, sniffVideoContainer } from '../media/sniff';
import type { ObjectStorage } from '../storage/object-storage';
import type { AccessService } from './access.service';
import type { AuditService } from './audit.service';
import { mayStoreClipsOf } from './consent.rules';
import type { Clock, Principal } from './principal';
import type { SessionService } from './session.service';
import type { TokenService } from './token.service';
import type { UnitOfWork } from '../repositories/unit-of-work';

/** A file multer has streamed to the temp folder, hashed on the way. */
export interface StagedUpload {
  path: string;
  size: number;
  sha256: string;
  originalName: string;
}

export interface MediaTarget {
  clip: Clip;
  key: string;
  contentType: string;
  sizeBytes: number;
}

/** The playable copy when one was made (else the original), or the original as uploaded. */
export type MediaVariant = 'playable' | 'original';

/** Where uploads go to be probed, transcoded when needed and given a poster and thumbnails. */
export interface MediaPipeline {
  enqueue(clipId: string): void;
}

export class ClipService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly access: AccessService,
    private readonly sessions: SessionService,
    private readonly storage: ObjectStorage,
    private readonly tokens: TokenService,
    private readonly audit: AuditService,
    private readonly clock: Clock,
    private readonly media: MediaPipeline,
  ) {}

  async list(
    principal: Principal,
    query: { athleteId?: string; sessionId?: string },
  ): Promise<ClipListResponse> {
    const visible = await this.access.visibleAthleteIds(principal);
    const listed = await this.uow.repos.clips.list({
      clubId: principal.clubId,
      visibleAthleteIds: visible,
      athleteId: query.athleteId,
      sessionId: query.sessionId,
    });
    // Athletes and guardians reach clips through published reviews only; withdrawn consent hides clips.
    const clips = (await this.access.clipReach(principal)).filter(listed);
    return { clips: await this.toDtos(principal, clips, visible) };
  }

  async findVisible(principal: Principal, clipId: string): Promise<Clip> {
    const repo = this.uow.repos.clips;
    const clip = await repo.findById(clipId);
    if (!clip || clip.clubId !== principal.clubId) throw notFound('Clip');
    const visible = await this.access.visibleAthleteIds(principal);
    if (visible) {
      const tagged = (await repo.athleteIdsByClip([clip.id])).get(clip.id) ?? [];
      if (!tagged.some((id) => visible.includes(id))) throw notFound('Clip');
    }
    if (!(await this.access.clipReach(principal)).allows(clip.id)) throw notFound('Clip');
    return clip;
  }

  async get(principal: Principal, clipId: string): Promise<ClipResponse> {
    const clip = await this.findVisible(principal, clipId);
    const [dto] = await this.toDtos(principal, [clip], await this.access.visibleAthleteIds(principal));
    return { clip: dto };
  }

  async mediaTarget(
    principal: Principal,
    clipId: string,
    variant: MediaVariant = 'playable',
  ): Promise<MediaTarget> {
    const clip = await this.findVisible(principal, clipId);
    if (variant === 'playable' && clip.proxyKey && clip.proxySizeBytes !== null) {
      return { clip, key: clip.proxyKey, contentType: 'video/mp4', sizeBytes: clip.proxySizeBytes };
    }
    return { clip, key: clip.storageKey, contentType: clip.mimeType, sizeBytes: clip.sizeBytes };
  }

  private async toDtos(principal: Principal, clips: Clip[], visible: string[] | null): Promise<ClipDto[]> {
    const manager = this.uow.repos.manager;
    const tags = await this.uow.of(manager).clips.athleteIdsByClip(clips.map((c) => c.id));
    // Teammates tagged in the same clip stay hidden from athletes and guardians.
    const shown = (ids: string[]) => (visible ? ids.filter((id) => visible.includes(id)) : ids);
    const allIds = [...new Set([...tags.values()].flatMap(shown))];
    const athletes = new Map((await this.uow.of(manager).athletes.findByIds(allIds)).map((a) => [a.id, a]));
    // The clip's bands follow its first tagged athlete, whether or not the caller sees that athlete.
    const firstIds = [...new Set(clips.map((c) => tags.get(c.id)?.[0]).filter((id): id is string => !!id))];
    const firsts = new Map((await this.uow.of(manager).athletes.findByIds(firstIds)).map((a) => [a.id, a]));
    const groups = new Map(
      (await this.uow.of(manager).club.listAgeGroups(principal.clubId)).map((g) => [g.id, g]),
    );
    const ids = clips.map((c) => c.id);
    const lines = await this.uow.of(manager).referenceLines.forClips(ids);
    const frameLines = await this.uow.of(manager).referenceLines.framesForClips(ids);
    const analyses = await this.uow.of(manager).frames.analysisByClip(ids);
    const serverJobs = await this.uow.of(manager).jobs.latestAnalyses(ids);
    return clips.map((clip) => {
      const tagged = shown(tags.get(clip.id) ?? [])
        .map((id) => athletes.get(id))
        .filter((a): a is Athlete => Boolean(a));
      const first = firsts.get(tags.get(clip.id)?.[0] ?? '');
      const group = first ? groups.get(first.ageGroupId) : undefined;
      return toClipDto(clip, tagged, this.tokens.clipLinks(principal, clip.id), {
        referenceLine: lines.get(clip.id) ?? null,
        frameReferenceLines: frameLines.get(clip.id) ?? [],
        ageGroup: group ? { id: group.id, name: group.name } : null,
        analyses: analyses.get(clip.id) ?? [],
        serverJob: serverJobs.get(clip.id) ?? null,
      });
    });
  }

  /**
   * Checks, stores and records one uploaded clip. Whatever fails, the temp file is removed and
   * neither an object nor a row is left behind.
   */
  async upload(
    principal: Principal,
    rawFields: unknown,
    file: StagedUpload | undefined,
  ): Promise<ClipResponse> {
    let storedKey: string | null = null;
    try {
      if (!file) throw badRequest('file_missing', 'Attach a video file in the field "file"');
      const { fields, session, athleteIds } = await this.precheck(principal, rawFields);

      if (file.size === 0)
        throw badRequest('empty_file', `The file “${file.originalName}” is empty (0 bytes)`);
      const sniff = await sniffVideoContainer(file.path);
      if (!sniff.ok) {
        const seen = sniff.detected
          ? `it looks like ${sniff.detected}`
          : 'its content is not a known video format';
        throw new HttpError(
          415,
          'unsupported_type',
          `“${file.originalName}” is not a video: ${seen}. Upload ${ACCEPTED_CONTAINER_LABEL} files.`,
        );
      }
      const probe = await probeVideo(file.path).catch(() => null);
      if (!probe) {
        throw new HttpError(
          422,
          'unreadable_video',
          `“${file.originalName}” could not be read as video; the file may be damaged or incomplete`,
        );
      }
      const oversize = oversizeReason(probe, file.originalName);
      if (oversize) throw new HttpError(422, 'video_too_large', oversize);

      const id = randomUUID();
      const key = `clubs/${principal.clubId}/clips/${id}/original.${sniff.ext}`;
      storedKey = key;
      await this.storage.putFile(key, file.path, sniff.mime).catch((error: Error) => {
        throw new HttpError(
          503,
          'storage_unavailable',
          'Clip storage cannot be reached; the upload was not kept. Try again.',
          undefined,
          { cause: error },
        );
      });

      const clip: Clip = {
        id,
        clubId: principal.clubId,
        sessionId: session.id,
        uploadedById: principal.user.id,
        view: fields.view,
        facing: fields.facing ?? 'toward',
        athletePick: null,
        // The header probe above answers at once; the media pipeline then makes the playable copy,
        // poster and thumbnails and moves the clip to ready (or failed, with the reason).
        status: 'uploaded',
        failureReason: null,
        originalName: file.originalName.slice(0, 255),
        mimeType: sniff.mime,
        sizeBytes: file.size,
        sha256: file.sha256,
        storageKey: key,
        proxyKey: null,
        proxySizeBytes: null,
        posterKey: null,
        thumbnailsKey: null,
        thumbnails: null,
        rotation: probe.rotation,
        defaultModel: 'lightning',
        codec: probe.codec,
        width: probe.width,
        height: probe.height,
        fps: probe.fps,
        frameCount: probe.frameCount,
        durationMs: probe.durationMs,
        processingStarts: 0,
        createdAt: this.clock.now(),
      };
      await this.uow.transaction(async (manager) => {
        await this.uow.of(manager).clips.insert(clip, athleteIds);
        await this.audit.record(manager, {
          clubId: principal.clubId,
          actorUserId: principal.user.id,
          action: 'clip.upload',
          targetType: 'clip',
          targetId: clip.id,
          details: { sessionId: session.id, athleteIds, sizeBytes: file.size, sha256: file.sha256 },
        });
      });
      storedKey = null;
      this.media.enqueue(clip.id);
      const [dto] = await this.toDtos(principal, [clip], await this.access.visibleAthleteIds(principal));
      return { clip: dto };
    } catch (error) {
      if (storedKey) await this.storage.delete(storedKey).catch(() => undefined);
      throw error;
    } finally {
      if (file) await fs.rm(file.path, { force: true });
    }
  }

  /**
   * The checks that need only the form fields: the session, the tagged athletes and their consent.
   * Run again when the file has arrived, and early (before the file streams) when fields come first.
   */
  async precheck(principal: Principal, rawFields: unknown) {
    const fields = uploadClipFieldsSchema.parse(rawFields);
    const session = await this.sessions.findVisible(principal, fields.sessionId);
    const athleteIds = [...new Set(fields.athleteIds)];
    await this.taggableAthletes(principal, athleteIds);
    return { fields, session, athleteIds };
  }

  private async taggableAthletes(principal: Principal, athleteIds: string[]): Promise<Athlete[]> {
    const found = await this.uow.repos.athletes.findByIds(athleteIds);
    const byId = new Map(found.map((a) => [a.id, a]));
    const now = this.clock.now();
    const athletes: Athlete[] = [];
    for (const id of athleteIds) {
      const athlete = byId.get(id);
      if (!athlete || !this.access.canSeeAthlete(principal, athlete)) throw notFound('Athlete');
      if (!this.access.canManageAthlete(principal, athlete)) {
        throw new HttpError(
          403,
          'forbidden',
          'You can only upload clips of athletes in the age groups you coach',
        );
      }
      athletes.push(athlete);
    }
    const withoutConsent = athletes.filter((a) => !mayStoreClipsOf(a, now));
    if (withoutConsent.length > 0) {
      const names = withoutConsent.map((a) => `${a.firstName} ${a.lastName}`).join(', ');
      throw conflict(
        'consent_required',
        `Record a guardian’s consent for ${names} first: clips of athletes under 18 are stored only with recorded consent`,
        { athleteIds: withoutConsent.map((a) => a.id) },
      );
    }
    return athletes;
  }
}
