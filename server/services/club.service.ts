import type { ClubMemberListResponse } from '@shared/schemas/club.schema';
import type { Clock, Principal } from './principal';
import type { UnitOfWork } from '../repositories/unit-of-work';

export class ClubService {
  constructor(
    private readonly uow: UnitOfWork,
    private readonly clock: Clock,
  ) {}

  /** Every sign-in of the club with what it is linked to, plus invitations still open. */
  async members(principal: Principal): Promise<ClubMemberListResponse> {
    const repo = this.uow.repos.members;
    const roster = await repo.roster(principal.clubId);
    const groupName = new Map(roster.ageGroups.map((g) => [g.id, g.name]));
    const athleteById = new Map(roster.athletes.map((a) => [a.id, a]));
    const athleteRef = (id: string) => {
      const a = athleteById.get(id);
      return a ? [{ id: a.id, name: `${a.firstName} ${a.lastName}` }] : [];
    };
    const invitations = await repo.openInvitations(principal.clubId, this.clock.now());
    return {
      members: roster.users.map((user) => ({
        id: user.id,
        name: user.name,
        email: user.email,
        role: user.role,
        ageGroups: roster.assignments
          .filter((a) => a.coachUserId === user.id)
          .map((a) => groupName.get(a.ageGroupId) ?? '')
          .filter(Boolean)
          .sort(),
        athletes:
          user.role === 'athlete'
            ? roster.athletes.filter((a) => a.userId === user.id).flatMap((a) => athleteRef(a.id))
            : roster.guardianLinks
                .filter((l) => l.guardianUserId === user.id)
                .flatMap((l) => athleteRef(l.athleteId)),
      })),
      invitations: invitations.map((i) => ({
        id: i.id,
        email: i.email,
        role: i.role,
        expiresAt: i.expiresAt.toISOString(),
      })),
    };
  }
}
