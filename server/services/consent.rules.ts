import type { ConsentStatus } from '@shared/schemas/athlete.schema';
import type { Athlete } from '../entities/athlete.entity';

export const AGE_OF_MAJORITY = 18;

/**
 * Only the birth year is known, so someone whose birth year is 18 years back may still be 17:
 * they count as a minor until the year after, which errs on the side of asking for consent.
 */
export function isMinor(birthYear: number, now: Date): boolean {
  return now.getUTCFullYear() - birthYear <= AGE_OF_MAJORITY;
}

export function consentStatus(athlete: Athlete, now: Date): ConsentStatus {
  if (athlete.consentWithdrawnAt) return 'withdrawn';
  if (athlete.consentRecordedAt) return 'granted';
  return isMinor(athlete.birthYear, now) ? 'missing' : 'not_required';
}

export function mayStoreClipsOf(athlete: Athlete, now: Date): boolean {
  const status = consentStatus(athlete, now);
  return status === 'granted' || status === 'not_required';
}

/** Reviews go out by e-mail with a guardian's consent for that purpose; adults decide for themselves. */
export function mayEmailReviewsOf(athlete: Athlete, now: Date): boolean {
  if (athlete.consentWithdrawnAt) return false;
  return !isMinor(athlete.birthYear, now) || athlete.consentShareByEmail;
}

/** Who decides about consent: a guardian until the athlete is an adult, then the athlete. */
export function consentManagedBy(athlete: Athlete, now: Date): 'guardian' | 'athlete' {
  return isMinor(athlete.birthYear, now) ? 'guardian' : 'athlete';
}

/** A guardian reaches a child until the child is an adult; then only if the athlete keeps them. */
export function guardianStillReaches(birthYear: number, keptByAthleteAt: Date | null, now: Date): boolean {
  return isMinor(birthYear, now) || keptByAthleteAt !== null;
}
