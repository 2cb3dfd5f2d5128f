import type { UserDto } from '@shared/schemas/auth.schema';
import type { Principal } from '../services/principal';

export function toUserDto(principal: Principal): UserDto {
  return {
    id: principal.user.id,
    email: principal.user.email,
    name: principal.user.name,
    role: principal.role,
    clubId: principal.clubId,
    athleteId: principal.athleteId,
    childAthleteIds: principal.childAthleteIds,
    coachedAgeGroupIds: principal.coachedAgeGroupIds,
  };
}
