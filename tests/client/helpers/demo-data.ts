import type { AthleteDetailDto, AgeGroupDto } from '@shared/schemas/athlete.schema';
import type { Role, UserDto } from '@shared/schemas/auth.schema';
import type { ClipDto } from '@shared/schemas/clip.schema';
import type { SessionDto } from '@shared/schemas/session.schema';

// Invented records for client tests; ids are fixed UUIDs so schemas accept them.
export const U14: AgeGroupDto = {
  id: '10000000-0000-4000-8000-000000000014',
  name: 'U14',
  minAge: 12,
  maxAge: 13,
};

export function userWith(role: Role, extra: Partial<UserDto> = {}): UserDto {
  return {
    id: '20000000-0000-4000-8000-000000000001',
    email: `${role}@club.example`,
    name: 'Alex Tester',
    role,
    clubId: '30000000-0000-4000-8000-000000000001',
    athleteId: null,
    childAthleteIds: [],
    coachedAgeGroupIds: role === 'coach' ? [U14.id] : [],
    ...extra,
  };
}

export const ATHLETE_NO_CONSENT: AthleteDetailDto = {
  id: '40000000-0000-4000-8000-000000000001',
  firstName: 'Juno',
  lastName: 'Fairweather',
  birthYear: 2013,
  ageGroup: U14,
  consent: {
    status: 'missing',
    recordedAt: null,
    guardianName: null,
    shareByEmail: false,
    withdrawnAt: null,
    erasureDueAt: null,
    managedBy: 'guardian',
  },
  clipCount: 0,
  guardians: [
    { id: '50000000-0000-4000-8000-000000000001', name: 'Rowan Fairweather', email: 'rowan@home.example' },
  ],
};

export const ATHLETE_WITH_CONSENT: AthleteDetailDto = {
  ...ATHLETE_NO_CONSENT,
  id: '40000000-0000-4000-8000-000000000002',
  firstName: 'Pia',
  lastName: 'Underhill',
  consent: {
    ...ATHLETE_NO_CONSENT.consent,
    status: 'granted',
    recordedAt: '2026-11-02T09:00:00.000Z',
    guardianName: 'Sam Underhill',
    shareByEmail: true,
  },
};

export const SESSION: SessionDto = {
  id: '60000000-0000-4000-8000-000000000001',
  date: '2026-12-14',
  venue: 'North Bowl, lower run',
  discipline: 'slalom',
  snow: 'hard',
  notes: null,
  clipCount: 0,
};

const CLIP_BASE = {
  id: '70000000-0000-4000-8000-000000000001',
  sessionId: SESSION.id,
  athletes: [{ id: ATHLETE_WITH_CONSENT.id, name: 'Pia Underhill' }],
  view: 'side',
  status: 'ready',
  failureReason: null,
  originalName: 'gs-run-3.mp4',
  sizeBytes: 4096,
  codec: 'h264',
  width: 640,
  height: 360,
  fps: 30,
  frameCount: 90,
  durationMs: 3000,
  createdAt: '2026-12-14T12:00:00.000Z',
  mediaUrl: '/api/clips/70000000-0000-4000-8000-000000000001/media?token=t',
  posterUrl: null,
} satisfies Partial<ClipDto>;

/** A clip as the API returns it; fields that later issues add and these tests do not read stay unset. */
export function clipFixture(overrides: Partial<ClipDto> = {}): ClipDto {
  return { ...CLIP_BASE, ...overrides } as ClipDto;
}
