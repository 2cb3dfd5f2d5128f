import { In, type EntityManager } from 'typeorm';
import { AthleteEntity } from '../entities/athlete.entity';
import { CoachAssignmentEntity } from '../entities/coach-assignment.entity';
import { GuardianLinkEntity } from '../entities/guardian-link.entity';
import { UserEntity, type User } from '../entities/user.entity';

export interface UserLinks {
  athleteId: string | null;
  childAthleteIds: string[];
  coachedAgeGroupIds: string[];
}

/** A guardian's link with what decides whether it still gives access (the child's age, the athlete's choice). */
export interface GuardianLinkReach {
  athleteId: string;
  birthYear: number;
  keptByAthleteAt: Date | null;
}

export class UserRepository {
  constructor(private readonly manager: EntityManager) {}

  findById(id: string): Promise<User | null> {
    return this.manager.findOneBy(UserEntity, { id });
  }

  /** Display names of these users (people who changed a band or reviewed a flag). */
  async namesByIds(ids: string[]): Promise<Map<string, string>> {
    const unique = [...new Set(ids)];
    if (unique.length === 0) return new Map();
    const rows = await this.manager.find(UserEntity, {
      select: { id: true, name: true },
      where: { id: In(unique) },
    });
    return new Map(rows.map((u) => [u.id, u.name]));
  }

  headCoachesOf(clubId: string): Promise<User[]> {
    return this.manager.find(UserEntity, {
      where: { clubId, role: 'head_coach' },
      order: { createdAt: 'ASC' },
    });
  }

  findByEmail(email: string): Promise<User | null> {
    return this.manager.findOneBy(UserEntity, { email: email.toLowerCase() });
  }

  async insert(user: User): Promise<void> {
    await this.manager.insert(UserEntity, user);
  }

  async update(id: string, patch: Partial<User>): Promise<void> {
    await this.manager.update(UserEntity, { id }, patch);
  }

  async bumpTokenVersion(id: string): Promise<void> {
    await this.manager.increment(UserEntity, { id }, 'tokenVersion', 1);
  }

  async links(
    user: User,
  ): Promise<Omit<UserLinks, 'childAthleteIds'> & { guardianLinks: GuardianLinkReach[] }> {
    const [athlete, guardianLinks, assignments] = await Promise.all([
      this.manager.findOneBy(AthleteEntity, { userId: user.id }),
      this.manager.find(GuardianLinkEntity, {
        where: { guardianUserId: user.id },
        order: { createdAt: 'ASC' },
      }),
      this.manager.find(CoachAssignmentEntity, { where: { coachUserId: user.id } }),
    ]);
    const children = await this.manager.find(AthleteEntity, {
      select: { id: true, birthYear: true },
      where: { id: In(guardianLinks.map((l) => l.athleteId)) },
    });
    const birthYears = new Map(children.map((c) => [c.id, c.birthYear]));
    return {
      athleteId: athlete?.id ?? null,
      guardianLinks: guardianLinks.map((l) => ({
        athleteId: l.athleteId,
        birthYear: birthYears.get(l.athleteId) ?? 0,
        keptByAthleteAt: l.keptByAthleteAt,
      })),
      coachedAgeGroupIds: assignments.map((a) => a.ageGroupId),
    };
  }

  async addGuardianLink(
    id: string,
    guardianUserId: string,
    athleteId: string,
    createdAt: Date,
  ): Promise<void> {
    await this.manager.insert(GuardianLinkEntity, {
      id,
      guardianUserId,
      athleteId,
      keptByAthleteAt: null,
      createdAt,
    });
  }

  async addCoachAssignment(id: string, coachUserId: string, ageGroupId: string): Promise<void> {
    await this.manager.insert(CoachAssignmentEntity, { id, coachUserId, ageGroupId });
  }
}
