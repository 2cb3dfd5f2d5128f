import { In, type EntityManager } from 'typeorm';
import { ClipAthleteEntity } from '../entities/clip-athlete.entity';
import { ClipEntity, type Clip } from '../entities/clip.entity';

export interface ClipFilter {
  clubId: string;
  /** Null: every clip of the club; otherwise clips showing at least one of these athletes. */
  visibleAthleteIds: string[] | null;
  athleteId?: string;
  sessionId?: string;
}

export class ClipRepository {
  constructor(private readonly manager: EntityManager) {}

  findByIds(ids: string[]): Promise<Clip[]> {
    return ids.length === 0
      ? Promise.resolve([])
      : this.manager.findBy(ClipEntity, { id: In([...new Set(ids)]) });
  }

  findById(id: string): Promise<Clip | null> {
    return this.manager.findOneBy(ClipEntity, { id });
  }

  async list(filter: ClipFilter): Promise<Clip[]> {
    if (filter.visibleAthleteIds && filter.visibleAthleteIds.length === 0) return [];
    const qb = this.manager
      .createQueryBuilder(ClipEntity, 'c')
      .where('c.clubId = :clubId', { clubId: filter.clubId })
      .orderBy('c.createdAt', 'DESC');
    if (filter.sessionId) qb.andWhere('c.sessionId = :sessionId', { sessionId: filter.sessionId });
    if (filter.visibleAthleteIds) {
      qb.andWhere(
        'EXISTS (SELECT 1 FROM clip_athlete v WHERE v.clipId = c.id AND v.athleteId IN (:...visible))',
        { visible: filter.visibleAthleteIds },
      );
    }
    if (filter.athleteId) {
      qb.andWhere(
        'EXISTS (SELECT 1 FROM clip_athlete t WHERE t.clipId = c.id AND t.athleteId = :athleteId)',
        {
          athleteId: filter.athleteId,
        },
      );
    }
    return qb.getMany();
  }

  /** Every clip id in the database (maintenance: which stored objects still belong to a clip). */
  async allIds(): Promise<string[]> {
    const rows = await this.manager.find(ClipEntity, { select: { id: true } });
    return rows.map((r) => r.id);
  }

  /** Ids of the club's clips showing an athlete of these age groups (null: every clip), in id order. */
  async idsInAgeGroups(clubId: string, ageGroupIds: string[] | null): Promise<string[]> {
    if (ageGroupIds !== null && ageGroupIds.length === 0) return [];
    const qb = this.manager
      .createQueryBuilder(ClipEntity, 'c')
      .select('c.id', 'id')
      .where('c.clubId = :clubId', { clubId })
      .orderBy('c.id', 'ASC');
    if (ageGroupIds !== null) {
      qb.andWhere(
        'EXISTS (SELECT 1 FROM clip_athlete ca INNER JOIN athlete a ON a.id = ca.athleteId WHERE ca.clipId = c.id AND a.ageGroupId IN (:...groups))',
        { groups: ageGroupIds },
      );
    }
    return (await qb.getRawMany<{ id: string }>()).map((r) => r.id);
  }

  /** The club's clips whose training session lies between two calendar dates (inclusive). */
  async idsWithSessionBetween(clubId: string, from: string, to: string): Promise<string[]> {
    const rows: { id: string }[] = await this.manager.query(
      `SELECT c.id AS id FROM clip c INNER JOIN training_session s ON s.id = c.sessionId
       WHERE c.clubId = ? AND s.date >= ? AND s.date <= ? ORDER BY c.id`,
      [clubId, from, to],
    );
    return rows.map((r) => r.id);
  }

  /** Tagged athlete ids per clip. */
  async athleteIdsByClip(clipIds: string[]): Promise<Map<string, string[]>> {
    const result = new Map<string, string[]>();
    if (clipIds.length === 0) return result;
    const rows = await this.manager.findBy(ClipAthleteEntity, { clipId: In(clipIds) });
    for (const row of rows) {
      const list = result.get(row.clipId) ?? [];
      list.push(row.athleteId);
      result.set(row.clipId, list);
    }
    return result;
  }

  async insert(clip: Clip, athleteIds: string[]): Promise<void> {
    await this.manager.insert(ClipEntity, clip);
    await this.manager.insert(
      ClipAthleteEntity,
      athleteIds.map((athleteId) => ({ clipId: clip.id, athleteId })),
    );
  }

  count(): Promise<number> {
    return this.manager.count(ClipEntity);
  }
}
