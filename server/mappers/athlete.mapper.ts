import type { AgeGroupDto, AthleteDetailDto, AthleteDto, GuardianDto } from '@shared/schemas/athlete.schema';
import type { AgeGroup } from '../entities/age-group.entity';
import type { Athlete } from '../entities/athlete.entity';
import type { User } from '../entities/user.entity';
import { consentManagedBy, consentStatus, mayEmailReviewsOf } from '../services/consent.rules';

export function toAgeGroupDto(group: AgeGroup): AgeGroupDto {
  return { id: group.id, name: group.name, minAge: group.minAge, maxAge: group.maxAge };
}

export function toAthleteDto(athlete: Athlete, group: AgeGroup, clipCount: number, now: Date): AthleteDto {
  return {
    id: athlete.id,
    firstName: athlete.firstName,
    lastName: athlete.lastName,
    birthYear: athlete.birthYear,
    ageGroup: toAgeGroupDto(group),
    consent: {
      status: consentStatus(athlete, now),
      recordedAt: athlete.consentRecordedAt ? athlete.consentRecordedAt.toISOString() : null,
      guardianName: athlete.consentGuardianName,
      shareByEmail: mayEmailReviewsOf(athlete, now),
      withdrawnAt: athlete.consentWithdrawnAt ? athlete.consentWithdrawnAt.toISOString() : null,
      erasureDueAt: athlete.erasureDueAt ? athlete.erasureDueAt.toISOString() : null,
      managedBy: consentManagedBy(athlete, now),
    },
    clipCount,
  };
}

export function toGuardianDto(user: User, showContact: boolean): GuardianDto {
  return { id: user.id, name: user.name, email: showContact ? user.email : null };
}

export function toAthleteDetailDto(
  athlete: Athlete,
  group: AgeGroup,
  clipCount: number,
  guardians: User[],
  showContact: boolean,
  now: Date,
): AthleteDetailDto {
  return {
    ...toAthleteDto(athlete, group, clipCount, now),
    guardians: guardians.map((g) => toGuardianDto(g, showContact)),
  };
}
