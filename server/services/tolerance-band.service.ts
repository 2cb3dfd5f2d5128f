import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { View } from '@shared/keypoints';
import type {
  JobDto,
  ToleranceBandChangeDto,
  ToleranceBandChangeResponse,
  ToleranceBandDto,
  ToleranceBandInput,
  ToleranceBandListResponse,
} from '@shared/schemas/tolerance.schema';
import {
  AGE_GROUPS,
  BAND_METRICS,
  DEFAULT_BANDS,
  defaultBandFor,
  outsideMeaning,
  type BandMetricKey,
  type ToleranceBand as SharedBand,
} from '@shared/tolerance';
import type { AgeGroup } from '../entities/age-group.entity';
import { ClubEntity } from '../entities/club.entity';
import type { ToleranceBand } from '../entities/tolerance-band.entity';
import type { BandValues } from '../entities/tolerance-band-change.entity';
import { forbidden, notFound } from '../errors';
import { AccessService } from './access.service';
import type { Clock, Principal } from './principal';
import type { UnitOfWork } from '../repositories/unit-of-work';
import { queueFlagReevaluation, toJobDto } from './job-queue';

/** The view a band's metric is measured in; per-turn values come from front-view turns. */
export function bandView(metric: BandMetricKey): View | 'both' {
  return BAND_METRICS[metric].view;
}

/**
 * The seeded rule-of-thumb set for a club's age group: by name when it is one of the usual
 * groups, else by its upper age ("U" + (maxAge + 1)), else the adult set.
 */
export function defaultSetFor(group: Pick<AgeGroup, 'name' | 'maxAge'>): string {
  const known = (name: string) => (AGE_GROUPS as readonly string[]).includes(name);
  if (known(group.name)) return group.name;
  const byAge = `U${group.maxAge + 1}`;
  return known(byAge) ? byAge : 'Masters';
}

export function toSharedBand(row: ToleranceBand, ageGroupName: string): SharedBand {
  return {
    metric: row.metric as BandMetricKey,
    ageGroup: ageGroupName,
    min: row.min,
    max: row.max,
    target: row.target,
    source: row.source,
  };
}

function toDto(row: ToleranceBand, ageGroupName: string, names: Map<string, string>): ToleranceBandDto {
  return {
    ...toSharedBand(row, ageGroupName),
    id: row.id,
    ageGroupId: row.ageGroupId,
    view: row.view,
    version: row.version,
    meaning: outsideMeaning(row.metric as BandMetricKey, row.min, row.max),
    updatedAt: row.updatedAt.toISOString(),
    updatedBy: row.updatedById ? (names.get(row.updatedById) ?? null) : null,
  };
}

const valuesOf = (row: ToleranceBand): BandValues => ({
  min: row.min,
  max: row.max,
  target: row.target,
  source: row.source,
});

/** The band service for work outside a request (start, seed, jobs): it queues no job of its own. */
export function bandService(uow: UnitOfWork, clock: Clock): ToleranceBandService {
  return new ToleranceBandService(uow, clock, new AccessService(uow));
}

/**
 * Tolerance bands per age group: the seeded common-practice set, coaches' changes with every version
 * kept, and the background re-evaluation each change queues. `onJobQueued` wakes the job runner.
 */
