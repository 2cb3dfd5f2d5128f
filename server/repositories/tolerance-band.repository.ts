import type { EntityManager } from 'typeorm';
import { ToleranceBandEntity, type ToleranceBand } from '../entities/tolerance-band.entity';
import {
  ToleranceBandChangeEntity,
  type ToleranceBandChange,
} from '../entities/tolerance-band-change.entity';

export class ToleranceBandRepository {
  constructor(private readonly manager: EntityManager) {}

  list(filter: { clubId: string; ageGroupId?: string }): Promise<ToleranceBand[]> {
    return this.manager.find(ToleranceBandEntity, {
      where: filter.ageGroupId
        ? { clubId: filter.clubId, ageGroupId: filter.ageGroupId }
        : { clubId: filter.clubId },
      order: { ageGroupId: 'ASC', metric: 'ASC' },
    });
  }

  findOne(ageGroupId: string, metric: string): Promise<ToleranceBand | null> {
    return this.manager.findOneBy(ToleranceBandEntity, { ageGroupId, metric });
  }

  async insertMany(rows: ToleranceBand[]): Promise<void> {
    for (let i = 0; i < rows.length; i += 100) {
      await this.manager.insert(ToleranceBandEntity, rows.slice(i, i + 100));
    }
  }

  async save(row: ToleranceBand): Promise<void> {
    await this.manager.save(ToleranceBandEntity, row);
  }

  async addChange(change: ToleranceBandChange): Promise<void> {
    await this.manager.insert(ToleranceBandChangeEntity, change);
  }

  changes(filter: { clubId: string; ageGroupId?: string; limit: number }): Promise<ToleranceBandChange[]> {
    return this.manager.find(ToleranceBandChangeEntity, {
      where: filter.ageGroupId
        ? { clubId: filter.clubId, ageGroupId: filter.ageGroupId }
        : { clubId: filter.clubId },
      order: { changedAt: 'DESC', version: 'DESC' },
      take: filter.limit,
    });
  }
}
