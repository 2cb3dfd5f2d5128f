import { IsNull, Not, type EntityManager } from 'typeorm';
import { AgeGroupEntity, type AgeGroup } from '../entities/age-group.entity';
import { ClubEntity, type Club } from '../entities/club.entity';

export class ClubRepository {
  constructor(private readonly manager: EntityManager) {}

  findById(id: string): Promise<Club | null> {
    return this.manager.findOneBy(ClubEntity, { id });
  }

  /** Clubs that erase clips some time after a season ends. */
  withRetention(): Promise<Club[]> {
    return this.manager.find(ClubEntity, { where: { retentionDaysAfterSeason: Not(IsNull()) } });
  }

  count(): Promise<number> {
    return this.manager.count(ClubEntity);
  }

  async update(id: string, patch: Partial<Club>): Promise<void> {
    await this.manager.update(ClubEntity, { id }, patch);
  }

  async insert(club: Club): Promise<void> {
    await this.manager.insert(ClubEntity, club);
  }

  listAgeGroups(clubId: string): Promise<AgeGroup[]> {
    return this.manager.find(AgeGroupEntity, { where: { clubId }, order: { minAge: 'ASC' } });
  }

  findAgeGroup(id: string): Promise<AgeGroup | null> {
    return this.manager.findOneBy(AgeGroupEntity, { id });
  }

  async insertAgeGroup(group: AgeGroup): Promise<void> {
    await this.manager.insert(AgeGroupEntity, group);
  }
}
