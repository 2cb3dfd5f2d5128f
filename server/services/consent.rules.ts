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
  if (athlete.consentRecordedAt) return 'granted';
  return isMinor(athlete.birthYear, now) ? 'missing' : 'not_required';
}

export function mayStoreClipsOf(athlete: Athlete, now: Date): boolean {
  return consentStatus(athlete, now) !== 'missing';
}
