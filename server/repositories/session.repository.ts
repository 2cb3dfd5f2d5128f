import { In, type EntityManager } from 'typeorm';
import { ClipAthleteEntity } from '../entities/clip-athlete.entity';
import { ClipEntity } from '../entities/clip.entity';
import { TrainingSessionEntity, type TrainingSession } from '../entities/training-session.entity';

export class SessionRepository {
  constructor(private readonly manager: EntityManager) {}

  findById(id: string): Promise<TrainingSession | null> {
    return this.manager.findOneBy(TrainingSessionEntity, { id });
  }

  findByIds(ids: string[]): Promise<TrainingSession[]> {
    return ids.length === 0
      ? Promise.resolve([])
      : this.manager.findBy(TrainingSessionEntity, { id: In([...new Set(ids)]) });
  }

  /** Sessions of a club, newest first; `sessionIds` null means all of them. */
  list(clubId: string, sessionIds: string[] | null): Promise<TrainingSession[]> {
    if (sessionIds && sessionIds.length === 0) return Promise.resolve([]);
    return this.manager.find(TrainingSessionEntity, {
      where: sessionIds ? { clubId, id: In(sessionIds) } : { clubId },
      order: { date: 'DESC', createdAt: 'DESC' },
    });
  }

  /** Sessions that hold at least one clip of these athletes. */
  async idsWithAthletes(athleteIds: string[]): Promise<string[]> {
    if (athleteIds.length === 0) return [];
    const rows: { sessionId: string }[] = await this.manager
      .createQueryBuilder(ClipEntity, 'c')
      .innerJoin(ClipAthleteEntity.options.name, 'ca', 'ca.clipId = c.id')
      .select('DISTINCT c.sessionId', 'sessionId')
      .where('ca.athleteId IN (:...ids)', { ids: athleteIds })
      .getRawMany();
    return rows.map((r) => r.sessionId);
  }

  /** Clips per session, counting only clips of `athleteIds` unless it is null. */
  async clipCounts(sessionIds: string[], athleteIds: string[] | null): Promise<Map<string, number>> {
    const counts = new Map<string, number>();
    if (sessionIds.length === 0 || (athleteIds && athleteIds.length === 0)) return counts;
    const qb = this.manager
      .createQueryBuilder(ClipEntity, 'c')
      .select('c.sessionId', 'sessionId')
      .addSelect('COUNT(DISTINCT c.id)', 'n')
      .where('c.sessionId IN (:...sessionIds)', { sessionIds })
      .groupBy('c.sessionId');
    if (athleteIds) {
      qb.innerJoin(ClipAthleteEntity.options.name, 'ca', 'ca.clipId = c.id').andWhere(
        'ca.athleteId IN (:...athleteIds)',
        {
          athleteIds,
        },
      );
    }
    const rows: { sessionId: string; n: number }[] = await qb.getRawMany();
    for (const row of rows) counts.set(row.sessionId, Number(row.n));
    return counts;
  }

  async insert(session: TrainingSession): Promise<void> {
    await this.manager.insert(TrainingSessionEntity, session);
  }
}
