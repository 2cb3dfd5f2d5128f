import { IsNull, MoreThan, type EntityManager } from 'typeorm';
import { AgeGroupEntity } from '../entities/age-group.entity';
import { AthleteEntity, type Athlete } from '../entities/athlete.entity';
import { CoachAssignmentEntity, type CoachAssignment } from '../entities/coach-assignment.entity';
import { GuardianLinkEntity, type GuardianLink } from '../entities/guardian-link.entity';
import { InvitationEntity, type Invitation } from '../entities/invitation.entity';
import { UserEntity, type User } from '../entities/user.entity';
import type { AgeGroup } from '../entities/age-group.entity';

export interface ClubRoster {
  users: User[];
  ageGroups: AgeGroup[];
  assignments: CoachAssignment[];
  guardianLinks: GuardianLink[];
  athletes: Athlete[];
}

/** Everything the member list needs about a club, in a handful of queries. */
export class MemberRepository {
  constructor(private readonly manager: EntityManager) {}

  async roster(clubId: string): Promise<ClubRoster> {
    const [users, ageGroups, athletes] = await Promise.all([
      this.manager.find(UserEntity, { where: { clubId }, order: { name: 'ASC' } }),
      this.manager.find(AgeGroupEntity, { where: { clubId } }),
      this.manager.find(AthleteEntity, { where: { clubId } }),
    ]);
    const groupIds = ageGroups.map((g) => g.id);
    const athleteIds = athletes.map((a) => a.id);
    const [assignments, guardianLinks] = await Promise.all([
      groupIds.length
        ? this.manager
            .createQueryBuilder(CoachAssignmentEntity, 'ca')
            .where('ca.ageGroupId IN (:...groupIds)', { groupIds })
            .getMany()
        : [],
      athleteIds.length
        ? this.manager
            .createQueryBuilder(GuardianLinkEntity, 'gl')
            .where('gl.athleteId IN (:...athleteIds)', { athleteIds })
            .getMany()
        : [],
    ]);
    return { users, ageGroups, assignments, guardianLinks, athletes };
  }

  openInvitations(clubId: string, now: Date): Promise<Invitation[]> {
    return this.manager.find(InvitationEntity, {
      where: { clubId, acceptedAt: IsNull(), expiresAt: MoreThan(now) },
      order: { createdAt: 'DESC' },
    });
  }
}
