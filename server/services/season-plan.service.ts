import { randomUUID } from 'node:crypto';
import type { PoseModelName } from '@shared/keypoints';
import { clipPhaseValue, type FocusPhase, type StoredFrameValues } from '@shared/plan';
import type {
  FocusPointDto,
  FocusPointInput,
  FocusProgressDto,
  SeasonClipDto,
  SeasonDto,
  SeasonInput,
  SeasonPlanResponse,
} from '@shared/schemas/plan.schema';
import type { BandMetricKey, TurnWindow } from '@shared/tolerance';
import type { Athlete } from '../entities/athlete.entity';
import type { Clip } from '../entities/clip.entity';
import type { FocusPoint } from '../entities/focus-point.entity';
import type { Season } from '../entities/season.entity';
import { badRequest, conflict, forbidden, notFound } from '../errors';
import type { UnitOfWork } from '../repositories/unit-of-work';
import type { AccessService } from './access.service';
import type { AuditService } from './audit.service';
import type { FrameStore } from './frame-store';
import type { Clock, Principal } from './principal';

const toSeasonDto = (s: Season): SeasonDto => ({
  id: s.id,
  name: s.name,
  startsOn: s.startsOn,
  endsOn: s.endsOn,
});

export const toFocusPointDto = (p: FocusPoint): FocusPointDto => ({
  id: p.id,
  athleteId: p.athleteId,
  seasonId: p.seasonId,
  rank: p.rank,
  title: p.title,
  cue: p.cue,
  metric: p.metric,
  phase: p.phase,
  targetMin: p.targetMin,
  targetMax: p.targetMax,
  direction: p.direction,
  status: p.status,
  updatedAt: p.updatedAt.toISOString(),
});

/** A calendar date in UTC, YYYY-MM-DD, to compare with season dates. */
const dayOf = (date: Date) => date.toISOString().slice(0, 10);

/** The season shown by default: the one holding today, else the latest that started, else the first. */
export function currentSeason(seasons: readonly Season[], today: string): Season | null {
  return (
    seasons.find((s) => s.startsOn <= today && today <= s.endsOn) ??
    [...seasons].reverse().find((s) => s.startsOn <= today) ??
    seasons[0] ??
    null
  );
}

interface SeasonClip {
  clip: Clip;
  sessionDate: string;
  model: PoseModelName | null;
}

/**
 * Seasons of a club and the season plan of each athlete: ranked focus points, one baseline clip, and
 * each metric-tied point's value per clip of the season (median over the clip's turns at its phase).
 */
