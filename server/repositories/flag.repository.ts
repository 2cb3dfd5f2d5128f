import type { EntityManager } from 'typeorm';
import type { PoseModelName } from '@shared/keypoints';
import type { FlagQuery, FlagStatus } from '@shared/schemas/flag.schema';
import { FlagEntity, type Flag } from '../entities/flag.entity';

// What a re-check may change of a stored flag; id, review state and createdAt stay.
const MEASURED_COLUMNS = [
  'turnIndex',
  'firstFrame',
  'lastFrame',
  'frameCount',
  'frameIndex',
  'value',
  'bandMin',
  'bandMax',
  'toleranceBandId',
  'bandVersion',
  'distance',
  'severity',
  'athleteId',
  'ageGroupId',
  'updatedAt',
];

/** What a club-wide flag search is narrowed to, on top of the query's own filters. */
export interface FlagScope {
  clubId: string;
  /** Null: every athlete of the club. */
  athleteIds: string[] | null;
  /** Only flags of these clips (what reviews have shared with an athlete or guardian). */
  clipIds?: string[];
  /** Never flags of these clips (clips of an athlete whose consent is withdrawn). */
  excludeClipIds?: string[];
}

export class FlagRepository {
  constructor(private readonly manager: EntityManager) {}

  list(clipId: string, model: PoseModelName): Promise<Flag[]> {
    return this.manager.find(FlagEntity, {
      where: { clipId, model },
      order: { firstFrame: 'ASC', metric: 'ASC' },
    });
  }

  count(clipId: string, model: PoseModelName): Promise<number> {
    return this.manager.countBy(FlagEntity, { clipId, model });
  }

  findById(id: string): Promise<Flag | null> {
    return this.manager.findOneBy(FlagEntity, { id });
  }

  /**
   * Makes the stored flags of a clip and model exactly `fresh`. A flag found again (same metric and
   * turn or stretch) keeps its id, review state and first-raised time, as the upsert only updates
   * the measured columns; the flags not found again are removed. The unique key (clip, model, metric,
   * group) keeps a flag from being stored twice, whatever runs this twice.
   */
  async replace(clipId: string, model: PoseModelName, fresh: Flag[]): Promise<void> {
    // One plain statement per 100 rows: TypeORM's insert builder took ~30 ms for a clip's few
    // hundred flags, all of it holding the event loop (better-sqlite3 is synchronous).
    const metadata = this.manager.connection.getMetadata(FlagEntity);
    const driver = this.manager.connection.driver;
    const columns = metadata.columns;
    const names = columns.map((c) => `"${c.databaseName}"`).join(', ');
    const updates = MEASURED_COLUMNS.map((c) => `"${c}" = excluded."${c}"`).join(', ');
    for (let i = 0; i < fresh.length; i += 100) {
      const chunk = fresh.slice(i, i + 100);
      const placeholders = chunk.map(() => `(${columns.map(() => '?').join(', ')})`).join(', ');
      const values = chunk.flatMap((row) =>
        columns.map((c) => driver.preparePersistentValue(c.getEntityValue(row), c) as unknown),
      );
      await this.manager.query(
        `INSERT INTO "flag" (${names}) VALUES ${placeholders}
         ON CONFLICT ("clipId", "model", "metric", "groupKey") DO UPDATE SET ${updates}`,
        values,
      );
    }
    const gone = this.manager
      .createQueryBuilder()
      .delete()
      .from(FlagEntity)
      .where('clipId = :clipId AND model = :model', { clipId, model });
    const keys = fresh.map((f) => `${f.metric}|${f.groupKey}`);
    if (keys.length > 0) gone.andWhere("(metric || '|' || groupKey) NOT IN (:...keys)", { keys });
    await gone.execute();
  }

  async deleteAll(clipId: string, model?: PoseModelName): Promise<void> {
    await this.manager.delete(FlagEntity, model ? { clipId, model } : { clipId });
  }

  async setStatus(
    id: string,
    patch: { status: FlagStatus; statusComment: string | null; statusById: string; statusAt: Date },
  ): Promise<void> {
    await this.manager.update(FlagEntity, { id }, patch);
  }

  /**
   * The club's flags of each clip's default model, newest first, filtered and paged. Dates are the
   * training session's day.
   */
  async search(scope: FlagScope, query: FlagQuery): Promise<{ rows: Flag[]; total: number }> {
    if (scope.athleteIds !== null && scope.athleteIds.length === 0) return { rows: [], total: 0 };
    if (scope.clipIds && scope.clipIds.length === 0) return { rows: [], total: 0 };
    const qb = this.manager
      .createQueryBuilder(FlagEntity, 'f')
      .innerJoin('Clip', 'c', 'c.id = f.clipId')
      .leftJoin('TrainingSession', 's', 's.id = c.sessionId')
      .where('c.clubId = :clubId', { clubId: scope.clubId })
      .andWhere('f.model = c.defaultModel');
    if (scope.athleteIds !== null) qb.andWhere('f.athleteId IN (:...scoped)', { scoped: scope.athleteIds });
    if (scope.clipIds) qb.andWhere('f.clipId IN (:...clipScope)', { clipScope: scope.clipIds });
    if (scope.excludeClipIds?.length)
      qb.andWhere('f.clipId NOT IN (:...withheld)', { withheld: scope.excludeClipIds });
    if (query.athleteId) qb.andWhere('f.athleteId = :athleteId', { athleteId: query.athleteId });
    if (query.clipId) qb.andWhere('f.clipId = :clipId', { clipId: query.clipId });
    if (query.ageGroupId) qb.andWhere('f.ageGroupId = :ageGroupId', { ageGroupId: query.ageGroupId });
    if (query.metric) qb.andWhere('f.metric = :metric', { metric: query.metric });
    if (query.status) qb.andWhere('f.status = :status', { status: query.status });
    if (query.from) qb.andWhere('s.date >= :from', { from: query.from });
    if (query.to) qb.andWhere('s.date <= :to', { to: query.to });
    const total = await qb.getCount();
    const rows = await qb
      .orderBy('f.createdAt', 'DESC')
      .addOrderBy('s.date', 'DESC')
      .addOrderBy('f.clipId', 'ASC')
      .addOrderBy('f.firstFrame', 'ASC')
      .addOrderBy('f.metric', 'ASC')
      .offset((query.page - 1) * query.pageSize)
      .limit(query.pageSize)
      .getMany();
    return { rows, total };
  }
}
