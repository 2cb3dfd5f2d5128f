import { describe, expect, it } from 'vitest';
import { ROLES } from '@shared/schemas/auth.schema';
import { can, landingPathFor, navFor, readsBandsAsTarget } from '@/lib/permissions';

// Expected sections per role: the role table (shared/access/permissions.ts) as the foundation work spelled it out for the
// navigation (head coach: all; coach: Athletes, Sessions, Upload; athlete and guardian: Home; analyst:
// Athletes, Sessions, read-only).
const NAV: Record<(typeof ROLES)[number], string[]> = {
  head_coach: ['Home', 'Athletes', 'Sessions', 'Upload', 'Standards', 'Exports', 'Club'],
  coach: ['Home', 'Athletes', 'Sessions', 'Upload', 'Standards', 'Exports'],
  analyst: ['Athletes', 'Sessions', 'Standards', 'Exports'],
  athlete: ['Home'],
  guardian: ['Home'],
};

describe('role navigation', () => {
  it.each(ROLES)('%s sees exactly its sections', (role) => {
    expect(navFor(role).map((item) => item.label)).toEqual(NAV[role]);
  });

  it('has athletes and guardians read bands as their target range, staff as flags', () => {
    expect(ROLES.filter((role) => readsBandsAsTarget(role))).toEqual(['athlete', 'guardian']);
  });

  it('lands each role on its first section', () => {
    expect(landingPathFor('head_coach')).toBe('/');
    // Coaches land on their flag inbox.
    expect(landingPathFor('coach')).toBe('/');
    expect(landingPathFor('analyst')).toBe('/athletes');
    expect(landingPathFor('athlete')).toBe('/');
    expect(landingPathFor('guardian')).toBe('/');
  });

  it('keeps analysts, athletes and guardians from creating anything', () => {
    for (const role of ['analyst', 'athlete', 'guardian'] as const) {
      expect(can(role, 'athletes.create')).toBe(false);
      expect(can(role, 'sessions.create')).toBe(false);
      expect(can(role, 'clips.upload')).toBe(false);
      expect(can(role, 'consent.record')).toBe(false);
    }
    expect(can('coach', 'club.manage')).toBe(false);
    expect(can('head_coach', 'club.manage')).toBe(true);
  });
});
