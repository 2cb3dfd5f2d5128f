import { In, IsNull, LessThanOrEqual, Not, type EntityManager } from 'typeorm';
import { AthleteEntity, type Athlete } from '../entities/athlete.entity';
import { ClipAthleteEntity } from '../entities/clip-athlete.entity';
import { ConsentEventEntity, type ConsentEvent } from '../entities/consent-event.entity';
import { GuardianLinkEntity, type GuardianLink } from '../entities/guardian-link.entity';
import { UserEntity, type User } from '../entities/user.entity';

export interface AthleteFilter {
  clubId: string;
  /** Null: every athlete of the club; otherwise only these. */
  athleteIds: string[] | null;
  ageGroupId?: string;
  search?: string;
}

export class AthleteRepository {
  constructor(private readonly manager: EntityManager) {}

  findById(id: string): Promise<Athlete | null> {
    return this.manager.findOneBy(AthleteEntity, { id });
  }

  findByIds(ids: string[]): Promise<Athlete[]> {
    if (ids.length === 0) return Promise.resolve([]);
    return this.manager.findBy(AthleteEntity, { id: In(ids) });
  }

  async list(filter: AthleteFilter): Promise<Athlete[]> {
    if (filter.athleteIds && filter.athleteIds.length === 0) return [];
    const qb = this.manager
      .createQueryBuilder(AthleteEntity, 'a')
      .where('a.clubId = :clubId', { clubId: filter.clubId })
      .orderBy('a.lastName', 'ASC')
      .addOrderBy('a.firstName', 'ASC');
    if (filter.athleteIds) qb.andWhere('a.id IN (:...ids)', { ids: filter.athleteIds });
    if (filter.ageGroupId) qb.andWhere('a.ageGroupId = :ageGroupId', { ageGroupId: filter.ageGroupId });
    if (filter.search) {
      const pattern = `%${filter.search.replace(/[\\%_]/g, (c) => `\\${c}`).toLowerCase()}%`;
      qb.andWhere(
        "(lower(a.firstName) LIKE :pattern ESCAPE '\\' OR lower(a.lastName) LIKE :pattern ESCAPE '\\' OR lower(a.firstName || ' ' || a.lastName) LIKE :pattern ESCAPE '\\')",
        { pattern },
      );
    }
    return qb.getMany();
  }

  /** Athlete ids of the given age groups (a coach's reach). */
  async idsInAgeGroups(clubId: string, ageGroupIds: string[]): Promise<string[]> {
    if (ageGroupIds.length === 0) return [];
    const rows = await this.manager.find(AthleteEntity, {
      select: { id: true },
      where: { clubId, ageGroupId: In(ageGroupIds) },
    });
    return rows.map((r) => r.id);
  }

  /** Number of clips each athlete is tagged in. */
  async clipCounts(athleteIds: string[]): Promise<Map<string, number>> {
    const counts = new Map<string, number>();
    if (athleteIds.length === 0) return counts;
    const rows: { athleteId: string; n: number }[] = await this.manager
      .createQueryBuilder(ClipAthleteEntity, 'ca')
      .select('ca.athleteId', 'athleteId')
      .addSelect('COUNT(*)', 'n')
      .where('ca.athleteId IN (:...ids)', { ids: athleteIds })
      .groupBy('ca.athleteId')
      .getRawMany();
    for (const row of rows) counts.set(row.athleteId, Number(row.n));
    return counts;
  }

  async guardiansOf(athleteId: string): Promise<User[]> {
    const links = await this.manager.find(GuardianLinkEntity, {
      where: { athleteId },
      order: { createdAt: 'ASC' },
    });
    if (links.length === 0) return [];
    const users = await this.manager.findBy(UserEntity, { id: In(links.map((l) => l.guardianUserId)) });
    const byId = new Map(users.map((u) => [u.id, u]));
    return links.map((l) => byId.get(l.guardianUserId)).filter((u): u is User => Boolean(u));
  }

  /** Clips of the club that show an athlete whose consent is withdrawn. */
  async withdrawnClipIds(clubId: string): Promise<string[]> {
    const rows: { clipId: string }[] = await this.manager.query(
      `SELECT DISTINCT ca.clipId AS clipId FROM clip_athlete ca INNER JOIN athlete a ON a.id = ca.athleteId
       WHERE a.clubId = ? AND a.consentWithdrawnAt IS NOT NULL`,
      [clubId],
    );
    return rows.map((r) => r.clipId);
  }

  /** Ids of the clips an athlete is tagged in. */
  async clipIdsOf(athleteId: string): Promise<string[]> {
    const rows = await this.manager.find(ClipAthleteEntity, {
      select: { clipId: true },
      where: { athleteId },
    });
    return rows.map((r) => r.clipId);
  }

  /** Withdrawn athletes (any club) whose erasure date has come. */
  dueForErasure(now: Date): Promise<Athlete[]> {
    return this.manager.find(AthleteEntity, {
      where: { erasureDueAt: LessThanOrEqual(now) },
      order: { erasureDueAt: 'ASC' },
    });
  }

  /** The club's athletes waiting for erasure after a withdrawal. */
  pendingErasures(clubId: string): Promise<Athlete[]> {
    return this.manager.find(AthleteEntity, {
      where: { clubId, erasureDueAt: Not(IsNull()) },
      order: { erasureDueAt: 'ASC' },
    });
  }

  guardianLinks(athleteId: string): Promise<GuardianLink[]> {
    return this.manager.find(GuardianLinkEntity, { where: { athleteId }, order: { createdAt: 'ASC' } });
  }

  async setGuardianKept(athleteId: string, guardianUserId: string, keptAt: Date | null): Promise<number> {
    const result = await this.manager.update(
      GuardianLinkEntity,
      { athleteId, guardianUserId },
      { keptByAthleteAt: keptAt },
    );
    return result.affected ?? 0;
  }

  consentEvents(athleteId: string): Promise<ConsentEvent[]> {
    return this.manager.find(ConsentEventEntity, { where: { athleteId }, order: { at: 'ASC' } });
  }

  async addConsentEvent(event: ConsentEvent): Promise<void> {
    await this.manager.insert(ConsentEventEntity, event);
  }

  async insert(athlete: Athlete): Promise<void> {
    await this.manager.insert(AthleteEntity, athlete);
  }

  async update(id: string, patch: Partial<Athlete>): Promise<void> {
    await this.manager.update(AthleteEntity, { id }, patch);
  }
}
