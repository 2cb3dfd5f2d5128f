import type { Role } from '@shared/schemas/auth.schema';
import type { DataSource } from 'typeorm';
import type { Athlete } from '../entities/athlete.entity';
import { forbidden } from '../errors';
import { AthleteRepository } from '../repositories/athlete.repository';
import type { Principal } from './principal';

/**
 * The role table of the product, in one place. Routes name the permission they need
 * (`authorize(...)`), services narrow records to the caller's reach with the helpers below.
 *
 * - head coach: everything in the club
 * - coach: athletes of the age groups they coach (upload, consent, invitations); reads club sessions
 * - athlete: only their own record and clips
 * - guardian: read-only view of their own children
 * - analyst: read-only across the club, no contact details of minors, creates nothing
 */
export const PERMISSIONS = {
  'me:read': ['head_coach', 'coach', 'athlete', 'guardian', 'analyst'],
  'age_group:read': ['head_coach', 'coach', 'athlete', 'guardian', 'analyst'],
  'athlete:read': ['head_coach', 'coach', 'athlete', 'guardian', 'analyst'],
  'athlete:create': ['head_coach', 'coach'],
  'athlete:consent': ['head_coach', 'coach'],
  'session:read': ['head_coach', 'coach', 'athlete', 'guardian', 'analyst'],
  'session:create': ['head_coach', 'coach'],
  'clip:read': ['head_coach', 'coach', 'athlete', 'guardian', 'analyst'],
  'clip:upload': ['head_coach', 'coach'],
  'clip:analyse': ['head_coach', 'coach'],
  'note:read': ['head_coach', 'coach', 'analyst'],
  'note:write': ['head_coach', 'coach'],
  'tolerance:read': ['head_coach', 'coach', 'athlete', 'guardian', 'analyst'],
  'invitation:create': ['head_coach', 'coach'],
  'club:members': ['head_coach'],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

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
  'note:read': 'Notes are shared with athletes and guardians only when a review is published',
  'note:write': 'Only coaches and the head coach can write notes',
  'tolerance:read': 'Your role cannot view tolerance bands',
  'invitation:create': 'Only coaches and the head coach can invite members',
  'club:members': 'Only the head coach can see the member list',
};

/** Roles that see every athlete of their club. */
const CLUB_WIDE_READERS: readonly Role[] = ['head_coach', 'analyst'];

export function hasPermission(role: Role, permission: Permission): boolean {
  return (PERMISSIONS[permission] as readonly Role[]).includes(role);
}

export class AccessService {
  constructor(private readonly dataSource: DataSource) {}

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
        return new AthleteRepository(this.dataSource.manager).idsInAgeGroups(
          principal.clubId,
          principal.coachedAgeGroupIds,
        );
      case 'athlete':
        return principal.athleteId ? [principal.athleteId] : [];
      case 'guardian':
        return principal.childAthleteIds;
    }
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
