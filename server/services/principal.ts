import type { Role } from '@shared/schemas/auth.schema';
import type { User } from '../entities/user.entity';

/** The signed-in member a request acts for, with the links that decide their reach. */
export interface Principal {
  user: User;
  role: Role;
  clubId: string;
  athleteId: string | null;
  childAthleteIds: string[];
  coachedAgeGroupIds: string[];
  /** The sign-in session the request's token belongs to (media links are bound to it too). */
  sessionId: string | null;
}

export interface Clock {
  now(): Date;
}

export const systemClock: Clock = { now: () => new Date() };
