import { randomUUID } from 'node:crypto';
import type {
  AgeGroupListResponse,
  AthleteListResponse,
  AthleteResponse,
  CreateAthleteInput,
} from '@shared/schemas/athlete.schema';
import type { Athlete } from '../entities/athlete.entity';
import { badRequest, forbidden, notFound } from '../errors';
import { toAgeGroupDto, toAthleteDetailDto, toAthleteDto } from '../mappers/athlete.mapper';
import type { AccessService } from './access.service';
import type { AuditService } from './audit.service';
import type { Clock, Principal } from './principal';
import type { UnitOfWork } from '../repositories/unit-of-work';

export class AthleteService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly access: AccessService,
    private readonly audit: AuditService,
    private readonly clock: Clock,
  ) {}

  async listAgeGroups(principal: Principal): Promise<AgeGroupListResponse> {
    const groups = await this.uow.repos.club.listAgeGroups(principal.clubId);
    return { ageGroups: groups.map(toAgeGroupDto) };
  }

  async list(
    principal: Principal,
    query: { search?: string; ageGroupId?: string },
  ): Promise<AthleteListResponse> {
    const manager = this.uow.repos.manager;
    const athletes = await this.uow.of(manager).athletes.list({
      clubId: principal.clubId,
      athleteIds: await this.access.visibleAthleteIds(principal),
      ageGroupId: query.ageGroupId,
      search: query.search,
    });
    const [groups, counts] = await Promise.all([
      this.uow.of(manager).club.listAgeGroups(principal.clubId),
      this.uow.of(manager).athletes.clipCounts(athletes.map((a) => a.id)),
    ]);
    const groupById = new Map(groups.map((g) => [g.id, g]));
    const now = this.clock.now();
    return {
      athletes: athletes.map((a) =>
        toAthleteDto(a, groupById.get(a.ageGroupId)!, counts.get(a.id) ?? 0, now),
      ),
    };
  }

  /** The athlete if the caller may read it; 404 otherwise, so ids outside one's reach reveal nothing. */
  async findVisible(principal: Principal, athleteId: string): Promise<Athlete> {
    const athlete = await this.uow.repos.athletes.findById(athleteId);
    if (!athlete || !this.access.canSeeAthlete(principal, athlete)) throw notFound('Athlete');
    return athlete;
  }

  async get(principal: Principal, athleteId: string): Promise<AthleteResponse> {
    return this.detail(principal, await this.findVisible(principal, athleteId));
  }

  private async detail(principal: Principal, athlete: Athlete): Promise<AthleteResponse> {
    const manager = this.uow.repos.manager;
    const repo = this.uow.of(manager).athletes;
    const [group, counts, guardians] = await Promise.all([
      this.uow.of(manager).club.findAgeGroup(athlete.ageGroupId),
      repo.clipCounts([athlete.id]),
      repo.guardiansOf(athlete.id),
    ]);
    return {
      athlete: toAthleteDetailDto(
        athlete,
        group!,
        counts.get(athlete.id) ?? 0,
        guardians,
        this.access.canSeeContactDetails(principal),
        this.clock.now(),
      ),
    };
  }

  async create(principal: Principal, input: CreateAthleteInput): Promise<AthleteResponse> {
    const group = await this.uow.repos.club.findAgeGroup(input.ageGroupId);
    if (!group || group.clubId !== principal.clubId) {
      throw badRequest('unknown_age_group', 'Choose one of the club’s age groups');
    }
    if (!this.access.canManageAgeGroup(principal, group.id)) {
      throw forbidden(
        `You can only add athletes to the age groups you coach; ${group.name} is not one of them`,
      );
    }
    const athlete: Athlete = {
      id: randomUUID(),
      clubId: principal.clubId,
      ageGroupId: group.id,
      userId: null,
      firstName: input.firstName,
      lastName: input.lastName,
      birthYear: input.birthYear,
      consentRecordedAt: null,
      consentGuardianName: null,
      consentMethod: null,
      consentRecordedById: null,
      consentShareByEmail: false,
      consentWithdrawnAt: null,
      erasureDueAt: null,
      createdAt: this.clock.now(),
    };
    await this.uow.transaction(async (manager) => {
      await this.uow.of(manager).athletes.insert(athlete);
      await this.audit.record(manager, {
        clubId: principal.clubId,
        actorUserId: principal.user.id,
        action: 'athlete.create',
        targetType: 'athlete',
        targetId: athlete.id,
      });
    });
    return this.detail(principal, athlete);
  }
}
