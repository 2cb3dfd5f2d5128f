import type { Role } from '../schemas/auth.schema';

/**
 * The role table of the product, in one place for the server and the client. The server checks it on
 * every route (`authorize(permission)`) and then narrows records to the caller's reach; the client reads
 * the same table to hide what the server would refuse, and to choose the sections each role sees.
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
  // The head coach erases any clip; a coach the clips they uploaded (narrowed in the service).
  'clip:erase': ['head_coach', 'coach'],
  'note:read': ['head_coach', 'coach', 'analyst'],
  'note:write': ['head_coach', 'coach'],
  'tolerance:read': ['head_coach', 'coach', 'athlete', 'guardian', 'analyst'],
  // Coaches set the bands of the groups they coach, the head coach every group's (narrowed in the service).
  'tolerance:write': ['head_coach', 'coach'],
  'flag:read': ['head_coach', 'coach', 'athlete', 'guardian', 'analyst'],
  'flag:review': ['head_coach', 'coach'],
  'job:read': ['head_coach', 'coach', 'analyst'],
  // Everyone exports what they may see: staff their reach, athletes and guardians their own rows.
  'export:read': ['head_coach', 'coach', 'athlete', 'guardian', 'analyst'],
  'season:read': ['head_coach', 'coach', 'athlete', 'guardian', 'analyst'],
  'season:write': ['head_coach'],
  // Athletes and guardians read their own plan; coaches edit the plans of their groups (narrowed in the service).
  'plan:read': ['head_coach', 'coach', 'athlete', 'guardian', 'analyst'],
  'plan:write': ['head_coach', 'coach'],
  'compare:read': ['head_coach', 'coach', 'athlete', 'guardian', 'analyst'],
  'compare:write': ['head_coach', 'coach'],
  // Staff read reviews within their reach; athletes and guardians read published reviews of their own.
  'review:read': ['head_coach', 'coach', 'athlete', 'guardian', 'analyst'],
  'review:write': ['head_coach', 'coach'],
  'invitation:create': ['head_coach', 'coach'],
  'club:members': ['head_coach'],
  'athlete:erase': ['head_coach'],
  // The consent record: staff who look after the athlete, the athlete and guardians (no analysts).
  'consent:read': ['head_coach', 'coach', 'athlete', 'guardian'],
  // Withdrawing or restoring: a guardian for a minor, the athlete once 18, or the head coach recording
  // their request (narrowed in the service).
  'consent:decide': ['head_coach', 'athlete', 'guardian'],
  // All of an athlete's data as one download: the athlete, their guardians, the head coach on request.
  'athlete:export': ['head_coach', 'athlete', 'guardian'],
  'privacy:manage': ['head_coach'],
  // Sections of the app: which pages a role is sent to. The reads behind them are the rows above.
  'section:home': ['head_coach', 'coach', 'athlete', 'guardian'],
  'section:tolerances': ['head_coach', 'coach', 'analyst'],
  'section:exports': ['head_coach', 'coach', 'analyst'],
  'section:athletes': ['head_coach', 'coach', 'analyst'],
  'section:sessions': ['head_coach', 'coach', 'analyst'],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

export function hasPermission(role: Role, permission: Permission): boolean {
  return (PERMISSIONS[permission] as readonly Role[]).includes(role);
}
