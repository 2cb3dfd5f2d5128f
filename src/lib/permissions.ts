import { hasPermission, type Permission } from '@shared/access/permissions';
import type { Role } from '@shared/schemas/auth.schema';
import { paths } from '@/config/paths';

// What the client hides, read from the server's own role table (shared/access); it only hides what the
// server refuses anyway.
export type Capability =
  | 'home.view'
  | 'athletes.view'
  | 'athletes.create'
  | 'consent.record'
  | 'sessions.view'
  | 'sessions.create'
  | 'clips.upload'
  | 'clips.analyse'
  | 'club.manage'
  | 'notes.read'
  | 'tolerances.view'
  | 'exports.view'
  | 'flags.review'
  | 'seasons.create'
  | 'compare.keepStill'
  | 'reviews.write'
  | 'clips.erase'
  | 'athletes.erase'
  | 'consent.read'
  | 'consent.decide'
  | 'athletes.export'
  | 'privacy.manage';

// Each control the client hides maps onto a row of the one role table the server enforces.
const CAPABILITY_PERMISSION: Record<Capability, Permission> = {
  'home.view': 'section:home',
  'athletes.view': 'section:athletes',
  'athletes.create': 'athlete:create',
  'consent.record': 'athlete:consent',
  'sessions.view': 'section:sessions',
  'sessions.create': 'session:create',
  'clips.upload': 'clip:upload',
  'clips.analyse': 'clip:analyse',
  'club.manage': 'club:members',
  'notes.read': 'note:read',
  'tolerances.view': 'section:tolerances',
  'exports.view': 'section:exports',
  'flags.review': 'flag:review',
  'seasons.create': 'season:write',
  'compare.keepStill': 'compare:write',
  'reviews.write': 'review:write',
  'clips.erase': 'clip:erase',
  'athletes.erase': 'athlete:erase',
  'consent.read': 'consent:read',
  'consent.decide': 'consent:decide',
  'athletes.export': 'athlete:export',
  'privacy.manage': 'privacy:manage',
};

export const ROLE_LABELS: Record<Role, string> = {
  head_coach: 'Head coach',
  coach: 'Coach',
  analyst: 'Analyst',
  athlete: 'Athlete',
  guardian: 'Guardian',
};

export function can(role: Role, capability: Capability): boolean {
  return hasPermission(role, CAPABILITY_PERMISSION[capability]);
}

export interface NavItem {
  label: string;
  to: string;
  capability: Capability;
}

const NAV: readonly NavItem[] = [
  { label: 'Home', to: paths.home.href(), capability: 'home.view' },
  { label: 'Athletes', to: paths.athletes.href(), capability: 'athletes.view' },
  { label: 'Sessions', to: paths.sessions.href(), capability: 'sessions.view' },
  { label: 'Upload', to: paths.upload.href(), capability: 'clips.upload' },
  { label: 'Standards', to: paths.tolerances.href(), capability: 'tolerances.view' },
  { label: 'Exports', to: paths.exports.href(), capability: 'exports.view' },
  { label: 'Club', to: paths.club.href(), capability: 'club.manage' },
];

export function navFor(role: Role): NavItem[] {
  return NAV.filter((item) => can(role, item.capability));
}

/** Where a role lands after signing in: its first section. */
export function landingPathFor(role: Role): string {
  return navFor(role)[0]?.to ?? paths.home.href();
}

/** Athletes and guardians read a band as their target range, never as an alarm about the athlete. */
export function readsBandsAsTarget(role: Role): boolean {
  return role === 'athlete' || role === 'guardian';
}
