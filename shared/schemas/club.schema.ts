import type { Role } from './auth.schema';

/** One person with a sign-in in the club, as the head coach's Club page lists them. */
export interface ClubMemberDto {
  id: string;
  name: string;
  email: string;
  role: Role;
  /** For coaches: the age groups they coach (names, e.g. "U12"). */
  ageGroups: string[];
  /** For athletes and guardians: the athletes linked to the sign-in. */
  athletes: { id: string; name: string }[];
}

export interface PendingInvitationDto {
  id: string;
  email: string;
  role: Role;
  expiresAt: string;
}

/** GET /api/club/members (head coach only). */
export interface ClubMemberListResponse {
  members: ClubMemberDto[];
  invitations: PendingInvitationDto[];
}
