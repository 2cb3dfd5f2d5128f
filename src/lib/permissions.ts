import type { Role } from '@shared/schemas/auth.schema';
import { paths } from '@/config/paths';

// The client's copy of the role table in PRODUCT.md. It only hides what the server refuses anyway.
export type Capability =
  | 'home.view'
  | 'athletes.view'
  | 'athletes.create'
  | 'consent.record'
  | 'sessions.view'
  | 'sessions.create'
  | 'clips.upload'
  | 'clips.analyse'
  | 'club.manage';

const CAPABILITIES: Record<Role, readonly Capability[]> = {
  head_coach: [
    'home.view',
    'athletes.view',
    'athletes.create',
    'consent.record',
    'sessions.view',
    'sessions.create',
    'clips.upload',
    'clips.analyse',
    'club.manage',
  ],
  coach: [
    'athletes.view',
    'athletes.create',
    'consent.record',
    'sessions.view',
    'sessions.create',
    'clips.upload',
    'clips.analyse',
  ],
  analyst: ['athletes.view', 'sessions.view'],
  athlete: ['home.view'],
  guardian: ['home.view'],
};

export const ROLE_LABELS: Record<Role, string> = {
  head_coach: 'Head coach',
  coach: 'Coach',
  analyst: 'Analyst',
  athlete: 'Athlete',
  guardian: 'Guardian',
};

export function can(role: Role, capability: Capability): boolean {
  return CAPABILITIES[role].includes(capability);
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
  { label: 'Club', to: paths.club.href(), capability: 'club.manage' },
];

export function navFor(role: Role): NavItem[] {
  return NAV.filter((item) => can(role, item.capability));
}

/** Where a role lands after signing in: its first section. */
export function landingPathFor(role: Role): string {
  return navFor(role)[0]?.to ?? paths.home.href();
}
