import { hasPermission, type Permission } from '@shared/access/permissions';
import type { UnitOfWork } from '../repositories/unit-of-work';
import type { Role } from '@shared/schemas/auth.schema';
import type { Athlete } from '../entities/athlete.entity';
import { forbidden } from '../errors';
import type { Principal } from './principal';

// The role table itself is shared with the client (shared/access/permissions.ts): routes name the
// permission they need (`authorize(...)`), services narrow records to the caller's reach below.

const FORBIDDEN_MESSAGES: Record<Permission, string> = {
  'me:read': 'Sign in first',
  'age_group:read': 'Your role cannot view age groups',
  'athlete:read': 'Your role cannot view athletes',
  'athlete:create': 'Only coaches and the head coach can add athletes',
  'athlete:consent': 'Only coaches and the head coach can record consent',
  'session:read': 'Your role cannot view sessions',
  'session:create': 'Only coaches and the head coach can create sessions',
  'clip:read': 'Your role cannot view clips',
  'clip:upload': 'Only coaches and the head coach can upload clips',
  'clip:analyse': 'Only coaches and the head coach can change a clip’s analysis',
  'clip:erase': 'Only the head coach, or the coach who uploaded it, can delete a clip',
  'note:read': 'Notes are shared with athletes and guardians only when a review is published',
  'note:write': 'Only coaches and the head coach can write notes',
  'tolerance:read': 'Your role cannot view tolerance bands',
  'tolerance:write': 'Only coaches and the head coach can change tolerance bands',
  'flag:read': 'Your role cannot view flags',
  'flag:review': 'Only coaches and the head coach can review flags',
  'job:read': 'Your role cannot follow background jobs',
  'export:read': 'Your role cannot export data',
  'season:read': 'Your role cannot view seasons',
  'season:write': 'Only the head coach adds seasons',
  'plan:read': 'Your role cannot view season plans',
  'plan:write': 'Only coaches and the head coach can change a season plan',
  'compare:read': 'Your role cannot compare clips',
  'compare:write': 'Only coaches and the head coach keep stills with a clip pair',
  'review:read': 'Your role cannot read reviews',
  'review:write': 'Only coaches and the head coach write and publish reviews',
  'invitation:create': 'Only coaches and the head coach can invite members',
  'club:members': 'Only the head coach can see the member list',
  'athlete:erase': 'Only the head coach erases an athlete',
  'consent:read': 'Your role cannot read consent records',
  'consent:decide':
    'Only a guardian, an adult athlete, or the head coach recording their request can change consent',
  'athlete:export': 'The athlete, their guardians and the head coach download all of an athlete’s data',
  'privacy:manage': 'Only the head coach changes the club’s privacy settings',
  'section:home': 'Your role has no home page of its own',
  'section:athletes': 'Your role cannot browse the athlete list',
  'section:tolerances': 'Athletes and guardians see their target ranges on their own clips',
  'section:exports': 'Athletes and guardians export their own data from their clips',
  'section:sessions': 'Your role cannot browse training sessions',
};

/** The clip ids a caller may open besides the athlete rule (see `AccessService.clipReach`). */
export class ClipReach {
  constructor(
    /** Null: any clip of their athletes. */
    private readonly only: ReadonlySet<string> | null,
    private readonly withheld: ReadonlySet<string>,
  ) {}

  allows(clipId: string): boolean {
    return (this.only === null || this.only.has(clipId)) && !this.withheld.has(clipId);
  }

  filter<T extends { id: string }>(clips: T[]): T[] {
    return this.only === null && this.withheld.size === 0 ? clips : clips.filter((c) => this.allows(c.id));
  }

  /** For queries: the ids to keep (undefined: any) and the ids to leave out. */
  get sql(): { clipIds?: string[]; excludeClipIds: string[] } {
    if (this.only === null) return { excludeClipIds: [...this.withheld] };
    return { clipIds: [...this.only].filter((id) => !this.withheld.has(id)), excludeClipIds: [] };
  }
}

/** Roles that see every athlete of their club. */
const CLUB_WIDE_READERS: readonly Role[] = ['head_coach', 'analyst'];

export class AccessService {
  constructor(private readonly uow: UnitOfWork) {}

  require(principal: Principal, permission: Permission): void {
    if (!hasPermission(principal.role, permission)) throw forbidden(FORBIDDEN_MESSAGES[permission]);
  }

  /** Athlete ids the caller may read; null means every athlete of their club. */
  async visibleAthleteIds(principal: Principal): Promise<string[] | null> {
    switch (principal.role) {
      case 'head_coach':
      case 'analyst':
        return null;
      case 'coach':
        return this.uow.repos.athletes.idsInAgeGroups(principal.clubId, principal.coachedAgeGroupIds);
      case 'athlete':
        return principal.athleteId ? [principal.athleteId] : [];
      case 'guardian':
        return principal.childAthleteIds;
    }
  }

  /**
   * Which clips the caller may open beyond the athlete rule: athletes and guardians only those of a
   * published review of their athlete (and the baseline shown beside it); and everyone but the head
   * coach loses, at once, every clip showing an athlete whose consent is withdrawn.
   */
  async clipReach(principal: Principal): Promise<ClipReach> {
    const withheld =
      principal.role === 'head_coach'
        ? new Set<string>()
        : new Set(await this.uow.repos.athletes.withdrawnClipIds(principal.clubId));
    if (principal.role !== 'athlete' && principal.role !== 'guardian') return new ClipReach(null, withheld);
    const athleteIds = (await this.visibleAthleteIds(principal)) ?? [];
    return new ClipReach(new Set(await this.uow.repos.reviews.publishedClipIds(athleteIds)), withheld);
  }

  canSeeAthlete(principal: Principal, athlete: Athlete): boolean {
    if (athlete.clubId !== principal.clubId) return false;
    if (CLUB_WIDE_READERS.includes(principal.role)) return true;
    if (principal.role === 'coach') return principal.coachedAgeGroupIds.includes(athlete.ageGroupId);
    if (principal.role === 'athlete') return principal.athleteId === athlete.id;
    return principal.childAthleteIds.includes(athlete.id);
  }

  /** Upload, consent, invitations for this athlete: head coach, or a coach of the athlete's group. */
  canManageAthlete(principal: Principal, athlete: Athlete): boolean {
    if (athlete.clubId !== principal.clubId) return false;
    if (principal.role === 'head_coach') return true;
    return principal.role === 'coach' && principal.coachedAgeGroupIds.includes(athlete.ageGroupId);
  }

  canManageAgeGroup(principal: Principal, ageGroupId: string): boolean {
    if (principal.role === 'head_coach') return true;
    return principal.role === 'coach' && principal.coachedAgeGroupIds.includes(ageGroupId);
  }

  /** Analysts get no contact details of minors (guardian e-mails). */
  canSeeContactDetails(principal: Principal): boolean {
    return principal.role !== 'analyst';
  }
}
