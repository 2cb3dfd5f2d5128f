import { In, type EntityManager } from 'typeorm';
import { CompareStillEntity, type CompareStill } from '../entities/compare-still.entity';
import { FocusPointEntity, type FocusPoint } from '../entities/focus-point.entity';
import { SeasonBaselineEntity, type SeasonBaseline } from '../entities/season-baseline.entity';
import { SeasonEntity, type Season } from '../entities/season.entity';

/** Seasons, season plans (focus points and baselines) and the stills kept with compared clip pairs. */
export class PlanRepository {
  constructor(private readonly manager: EntityManager) {}

  listSeasons(clubId: string): Promise<Season[]> {
    return this.manager.find(SeasonEntity, { where: { clubId }, order: { startsOn: 'ASC' } });
  }

  findSeason(id: string): Promise<Season | null> {
    return this.manager.findOneBy(SeasonEntity, { id });
  }

  async insertSeason(season: Season): Promise<void> {
    await this.manager.insert(SeasonEntity, season);
  }

  async updateSeason(id: string, patch: Partial<Season>): Promise<void> {
    await this.manager.update(SeasonEntity, { id }, patch);
  }

  listFocusPoints(athleteId: string, seasonId: string): Promise<FocusPoint[]> {
    return this.manager.find(FocusPointEntity, {
      where: { athleteId, seasonId },
      order: { rank: 'ASC', createdAt: 'ASC' },
    });
  }

  findFocusPoint(id: string): Promise<FocusPoint | null> {
    return this.manager.findOneBy(FocusPointEntity, { id });
  }

  async insertFocusPoint(point: FocusPoint): Promise<void> {
    await this.manager.insert(FocusPointEntity, point);
  }

  async updateFocusPoint(id: string, patch: Partial<FocusPoint>): Promise<void> {
    await this.manager.update(FocusPointEntity, { id }, patch);
  }

  async deleteFocusPoint(id: string): Promise<void> {
    await this.manager.delete(FocusPointEntity, { id });
  }

  async setRanks(ids: string[]): Promise<void> {
    for (const [rank, id] of ids.entries()) await this.manager.update(FocusPointEntity, { id }, { rank });
  }

  findBaseline(athleteId: string, seasonId: string): Promise<SeasonBaseline | null> {
    return this.manager.findOneBy(SeasonBaselineEntity, { athleteId, seasonId });
  }

  async saveBaseline(row: SeasonBaseline): Promise<void> {
    await this.manager.upsert(SeasonBaselineEntity, row, { conflictPaths: ['athleteId', 'seasonId'] });
  }

  async clearBaseline(athleteId: string, seasonId: string): Promise<void> {
    await this.manager.delete(SeasonBaselineEntity, { athleteId, seasonId });
  }

  /** Baselines among these clips (which of them is some athlete's baseline). */
  baselinesOfClips(clipIds: string[]): Promise<SeasonBaseline[]> {
    return clipIds.length === 0
      ? Promise.resolve([])
      : this.manager.findBy(SeasonBaselineEntity, { clipId: In(clipIds) });
  }

  async insertStill(still: CompareStill): Promise<void> {
    await this.manager.insert(CompareStillEntity, still);
  }

  findStill(id: string): Promise<CompareStill | null> {
    return this.manager.findOneBy(CompareStillEntity, { id });
  }

  /** Stills of a pair in either order, newest first. */
  listStills(clipA: string, clipB: string): Promise<CompareStill[]> {
    return this.manager.find(CompareStillEntity, {
      where: [
        { clipAId: clipA, clipBId: clipB },
        { clipAId: clipB, clipBId: clipA },
      ],
      order: { createdAt: 'DESC' },
    });
  }
}
