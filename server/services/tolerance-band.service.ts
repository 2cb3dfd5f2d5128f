import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { View } from '@shared/keypoints';
import { METRIC_DEFINITIONS, isMetricKey } from '@shared/metrics';
import type { ToleranceBandDto, ToleranceBandListResponse } from '@shared/schemas/tolerance.schema';
import {
  AGE_GROUPS,
  DEFAULT_BANDS,
  type BandMetricKey,
  type ToleranceBand as SharedBand,
} from '@shared/tolerance';
import type { AgeGroup } from '../entities/age-group.entity';
import { ClubEntity } from '../entities/club.entity';
import type { ToleranceBand } from '../entities/tolerance-band.entity';
import { notFound } from '../errors';
import type { Clock, Principal } from './principal';
import type { UnitOfWork } from '../repositories/unit-of-work';

/** The view a band's metric is measured in; transitionRise comes from front-view turns. */
export function bandView(metric: BandMetricKey): View | 'both' {
  if (!isMetricKey(metric)) return 'front';
  const views = METRIC_DEFINITIONS[metric].views;
  return views.length === 1 ? views[0] : 'both';
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

function toDto(row: ToleranceBand, ageGroupName: string): ToleranceBandDto {
  return {
    ...toSharedBand(row, ageGroupName),
    id: row.id,
    ageGroupId: row.ageGroupId,
    view: row.view,
    updatedAt: row.updatedAt.toISOString(),
  };
}

export class ToleranceBandService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly clock: Clock,
  ) {}

  async list(principal: Principal, query: { ageGroupId?: string }): Promise<ToleranceBandListResponse> {
    const clubs = this.uow.repos.club;
    const groups = new Map((await clubs.listAgeGroups(principal.clubId)).map((g) => [g.id, g]));
    if (query.ageGroupId && !groups.has(query.ageGroupId)) throw notFound('Age group');
    const rows = await this.uow.repos.toleranceBands.list({
      clubId: principal.clubId,
      ageGroupId: query.ageGroupId,
    });
    return { bands: rows.map((row) => toDto(row, groups.get(row.ageGroupId)?.name ?? '')) };
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
   * a band a head coach already has (or edited) is left alone.
   */
  async ensureDefaults(manager: EntityManager, clubId: string): Promise<number> {
    const now = this.clock.now();
    const groups = await this.uow.of(manager).club.listAgeGroups(clubId);
    const repo = this.uow.of(manager).toleranceBands;
    const existing = new Set(
      (await repo.list({ clubId })).map((b) => `${b.ageGroupId}|${b.metric}|${b.view}`),
    );
    const rows: ToleranceBand[] = [];
    for (const group of groups) {
      const set = defaultSetFor(group);
      for (const band of DEFAULT_BANDS.filter((b) => b.ageGroup === set)) {
        const view = bandView(band.metric);
        if (existing.has(`${group.id}|${band.metric}|${view}`)) continue;
        rows.push({
          id: randomUUID(),
          clubId,
          ageGroupId: group.id,
          metric: band.metric,
          view,
          min: band.min,
          max: band.max,
          target: band.target,
          source: band.source,
          updatedById: null,
          updatedAt: now,
        });
      }
    }
    await repo.insertMany(rows);
    return rows.length;
  }
}
