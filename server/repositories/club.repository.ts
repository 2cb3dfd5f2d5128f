import type { EntityManager } from 'typeorm';
import { AgeGroupEntity, type AgeGroup } from '../entities/age-group.entity';
import { ClubEntity, type Club } from '../entities/club.entity';

export class ClubRepository {
  constructor(private readonly manager: EntityManager) {}

  findById(id: string): Promise<Club | null> {
    return this.manager.findOneBy(ClubEntity, { id });
  }

  count(): Promise<number> {
    return this.manager.count(ClubEntity);
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
