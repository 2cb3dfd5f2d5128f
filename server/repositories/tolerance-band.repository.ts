import type { EntityManager } from 'typeorm';
import { ToleranceBandEntity, type ToleranceBand } from '../entities/tolerance-band.entity';

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

  async insertMany(rows: ToleranceBand[]): Promise<void> {
    for (let i = 0; i < rows.length; i += 100) {
      await this.manager.insert(ToleranceBandEntity, rows.slice(i, i + 100));
    }
  }
}