export class ToleranceBandService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly clock: Clock,
    private readonly access: AccessService,
    private readonly onJobQueued: () => void = () => undefined,
  ) {}

  async list(principal: Principal, query: { ageGroupId?: string }): Promise<ToleranceBandListResponse> {
    const repos = this.uow.repos;
    const groups = new Map((await repos.club.listAgeGroups(principal.clubId)).map((g) => [g.id, g]));
    if (query.ageGroupId && !groups.has(query.ageGroupId)) throw notFound('Age group');
    const rows = await repos.toleranceBands.list({ clubId: principal.clubId, ageGroupId: query.ageGroupId });
    const names = await repos.users.namesByIds(rows.flatMap((r) => (r.updatedById ? [r.updatedById] : [])));
    const job = await repos.jobs.latestForClub(principal.clubId);
    return {
      bands: rows.map((row) => toDto(row, groups.get(row.ageGroupId)?.name ?? '', names)),
      editableAgeGroupIds: [...groups.keys()].filter((id) => this.mayEdit(principal, id)),
      job: job ? toJobDto(job) : null,
    };
  }

  /** A coach sets the bands of the groups they coach; the head coach those of every group. */
  private mayEdit(principal: Principal, ageGroupId: string): boolean {
    return this.access.canManageAgeGroup(principal, ageGroupId);
  }

  private async editableGroup(principal: Principal, ageGroupId: string): Promise<AgeGroup> {
    const group = await this.uow.repos.club.findAgeGroup(ageGroupId);
    if (!group || group.clubId !== principal.clubId) throw notFound('Age group');
    if (!this.mayEdit(principal, ageGroupId))
      throw forbidden(`Only the head coach and the coaches of ${group.name} can change its bands`);
    return group;
  }

  /** Sets a band's limits (a coach's own: source "club") and queues the re-evaluation of its group. */
  update(
    principal: Principal,
    ageGroupId: string,
    metric: BandMetricKey,
    input: ToleranceBandInput,
  ): Promise<ToleranceBandChangeResponse> {
    return this.change(principal, ageGroupId, metric, 'edit', () => ({ ...input, source: 'club' }));
  }

  /** Puts back the seeded common-practice band (no limits for a metric with none seeded). */
  reset(
    principal: Principal,
    ageGroupId: string,
    metric: BandMetricKey,
  ): Promise<ToleranceBandChangeResponse> {
    return this.change(principal, ageGroupId, metric, 'reset', (group) => {
      const seeded = defaultBandFor(defaultSetFor(group), metric);
      return {
        min: seeded?.min ?? null,
        max: seeded?.max ?? null,
        target: seeded?.target ?? null,
        source: 'common practice',
      };
    });
  }

  private async change(
    principal: Principal,
    ageGroupId: string,
    metric: BandMetricKey,
    action: 'edit' | 'reset',
    next: (group: AgeGroup) => BandValues,
  ): Promise<ToleranceBandChangeResponse> {
    const group = await this.editableGroup(principal, ageGroupId);
    const now = this.clock.now();
    const result = await this.uow.transaction(async (manager) => {
      const repo = this.uow.of(manager).toleranceBands;
      const prior = await repo.findOne(ageGroupId, metric);
      const after = next(group);
      const row: ToleranceBand = {
        id: prior?.id ?? randomUUID(),
        clubId: principal.clubId,
        ageGroupId,
        metric,
        view: bandView(metric),
        ...after,
        version: (prior?.version ?? 0) + 1,
        updatedById: principal.user.id,
        updatedAt: now,
      };
      await repo.save(row);
      await repo.addChange({
        id: randomUUID(),
        clubId: principal.clubId,
        ageGroupId,
        metric,
        version: row.version,
        action,
        before: prior ? valuesOf(prior) : null,
        after,
        changedById: principal.user.id,
        changedAt: now,
      });
      const job = await queueFlagReevaluation(this.uow, manager, {
        clubId: principal.clubId,
        ageGroupIds: [ageGroupId],
        label: `${group.name} ${BAND_METRICS[metric].label.toLowerCase()} ${action === 'reset' ? 'reset' : 'changed'}`,
        createdById: principal.user.id,
        now,
      });
      return { row, job };
    });
    this.onJobQueued();
    return {
      band: toDto(result.row, group.name, new Map([[principal.user.id, principal.user.name]])),
      job: toJobDto(result.job),
    };
  }

  async history(
    principal: Principal,
    query: { ageGroupId?: string; limit: number },
  ): Promise<{ changes: ToleranceBandChangeDto[] }> {
    const repos = this.uow.repos;
    const groups = new Map((await repos.club.listAgeGroups(principal.clubId)).map((g) => [g.id, g]));
    if (query.ageGroupId && !groups.has(query.ageGroupId)) throw notFound('Age group');
    const rows = await repos.toleranceBands.changes({ clubId: principal.clubId, ...query });
    const names = await repos.users.namesByIds(rows.flatMap((r) => (r.changedById ? [r.changedById] : [])));
    return {
      changes: rows.map((r) => ({
        id: r.id,
        ageGroupId: r.ageGroupId,
        ageGroupName: groups.get(r.ageGroupId)?.name ?? '',
        metric: r.metric as BandMetricKey,
        version: r.version,
        action: r.action,
        before: r.before,
        after: r.after,
        changedBy: r.changedById ? (names.get(r.changedById) ?? null) : null,
        changedAt: r.changedAt.toISOString(),
      })),
    };
  }

  async job(principal: Principal, jobId: string): Promise<JobDto> {
    const job = await this.uow.repos.jobs.findById(jobId);
    // Clip analyses are reported on their clip, where the clip's access rules apply.
    if (!job || job.kind !== 'flag-reevaluation' || job.clubId !== principal.clubId) throw notFound('Job');
    return toJobDto(job);
  }

  /** The stored bands of one age group, as the shared evaluator takes them, with their row ids. */
  async forAgeGroup(
    manager: EntityManager,
    clubId: string,
    ageGroupId: string,
  ): Promise<{ band: SharedBand; row: ToleranceBand }[]> {
    const group = await this.uow.of(manager).club.findAgeGroup(ageGroupId);
    if (!group) return [];
    const rows = await this.uow.of(manager).toleranceBands.list({ clubId, ageGroupId });
    return rows.map((row) => ({ band: toSharedBand(row, group.name), row }));
  }

  /** ensureDefaults for every club, at start: databases from before bands were seeded get theirs. */
  async ensureDefaultsForAllClubs(): Promise<number> {
    return this.uow.transaction(async (manager) => {
      let added = 0;
      for (const club of await manager.find(ClubEntity)) added += await this.ensureDefaults(manager, club.id);
      return added;
    });
  }

  /**
   * Seeds the "common practice" bands for every age group of the club that lacks them. Idempotent:
   * a band a coach already has (or edited, or reset) is left alone.
   */
  async ensureDefaults(manager: EntityManager, clubId: string): Promise<number> {
    const now = this.clock.now();
    const groups = await this.uow.of(manager).club.listAgeGroups(clubId);
    const repo = this.uow.of(manager).toleranceBands;
    const existing = new Set((await repo.list({ clubId })).map((b) => `${b.ageGroupId}|${b.metric}`));
    const rows: ToleranceBand[] = [];
    for (const group of groups) {
      const set = defaultSetFor(group);
      for (const band of DEFAULT_BANDS.filter((b) => b.ageGroup === set)) {
        if (existing.has(`${group.id}|${band.metric}`)) continue;
        rows.push({
          id: randomUUID(),
          clubId,
          ageGroupId: group.id,
          metric: band.metric,
          view: bandView(band.metric),
          min: band.min,
          max: band.max,
          target: band.target,
          source: band.source,
          version: 1,
          updatedById: null,
          updatedAt: now,
        });
      }
    }
    await repo.insertMany(rows);
    return rows.length;
  }
}