export class SeasonPlanService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly access: AccessService,
    private readonly audit: AuditService,
    private readonly clock: Clock,
    private readonly frames: Pick<FrameStore, 'seriesSettled'>,
  ) {}

  async listSeasons(principal: Principal): Promise<SeasonDto[]> {
    return (await this.uow.repos.plans.listSeasons(principal.clubId)).map(toSeasonDto);
  }

  async createSeason(principal: Principal, input: SeasonInput): Promise<SeasonDto> {
    if (principal.role !== 'head_coach') throw forbidden('Only the head coach adds seasons');
    const seasons = await this.uow.repos.plans.listSeasons(principal.clubId);
    if (seasons.some((s) => s.name.toLowerCase() === input.name.toLowerCase()))
      throw conflict('season_exists', `The club already has a season called ${input.name}`);
    const overlap = seasons.find((s) => s.startsOn <= input.endsOn && input.startsOn <= s.endsOn);
    if (overlap)
      throw conflict(
        'season_overlaps',
        `Those dates overlap season ${overlap.name} (${overlap.startsOn} to ${overlap.endsOn}); a clip must belong to one season`,
      );
    const season: Season = {
      id: randomUUID(),
      clubId: principal.clubId,
      ...input,
      retentionNoticeSentAt: null,
      createdAt: this.clock.now(),
    };
    await this.uow.transaction(async (manager) => {
      await this.uow.of(manager).plans.insertSeason(season);
      await this.audit.record(manager, {
        clubId: principal.clubId,
        actorUserId: principal.user.id,
        action: 'season.create',
        targetType: 'season',
        targetId: season.id,
        details: { name: season.name },
      });
    });
    return toSeasonDto(season);
  }

  async getPlan(principal: Principal, athleteId: string, seasonId?: string): Promise<SeasonPlanResponse> {
    const athlete = await this.visibleAthlete(principal, athleteId);
    const repos = this.uow.repos;
    const seasons = await repos.plans.listSeasons(principal.clubId);
    const season = seasonId
      ? seasons.find((s) => s.id === seasonId)
      : currentSeason(seasons, dayOf(this.clock.now()));
    if (seasonId && !season) throw notFound('Season');
    const canEdit = this.access.canManageAthlete(principal, athlete);
    if (!season) {
      return {
        seasons: [],
        season: null,
        focusPoints: [],
        baselineClipId: null,
        clips: [],
        progress: [],
        canEdit,
      };
    }
    const [points, baseline, seasonClips] = await Promise.all([
      repos.plans.listFocusPoints(athlete.id, season.id),
      repos.plans.findBaseline(athlete.id, season.id),
      this.clipsInSeason(principal, athlete.id, season),
    ]);
    const turnsByClip = new Map<string, TurnWindow[]>();
    for (const c of seasonClips) {
      if (!c.model) continue;
      // Turns of a clip whose last frames just arrived are still being found: wait for them.
      await this.frames.seriesSettled(c.clip.id, c.model);
      turnsByClip.set(c.clip.id, (await repos.clipTurns.find(c.clip.id, c.model))?.turns ?? []);
    }
    const clips: SeasonClipDto[] = seasonClips.map((c) => ({
      id: c.clip.id,
      originalName: c.clip.originalName,
      sessionDate: c.sessionDate,
      view: c.clip.view,
      status: c.clip.status,
      analysed: c.model !== null,
      turnCount: turnsByClip.get(c.clip.id)?.length ?? 0,
    }));
    const progress = await this.progress(points, seasonClips, turnsByClip, baseline?.clipId ?? null);
    return {
      seasons: seasons.map(toSeasonDto),
      season: toSeasonDto(season),
      focusPoints: points.map(toFocusPointDto),
      baselineClipId: baseline?.clipId ?? null,
      clips,
      progress,
      canEdit,
    };
  }

  async addFocusPoint(
    principal: Principal,
    athleteId: string,
    input: FocusPointInput,
  ): Promise<FocusPointDto> {
    const athlete = await this.managedAthlete(principal, athleteId);
    await this.seasonOfClub(principal, input.seasonId);
    const existing = await this.uow.repos.plans.listFocusPoints(athlete.id, input.seasonId);
    if (existing.length >= 20)
      throw conflict(
        'plan_full',
        'A season plan holds at most 20 focus points; mark some reached or remove them',
      );
    const now = this.clock.now();
    const point: FocusPoint = {
      id: randomUUID(),
      athleteId: athlete.id,
      ...this.fields(input),
      seasonId: input.seasonId,
      rank: existing.length === 0 ? 0 : Math.max(...existing.map((p) => p.rank)) + 1,
      createdById: principal.user.id,
      createdAt: now,
      updatedAt: now,
    };
    await this.uow.transaction(async (manager) => {
      await this.uow.of(manager).plans.insertFocusPoint(point);
      await this.record(manager, principal, 'focus_point.create', point.id, { title: point.title });
    });
    return toFocusPointDto(point);
  }

  async updateFocusPoint(principal: Principal, id: string, input: FocusPointInput): Promise<FocusPointDto> {
    const point = await this.managedFocusPoint(principal, id);
    if (input.seasonId !== point.seasonId)
      throw badRequest(
        'season_fixed',
        'A focus point stays in its season; add it to the other season instead',
      );
    const patch = { ...this.fields(input), updatedAt: this.clock.now() };
    await this.uow.transaction(async (manager) => {
      await this.uow.of(manager).plans.updateFocusPoint(id, patch);
      await this.record(manager, principal, 'focus_point.update', id, { status: patch.status });
    });
    return toFocusPointDto({ ...point, ...patch });
  }

  async deleteFocusPoint(principal: Principal, id: string): Promise<void> {
    const point = await this.managedFocusPoint(principal, id);
    await this.uow.transaction(async (manager) => {
      await this.uow.of(manager).plans.deleteFocusPoint(point.id);
      await this.record(manager, principal, 'focus_point.delete', point.id, { title: point.title });
    });
  }

  /** New order of a season's focus points: every point of the plan, each once. */
  async reorder(
    principal: Principal,
    athleteId: string,
    seasonId: string,
    ids: string[],
  ): Promise<FocusPointDto[]> {
    const athlete = await this.managedAthlete(principal, athleteId);
    await this.seasonOfClub(principal, seasonId);
    const points = await this.uow.repos.plans.listFocusPoints(athlete.id, seasonId);
    const known = new Set(points.map((p) => p.id));
    if (ids.length !== points.length || !ids.every((id) => known.has(id)))
      throw badRequest(
        'order_mismatch',
        'Send every focus point of this season plan once, in the new order (the plan may have changed; reload it)',
      );
    await this.uow.transaction(async (manager) => {
      await this.uow.of(manager).plans.setRanks(ids);
      await this.record(manager, principal, 'focus_point.reorder', athlete.id, { seasonId });
    });
    const byId = new Map(points.map((p) => [p.id, p]));
    return ids.map((id, rank) => toFocusPointDto({ ...byId.get(id)!, rank }));
  }

  /** Marks (or with null, clears) the athlete's baseline clip of a season. */
  async setBaseline(
    principal: Principal,
    athleteId: string,
    seasonId: string,
    clipId: string | null,
  ): Promise<{ baselineClipId: string | null }> {
    const athlete = await this.managedAthlete(principal, athleteId);
    const season = await this.seasonOfClub(principal, seasonId);
    if (clipId) {
      const inSeason = await this.clipsInSeason(principal, athlete.id, season);
      if (!inSeason.some((c) => c.clip.id === clipId))
        throw badRequest(
          'not_in_season',
          `That clip is not one of ${athlete.firstName}'s clips of season ${season.name}; choose a clip filmed between ${season.startsOn} and ${season.endsOn}`,
        );
    }
    await this.uow.transaction(async (manager) => {
      const plans = this.uow.of(manager).plans;
      if (clipId) {
        const existing = await plans.findBaseline(athlete.id, season.id);
        await plans.saveBaseline({
          id: existing?.id ?? randomUUID(),
          athleteId: athlete.id,
          seasonId: season.id,
          clipId,
          setById: principal.user.id,
          setAt: this.clock.now(),
        });
      } else await plans.clearBaseline(athlete.id, season.id);
      await this.record(manager, principal, 'baseline.set', athlete.id, { seasonId, clipId });
    });
    return { baselineClipId: clipId };
  }

  /** The athlete's clips whose session lies in the season, oldest first, with the model that has frames. */
  private async clipsInSeason(
    principal: Principal,
    athleteId: string,
    season: Season,
  ): Promise<SeasonClip[]> {
    const repos = this.uow.repos;
    const visible = await this.access.visibleAthleteIds(principal);
    const listed = await repos.clips.list({
      clubId: principal.clubId,
      visibleAthleteIds: visible,
      athleteId,
    });
    // Athletes and guardians see the clips reviews have shared with them.
    const clips = (await this.access.clipReach(principal)).filter(listed);
    const sessions = new Map(
      (await repos.sessions.findByIds(clips.map((c) => c.sessionId))).map((s) => [s.id, s]),
    );
    const stored = await repos.frames.framesPerClipModel(clips.map((c) => c.id));
    const out: SeasonClip[] = [];
    for (const clip of clips) {
      const date = sessions.get(clip.sessionId)?.date;
      if (!date || date < season.startsOn || date > season.endsOn) continue;
      const models = stored.filter((s) => s.clipId === clip.id && s.frames > 0);
      const model =
        models.find((m) => m.model === clip.defaultModel)?.model ??
        [...models].sort((a, b) => b.frames - a.frames)[0]?.model ??
        null;
      out.push({ clip, sessionDate: date, model });
    }
    return out.sort(
      (a, b) =>
        a.sessionDate.localeCompare(b.sessionDate) || a.clip.createdAt.getTime() - b.clip.createdAt.getTime(),
    );
  }

  private async progress(
    points: FocusPoint[],
    clips: SeasonClip[],
    turnsByClip: Map<string, TurnWindow[]>,
    baselineClipId: string | null,
  ): Promise<FocusProgressDto[]> {
    const tied = points.filter((p) => p.metric !== null && p.phase !== null);
    if (tied.length === 0) return [];
    const framesByClip = new Map<string, StoredFrameValues[]>();
    for (const c of clips) {
      if (c.model) framesByClip.set(c.clip.id, await this.uow.repos.frames.listMetrics(c.clip.id, c.model));
    }
    return tied.map((point) => ({
      focusPointId: point.id,
      points: clips.map((c) => {
        const base = {
          clipId: c.clip.id,
          clipName: c.clip.originalName,
          sessionDate: c.sessionDate,
          view: c.clip.view,
          baseline: c.clip.id === baselineClipId,
        };
        if (!c.model)
          return {
            ...base,
            median: null,
            min: null,
            max: null,
            count: 0,
            over: 'turns' as const,
            reason: 'Not analysed yet: open the clip and analyse the whole clip',
          };
        const value = clipPhaseValue(
          {
            view: c.clip.view,
            frames: framesByClip.get(c.clip.id) ?? [],
            turns: turnsByClip.get(c.clip.id) ?? [],
          },
          point.metric as BandMetricKey,
          point.phase as FocusPhase,
        );
        return { ...base, ...value };
      }),
    }));
  }

  private fields(input: FocusPointInput) {
    const metric = input.metric as BandMetricKey | null;
    return {
      title: input.title,
      cue: input.cue,
      metric,
      phase: metric ? input.phase : null,
      targetMin: metric ? input.targetMin : null,
      targetMax: metric ? input.targetMax : null,
      direction: metric ? input.direction : null,
      status: input.status,
    };
  }

  private async visibleAthlete(principal: Principal, athleteId: string): Promise<Athlete> {
    const athlete = await this.uow.repos.athletes.findById(athleteId);
    if (!athlete || !this.access.canSeeAthlete(principal, athlete)) throw notFound('Athlete');
    return athlete;
  }

  private async managedAthlete(principal: Principal, athleteId: string): Promise<Athlete> {
    const athlete = await this.visibleAthlete(principal, athleteId);
    if (!this.access.canManageAthlete(principal, athlete))
      throw forbidden('Only the head coach and the athlete’s coaches can change a season plan');
    return athlete;
  }

  private async managedFocusPoint(principal: Principal, id: string): Promise<FocusPoint> {
    const point = await this.uow.repos.plans.findFocusPoint(id);
    if (!point) throw notFound('Focus point');
    await this.managedAthlete(principal, point.athleteId).catch((error: unknown) => {
      // Someone who cannot see the athlete learns nothing about the point either.
      if (error instanceof Error && 'status' in error && error.status === 404) throw notFound('Focus point');
      throw error;
    });
    return point;
  }

  private async seasonOfClub(principal: Principal, seasonId: string): Promise<Season> {
    const season = await this.uow.repos.plans.findSeason(seasonId);
    if (!season || season.clubId !== principal.clubId) throw notFound('Season');
    return season;
  }

  private record(
    manager: Parameters<AuditService['record']>[0],
    principal: Principal,
    action: string,
    targetId: string,
    details: Record<string, unknown>,
  ) {
    return this.audit.record(manager, {
      clubId: principal.clubId,
      actorUserId: principal.user.id,
      action,
      targetType: action.split('.')[0],
      targetId,
      details,
    });
  }
}
