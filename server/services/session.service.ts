import { randomUUID } from 'node:crypto';
import type {
  CreateSessionInput,
  SessionListResponse,
  SessionResponse,
} from '@shared/schemas/session.schema';
import type { TrainingSession } from '../entities/training-session.entity';
import { notFound } from '../errors';
import { toSessionDto } from '../mappers/session.mapper';
import type { AccessService } from './access.service';
import type { AuditService } from './audit.service';
import type { Clock, Principal } from './principal';
import type { UnitOfWork } from '../repositories/unit-of-work';

export class SessionService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly access: AccessService,
    private readonly audit: AuditService,
    private readonly clock: Clock,
  ) {}

  /**
   * Staff (head coach, coaches, analysts) read every session of the club; athletes and guardians
   * only sessions holding a clip of themselves or their children. Clip counts follow the same reach.
   */
  private async reach(
    principal: Principal,
  ): Promise<{ sessionIds: string[] | null; athleteIds: string[] | null }> {
    const athleteIds = await this.access.visibleAthleteIds(principal);
    if (principal.role === 'athlete' || principal.role === 'guardian') {
      const sessionIds = await this.uow.repos.sessions.idsWithAthletes(athleteIds ?? []);
      return { sessionIds, athleteIds };
    }
    return { sessionIds: null, athleteIds };
  }

  async list(principal: Principal): Promise<SessionListResponse> {
    const repo = this.uow.repos.sessions;
    const { sessionIds, athleteIds } = await this.reach(principal);
    const sessions = await repo.list(principal.clubId, sessionIds);
    const counts = await repo.clipCounts(
      sessions.map((s) => s.id),
      athleteIds,
    );
    return { sessions: sessions.map((s) => toSessionDto(s, counts.get(s.id) ?? 0)) };
  }

  async findVisible(principal: Principal, sessionId: string): Promise<TrainingSession> {
    const session = await this.uow.repos.sessions.findById(sessionId);
    if (!session || session.clubId !== principal.clubId) throw notFound('Session');
    const { sessionIds } = await this.reach(principal);
    if (sessionIds && !sessionIds.includes(session.id)) throw notFound('Session');
    return session;
  }

  async get(principal: Principal, sessionId: string): Promise<SessionResponse> {
    const session = await this.findVisible(principal, sessionId);
    const { athleteIds } = await this.reach(principal);
    const counts = await this.uow.repos.sessions.clipCounts([session.id], athleteIds);
    return { session: toSessionDto(session, counts.get(session.id) ?? 0) };
  }

  async create(principal: Principal, input: CreateSessionInput): Promise<SessionResponse> {
    const session: TrainingSession = {
      id: randomUUID(),
      clubId: principal.clubId,
      date: input.date,
      venue: input.venue,
      discipline: input.discipline,
      snow: input.snow,
      notes: input.notes ? input.notes : null,
      createdById: principal.user.id,
      createdAt: this.clock.now(),
    };
    await this.uow.transaction(async (manager) => {
      await this.uow.of(manager).sessions.insert(session);
      await this.audit.record(manager, {
        clubId: principal.clubId,
        actorUserId: principal.user.id,
        action: 'session.create',
        targetType: 'session',
        targetId: session.id,
      });
    });
    return { session: toSessionDto(session, 0) };
  }
}
