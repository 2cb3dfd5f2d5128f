import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestServer, type DemoRole, type TestServer } from '../helpers/server-harness';
import { listRoutes } from '../helpers/route-list';
import { removeVideoFixtures, videoFixture, type VideoFixture } from '../helpers/video-fixture';

// The role table (shared/access/permissions.ts, README "Demo sign-ins" for the roles) as expected HTTP statuses, one row per route and
// target. 404 where the record is outside the caller's reach (403 would confirm it exists), 403 where
// the caller may see but not change, 401 without a token.

interface Ids {
  elsie: string; // the demo athlete, U14, consent recorded; child of the demo guardian
  kit: string; // her U14 teammate
  signe: string; // U16: not coached by coach@
  noor: string; // U12, no consent yet
  u14: string;
  u16: string;
  s1: string; // holds clips of Elsie and Signe
  s2: string; // holds a clip of Kit only
  clipElsie: string;
  /** Elsie's clip that no published review shares: athletes and guardians cannot open it. */
  clipElsieUnshared: string;
  /** Clips to erase: one the head coach uploaded, two the coach did (one for the coach, one for the head coach). */
  eraseByHead: string;
  eraseByCoach: string;
  eraseByCoachForHead: string;
  /** An athlete with no clips, for the head coach to erase. */
  eraseAthlete: string;
  clipKit: string;
  clipSigne: string;
  /** A note on Elsie's clip by the head coach, and one by the coach. */
  noteByHead: string;
  noteByCoach: string;
  /** One throwaway note per role (by head, and by coach) for DELETE, so each call has its own target. */
  doomedByHead: Record<DemoRole, string>;
  doomedByCoach: Record<DemoRole, string>;
  /** A flag on Elsie's clip (U14, coached by coach@) and one on Signe's (U16, not). */
  flagElsie: string;
  flagSigne: string;
  /** A re-evaluation job the head coach's band change queued. */
  job: string;
  /** A season holding every session, focus points of Elsie and Signe, two of Kit's to reorder. */
  season: string;
  pointElsie: string;
  pointSigne: string;
  pointsKit: string[];
  /** One focus point of Elsie per role, for DELETE. */
  doomedPoint: Record<DemoRole, string>;
  /** A side-by-side still of Elsie's clip with Kit's. */
  still: string;
  /** A published review of Elsie, one of Signe, a draft of Elsie; per role a draft to publish and a review to withdraw. */
  reviewElsie: string;
  reviewSigne: string;
  reviewDraft: string;
  toPublish: Record<DemoRole, string>;
  toWithdraw: Record<DemoRole, string>;
  /** Elsie's brother (U12), the demo guardian's other child: the guardian withdraws and restores his consent. */
  finn: string;
  /** A U14 athlete with consent, for the head coach to withdraw and restore on a guardian's request. */
  withdrawByHead: string;
  /** The demo guardian's user id. */
  guardianUser: string; /** A clip of a U14 athlete whose consent the head coach withdrew (still within the grace period). */
  clipWithdrawn: string;
}

type Expect = Record<DemoRole, number>;

interface Row {
  route: string;
  target: string;
  path: (ids: Ids, role: DemoRole) => string;
  body?: (ids: Ids, role: DemoRole) => object;
  upload?: (ids: Ids) => Record<string, string>;
  range?: boolean;
  expect: Expect;
}

// Side-view keypoints of one frame (pixels): enough for the server to compute metrics.
const FRAME = {
  frameIndex: 0,
  timeMs: 0,
  keypoints: [
    { name: 'left_shoulder', x: 80, y: 30, score: 0.9 },
    { name: 'left_hip', x: 78, y: 60, score: 0.9 },
    { name: 'left_knee', x: 86, y: 85, score: 0.9 },
    { name: 'left_ankle', x: 80, y: 110, score: 0.9 },
  ],
};

/** A 1 × 1 PNG (the smallest still the server accepts). */
const ONE_PIXEL_PNG =
  'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==';

const all = (status: number): Expect => ({
  head: status,
  coach: status,
  analyst: status,
  athlete: status,
  guardian: status,
});
const staffOnly = (ok: number): Expect => ({
  head: ok,
  coach: ok,
  analyst: 403,
  athlete: 403,
  guardian: 403,
});

let seq = 0;
const ROWS: Row[] = [
  { route: 'GET /api/me', target: 'self', path: () => '/api/me', expect: all(200) },
  {
    route: 'POST /api/auth/password',
    target: 'own account, wrong current password',
    path: () => '/api/auth/password',
    body: () => ({ currentPassword: 'not-my-password', newPassword: 'granite ridge morning wax' }),
    expect: all(400),
  },
  { route: 'GET /api/age-groups', target: 'club', path: () => '/api/age-groups', expect: all(200) },
  { route: 'GET /api/athletes', target: 'list (scoped)', path: () => '/api/athletes', expect: all(200) },
  {
    route: 'POST /api/athletes',
    target: 'into U14 (coached)',
    path: () => '/api/athletes',
    body: (ids) => ({
      firstName: 'Pia',
      lastName: `Newcomer${(seq += 1)}`,
      birthYear: 2013,
      ageGroupId: ids.u14,
    }),
    expect: staffOnly(201),
  },
  {
    route: 'POST /api/athletes',
    target: 'into U16 (not coached)',
    path: () => '/api/athletes',
    body: (ids) => ({
      firstName: 'Ola',
      lastName: `Newcomer${(seq += 1)}`,
      birthYear: 2011,
      ageGroupId: ids.u16,
    }),
    expect: { ...staffOnly(201), coach: 403 },
  },
  {
    route: 'GET /api/athletes/:id',
    target: 'own / own child',
    path: (i) => `/api/athletes/${i.elsie}`,
    expect: all(200),
  },
  {
    route: 'GET /api/athletes/:id',
    target: 'teammate',
    path: (i) => `/api/athletes/${i.kit}`,
    expect: { head: 200, coach: 200, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/athletes/:id',
    target: 'other group',
    path: (i) => `/api/athletes/${i.signe}`,
    expect: { head: 200, coach: 404, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/athletes/:id/clips',
    target: 'own / own child',
    path: (i) => `/api/athletes/${i.elsie}/clips`,
    expect: all(200),
  },
  {
    route: 'GET /api/athletes/:id/clips',
    target: 'teammate',
    path: (i) => `/api/athletes/${i.kit}/clips`,
    expect: { head: 200, coach: 200, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'POST /api/athletes/:id/consent',
    target: 'U12 athlete (coached)',
    path: (i) => `/api/athletes/${i.noor}/consent`,
    body: () => ({ guardianName: 'Hal Dunmore', method: 'in_person' }),
    expect: { head: 200, coach: 200, analyst: 403, athlete: 403, guardian: 403 },
  },
  {
    route: 'POST /api/athletes/:id/consent',
    target: 'own record',
    path: (i) => `/api/athletes/${i.elsie}/consent`,
    body: () => ({ guardianName: 'Ruth Marrow', method: 'email' }),
    expect: { head: 200, coach: 200, analyst: 403, athlete: 403, guardian: 403 },
  },
  {
    route: 'POST /api/athletes/:id/consent',
    target: 'other group',
    path: (i) => `/api/athletes/${i.signe}/consent`,
    body: () => ({ guardianName: 'Rafe Ivers', method: 'email' }),
    expect: { head: 200, coach: 404, analyst: 403, athlete: 403, guardian: 403 },
  },
  { route: 'GET /api/sessions', target: 'list (scoped)', path: () => '/api/sessions', expect: all(200) },
  {
    route: 'POST /api/sessions',
    target: 'new session',
    path: () => '/api/sessions',
    body: () => ({ date: '2026-12-20', venue: 'Pinebrook Slope', discipline: 'slalom', snow: 'hard' }),
    expect: staffOnly(201),
  },
  {
    route: 'GET /api/sessions/:id',
    target: 'with own clip',
    path: (i) => `/api/sessions/${i.s1}`,
    expect: all(200),
  },
  {
    route: 'GET /api/sessions/:id',
    target: 'only teammate clips',
    path: (i) => `/api/sessions/${i.s2}`,
    expect: { head: 200, coach: 200, analyst: 200, athlete: 404, guardian: 404 },
  },
  { route: 'GET /api/clips', target: 'list (scoped)', path: () => '/api/clips', expect: all(200) },
  {
    route: 'POST /api/clips',
    target: 'clip of own athlete',
    path: () => '/api/clips',
    upload: (i) => ({ sessionId: i.s1, athleteIds: i.elsie, view: 'side' }),
    expect: staffOnly(201),
  },
  {
    route: 'POST /api/clips',
    target: 'clip of other group',
    path: () => '/api/clips',
    upload: (i) => ({ sessionId: i.s1, athleteIds: i.signe, view: 'side' }),
    expect: { ...staffOnly(201), coach: 404 },
  },
  {
    route: 'GET /api/clips/:id',
    target: 'own clip',
    path: (i) => `/api/clips/${i.clipElsie}`,
    expect: all(200),
  },
  {
    // Withdrawn consent hides the clip at once from everyone but the head coach.
    route: 'GET /api/clips/:id',
    target: 'clip of a U14 athlete whose consent is withdrawn',
    path: (i) => `/api/clips/${i.clipWithdrawn}`,
    expect: { head: 200, coach: 404, analyst: 404, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/clips/:id',
    target: 'teammate clip',
    path: (i) => `/api/clips/${i.clipKit}`,
    expect: { head: 200, coach: 200, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/clips/:id',
    target: 'other group clip',
    path: (i) => `/api/clips/${i.clipSigne}`,
    expect: { head: 200, coach: 404, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/clips/:id/media',
    target: 'own clip',
    path: (i) => `/api/clips/${i.clipElsie}/media`,
    range: true,
    expect: all(206),
  },
  {
    route: 'GET /api/clips/:id',
    target: 'own clip, not shared by a published review',
    path: (i) => `/api/clips/${i.clipElsieUnshared}`,
    expect: { head: 200, coach: 200, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/clips/:id/media',
    target: 'own clip, not shared by a published review',
    path: (i) => `/api/clips/${i.clipElsieUnshared}/media`,
    range: true,
    expect: { head: 206, coach: 206, analyst: 206, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/clips/:id/frames',
    target: 'own clip, not shared by a published review',
    path: (i) => `/api/clips/${i.clipElsieUnshared}/frames`,
    expect: { head: 200, coach: 200, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/clips/:id/media',
    target: 'teammate clip',
    path: (i) => `/api/clips/${i.clipKit}/media`,
    range: true,
    expect: { head: 206, coach: 206, analyst: 206, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/clips/:id/media',
    target: 'other group clip',
    path: (i) => `/api/clips/${i.clipSigne}/media`,
    range: true,
    expect: { head: 206, coach: 404, analyst: 206, athlete: 404, guardian: 404 },
  },
  {
    route: 'POST /api/invitations',
    target: 'guardian of a coached athlete',
    path: () => '/api/invitations',
    body: (i, role) => ({
      email: `guardian-${role}-${(seq += 1)}@larchwood.example`,
      role: 'guardian',
      athleteId: i.kit,
    }),
    expect: staffOnly(201),
  },
  {
    route: 'POST /api/invitations',
    target: 'guardian of an athlete in another group',
    path: () => '/api/invitations',
    body: (i, role) => ({
      email: `other-${role}-${(seq += 1)}@larchwood.example`,
      role: 'guardian',
      athleteId: i.signe,
    }),
    expect: { ...staffOnly(201), coach: 404 },
  },
  {
    route: 'POST /api/invitations',
    target: 'a new coach',
    path: () => '/api/invitations',
    body: (i, role) => ({
      email: `coach-${role}-${(seq += 1)}@larchwood.example`,
      role: 'coach',
      ageGroupIds: [i.u16],
    }),
    expect: { ...staffOnly(201), coach: 403 },
  },
  {
    route: 'GET /api/club/members',
    target: 'club',
    path: () => '/api/club/members',
    expect: { head: 200, coach: 403, analyst: 403, athlete: 403, guardian: 403 },
  },
  {
    route: 'PATCH /api/clips/:id',
    target: 'own clip',
    path: (i) => `/api/clips/${i.clipElsie}`,
    body: () => ({ defaultModel: 'thunder' }),
    expect: staffOnly(200),
  },
  {
    route: 'PATCH /api/clips/:id',
    target: 'other group clip',
    path: (i) => `/api/clips/${i.clipSigne}`,
    body: () => ({ defaultModel: 'thunder' }),
    expect: { ...staffOnly(200), coach: 404 },
  },
  {
    route: 'GET /api/clips/:id/poster',
    target: 'own clip',
    path: (i) => `/api/clips/${i.clipElsie}/poster`,
    expect: all(200),
  },
  {
    route: 'GET /api/clips/:id/poster',
    target: 'teammate clip',
    path: (i) => `/api/clips/${i.clipKit}/poster`,
    expect: { head: 200, coach: 200, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/clips/:id/thumbnails',
    target: 'own clip',
    path: (i) => `/api/clips/${i.clipElsie}/thumbnails`,
    expect: all(200),
  },
  {
    route: 'GET /api/clips/:id/thumbnails',
    target: 'other group clip',
    path: (i) => `/api/clips/${i.clipSigne}/thumbnails`,
    expect: { head: 200, coach: 404, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'POST /api/clips/:id/frames',
    target: 'own clip',
    path: (i) => `/api/clips/${i.clipElsie}/frames`,
    body: () => ({ model: 'lightning', frames: [FRAME] }),
    expect: staffOnly(200),
  },
  {
    route: 'POST /api/clips/:id/frames',
    target: 'other group clip',
    path: (i) => `/api/clips/${i.clipSigne}/frames`,
    body: () => ({ model: 'lightning', frames: [FRAME] }),
    expect: { ...staffOnly(200), coach: 404 },
  },
  {
    route: 'GET /api/clips/:id/server-analysis',
    target: 'own clip',
    path: (i) => `/api/clips/${i.clipElsie}/server-analysis`,
    expect: all(200),
  },
  {
    route: 'GET /api/clips/:id/server-analysis',
    target: 'teammate clip',
    path: (i) => `/api/clips/${i.clipKit}/server-analysis`,
    expect: { head: 200, coach: 200, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'POST /api/clips/:id/server-analysis',
    target: 'own clip',
    path: (i) => `/api/clips/${i.clipElsie}/server-analysis`,
    body: () => ({}),
    expect: staffOnly(202),
  },
  {
    route: 'POST /api/clips/:id/server-analysis',
    target: 'other group clip',
    path: (i) => `/api/clips/${i.clipSigne}/server-analysis`,
    body: () => ({ model: 'thunder' }),
    expect: { ...staffOnly(202), coach: 404 },
  },
  {
    route: 'GET /api/clips/:id/frames',
    target: 'own clip',
    path: (i) => `/api/clips/${i.clipElsie}/frames?model=lightning`,
    expect: all(200),
  },
  {
    route: 'GET /api/clips/:id/frames',
    target: 'teammate clip',
    path: (i) => `/api/clips/${i.clipKit}/frames`,
    expect: { head: 200, coach: 200, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'PUT /api/clips/:id/frames/:frameIndex',
    target: 'own clip',
    path: (i) => `/api/clips/${i.clipElsie}/frames/1`,
    body: () => ({ model: 'lightning', keypoints: FRAME.keypoints }),
    expect: staffOnly(200),
  },
  {
    route: 'PUT /api/clips/:id/frames/:frameIndex',
    target: 'other group clip',
    path: (i) => `/api/clips/${i.clipSigne}/frames/1`,
    body: () => ({ model: 'lightning', keypoints: FRAME.keypoints }),
    expect: { ...staffOnly(200), coach: 404 },
  },
  {
    route: 'GET /api/tolerance-bands',
    target: 'U14',
    path: (i) => `/api/tolerance-bands?ageGroupId=${i.u14}`,
    expect: all(200),
  },
  {
    route: 'GET /api/tolerance-bands/history',
    target: 'U14',
    path: (i) => `/api/tolerance-bands/history?ageGroupId=${i.u14}`,
    expect: all(200),
  },
  {
    route: 'PUT /api/tolerance-bands/:ageGroupId/:metric',
    target: 'a group the coach coaches (U14)',
    path: (i) => `/api/tolerance-bands/${i.u14}/kneeSeparationRatio`,
    body: () => ({ min: 0.75, max: 1.3, target: 1 }),
    expect: { ...staffOnly(200), analyst: 403 },
  },
  {
    route: 'PUT /api/tolerance-bands/:ageGroupId/:metric',
    target: 'a group the coach does not coach (U16)',
    path: (i) => `/api/tolerance-bands/${i.u16}/kneeSeparationRatio`,
    body: () => ({ min: 0.75, max: 1.3, target: 1 }),
    expect: { ...staffOnly(200), coach: 403, analyst: 403 },
  },
  {
    route: 'POST /api/tolerance-bands/:ageGroupId/:metric/reset',
    target: 'U14',
    path: (i) => `/api/tolerance-bands/${i.u14}/kneeSeparationRatio/reset`,
    expect: { ...staffOnly(200), analyst: 403 },
  },
  {
    route: 'POST /api/tolerance-bands/:ageGroupId/:metric/reset',
    target: 'U16',
    path: (i) => `/api/tolerance-bands/${i.u16}/kneeSeparationRatio/reset`,
    expect: { ...staffOnly(200), coach: 403, analyst: 403 },
  },
  {
    route: 'GET /api/jobs/:id',
    target: 'a re-evaluation of the club',
    path: (i) => `/api/jobs/${i.job}`,
    expect: { head: 200, coach: 200, analyst: 200, athlete: 403, guardian: 403 },
  },
  {
    route: 'GET /api/flags',
    target: 'the caller’s reach',
    path: () => '/api/flags?status=unreviewed',
    expect: all(200),
  },
  {
    route: 'PATCH /api/flags/:id',
    target: 'flag on Elsie’s clip (U14)',
    path: (i) => `/api/flags/${i.flagElsie}`,
    body: () => ({ status: 'reviewed', comment: 'Seen' }),
    expect: { ...staffOnly(200), analyst: 403 },
  },
  {
    route: 'PATCH /api/flags/:id',
    target: 'flag on Signe’s clip (U16)',
    path: (i) => `/api/flags/${i.flagSigne}`,
    body: () => ({ status: 'dismissed', comment: null }),
    expect: { ...staffOnly(200), coach: 404, analyst: 403 },
  },
  {
    route: 'GET /api/exports/frames.csv',
    target: 'what the caller may see',
    path: () => '/api/exports/frames.csv?metrics=shoulderTilt',
    expect: all(200),
  },
  {
    route: 'GET /api/exports/frames.csv',
    target: 'clip of a U14 athlete whose consent is withdrawn',
    path: (i) => `/api/exports/frames.csv?clipId=${i.clipWithdrawn}`,
    expect: { head: 200, coach: 404, analyst: 404, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/exports/frames.csv',
    target: 'a clip of another group (U16)',
    path: (i) => `/api/exports/frames.csv?clipId=${i.clipSigne}`,
    expect: { head: 200, coach: 404, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/exports/keypoints.csv',
    target: 'own clip',
    path: (i) => `/api/exports/keypoints.csv?clipId=${i.clipElsie}`,
    expect: all(200),
  },
  {
    route: 'GET /api/exports/turns.csv',
    target: 'what the caller may see',
    path: () => '/api/exports/turns.csv',
    expect: all(200),
  },
  {
    route: 'GET /api/exports/count',
    target: 'frames of what the caller may see',
    path: () => '/api/exports/count?kind=frames',
    expect: all(200),
  },
  {
    route: 'GET /api/exports/codebook',
    target: 'the columns',
    path: () => '/api/exports/codebook',
    expect: all(200),
  },
  {
    route: 'GET /api/clips/:id/notes',
    target: 'own clip (notes are unpublished)',
    path: (i) => `/api/clips/${i.clipElsie}/notes`,
    expect: { head: 200, coach: 200, analyst: 200, athlete: 403, guardian: 403 },
  },
  {
    route: 'GET /api/clips/:id/notes',
    target: 'other group clip',
    path: (i) => `/api/clips/${i.clipSigne}/notes`,
    expect: { head: 200, coach: 404, analyst: 200, athlete: 403, guardian: 403 },
  },
  {
    route: 'GET /api/clips/:id/notes.vtt',
    target: 'own clip',
    path: (i) => `/api/clips/${i.clipElsie}/notes.vtt`,
    expect: { head: 200, coach: 200, analyst: 200, athlete: 403, guardian: 403 },
  },
  {
    route: 'POST /api/clips/:id/notes',
    target: 'own clip',
    path: (i) => `/api/clips/${i.clipElsie}/notes`,
    body: () => ({ timeMs: 400, frameIndex: 10, text: 'Knees closer to hip width here' }),
    expect: staffOnly(201),
  },
  {
    route: 'POST /api/clips/:id/notes',
    target: 'other group clip',
    path: (i) => `/api/clips/${i.clipSigne}/notes`,
    body: () => ({ timeMs: 400, frameIndex: 10, text: 'Inside hand forward' }),
    expect: { ...staffOnly(201), coach: 404 },
  },
  {
    route: 'PATCH /api/notes/:id',
    target: "head coach's note",
    path: (i) => `/api/notes/${i.noteByHead}`,
    body: () => ({ text: 'Edited: knees closer to hip width' }),
    expect: { head: 200, coach: 403, analyst: 403, athlete: 403, guardian: 403 },
  },
  {
    route: 'PATCH /api/notes/:id',
    target: "coach's own note",
    path: (i) => `/api/notes/${i.noteByCoach}`,
    body: () => ({ text: 'Edited: shoulders level at the apex' }),
    expect: staffOnly(200),
  },
  {
    route: 'DELETE /api/notes/:id',
    target: "head coach's note",
    path: (i, role) => `/api/notes/${i.doomedByHead[role]}`,
    expect: { head: 204, coach: 403, analyst: 403, athlete: 403, guardian: 403 },
  },
  {
    route: 'DELETE /api/notes/:id',
    target: "coach's own note",
    path: (i, role) => `/api/notes/${i.doomedByCoach[role]}`,
    expect: staffOnly(204),
  },
  { route: 'GET /api/seasons', target: 'club', path: () => '/api/seasons', expect: all(200) },
  {
    route: 'POST /api/seasons',
    target: 'club',
    path: () => '/api/seasons',
    body: () => {
      const year = 1900 + (seq += 1);
      return { name: `${year}-autumn`, startsOn: `${year}-09-01`, endsOn: `${year}-12-31` };
    },
    expect: { head: 201, coach: 403, analyst: 403, athlete: 403, guardian: 403 },
  },
  {
    route: 'GET /api/athletes/:id/plan',
    target: 'own / own child',
    path: (i) => `/api/athletes/${i.elsie}/plan`,
    expect: all(200),
  },
  {
    route: 'GET /api/athletes/:id/plan',
    target: 'other group athlete',
    path: (i) => `/api/athletes/${i.signe}/plan`,
    expect: { head: 200, coach: 404, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'POST /api/athletes/:id/focus-points',
    target: 'coached athlete',
    path: (i) => `/api/athletes/${i.elsie}/focus-points`,
    body: (i) => ({ seasonId: i.season, title: `Quiet hands ${(seq += 1)}` }),
    expect: staffOnly(201),
  },
  {
    route: 'POST /api/athletes/:id/focus-points',
    target: 'other group athlete',
    path: (i) => `/api/athletes/${i.signe}/focus-points`,
    body: (i) => ({ seasonId: i.season, title: `Quiet hands ${(seq += 1)}` }),
    expect: { ...staffOnly(201), coach: 404 },
  },
  {
    route: 'PUT /api/athletes/:id/focus-points/order',
    target: 'coached athlete',
    path: (i) => `/api/athletes/${i.kit}/focus-points/order`,
    body: (i) => ({ seasonId: i.season, ids: (seq += 1) % 2 ? [...i.pointsKit].reverse() : i.pointsKit }),
    expect: staffOnly(200),
  },
  {
    route: 'PUT /api/athletes/:id/baseline',
    target: 'coached athlete',
    path: (i) => `/api/athletes/${i.elsie}/baseline`,
    body: (i) => ({ seasonId: i.season, clipId: i.clipElsie }),
    expect: staffOnly(200),
  },
  {
    route: 'PUT /api/focus-points/:id',
    target: 'coached athlete',
    path: (i) => `/api/focus-points/${i.pointElsie}`,
    body: (i) => ({
      seasonId: i.season,
      title: 'Knees apart at the apex',
      metric: 'kneeSeparationRatio',
      phase: 'apex',
      targetMin: 0.9,
      targetMax: 1.3,
      status: 'working',
    }),
    expect: staffOnly(200),
  },
  {
    route: 'PUT /api/focus-points/:id',
    target: 'other group athlete',
    path: (i) => `/api/focus-points/${i.pointSigne}`,
    body: (i) => ({ seasonId: i.season, title: 'Level shoulders', status: 'improving' }),
    expect: { ...staffOnly(200), coach: 404 },
  },
  {
    route: 'DELETE /api/focus-points/:id',
    target: 'coached athlete',
    path: (i, role) => `/api/focus-points/${i.doomedPoint[role]}`,
    expect: staffOnly(204),
  },
  {
    route: 'GET /api/compare-stills',
    target: 'own clip with itself',
    path: (i) => `/api/compare-stills?a=${i.clipElsie}&b=${i.clipElsie}`,
    expect: all(200),
  },
  {
    route: 'GET /api/compare-stills',
    target: 'own clip with another group clip',
    path: (i) => `/api/compare-stills?a=${i.clipElsie}&b=${i.clipSigne}`,
    expect: { head: 200, coach: 404, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'POST /api/compare-stills',
    target: 'two coached clips',
    path: () => '/api/compare-stills',
    body: (i) => ({ clipAId: i.clipElsie, clipBId: i.clipKit, frameA: 3, frameB: 4, png: ONE_PIXEL_PNG }),
    expect: staffOnly(201),
  },
  {
    route: 'GET /api/compare-stills/:id/image',
    target: 'Elsie with her teammate',
    path: (i) => `/api/compare-stills/${i.still}/image`,
    expect: { head: 200, coach: 200, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/athletes/:id/consent',
    target: 'own record / own child',
    path: (i) => `/api/athletes/${i.elsie}/consent`,
    expect: { head: 200, coach: 200, analyst: 403, athlete: 200, guardian: 200 },
  },
  {
    route: 'GET /api/athletes/:id/consent',
    target: 'other group',
    path: (i) => `/api/athletes/${i.signe}/consent`,
    expect: { head: 200, coach: 404, analyst: 403, athlete: 404, guardian: 404 },
  },
  {
    // The head coach records a guardian's request; the guardian decides for her younger child herself;
    // Elsie is a minor, so a guardian decides for her.
    route: 'POST /api/athletes/:id/consent/withdraw',
    target: 'a minor: head coach on request, guardian for own child',
    path: (i, role) =>
      `/api/athletes/${role === 'head' ? i.withdrawByHead : role === 'guardian' ? i.finn : i.elsie}/consent/withdraw`,
    body: (_i, role) => (role === 'head' ? { decidedBy: 'Sami Gorrie', method: 'email' } : {}),
    expect: { head: 200, coach: 403, analyst: 403, athlete: 403, guardian: 200 },
  },
  {
    route: 'POST /api/athletes/:id/consent/withdraw',
    target: 'other family',
    path: (i) => `/api/athletes/${i.signe}/consent/withdraw`,
    expect: { head: 400, coach: 403, analyst: 403, athlete: 404, guardian: 404 },
  },
  {
    route: 'POST /api/athletes/:id/consent/restore',
    target: 'withdrawn just before',
    path: (i, role) =>
      `/api/athletes/${role === 'head' ? i.withdrawByHead : role === 'guardian' ? i.finn : i.elsie}/consent/restore`,
    body: (_i, role) => (role === 'head' ? { decidedBy: 'Sami Gorrie', method: 'email' } : {}),
    expect: { head: 200, coach: 403, analyst: 403, athlete: 403, guardian: 200 },
  },
  {
    route: 'PUT /api/athletes/:id/guardians/:guardianId/access',
    target: 'a minor: the choice comes at 18',
    path: (i) => `/api/athletes/${i.elsie}/guardians/${i.guardianUser}/access`,
    body: () => ({ keep: false }),
    expect: all(403),
  },
  {
    route: 'POST /api/athletes/:id/export-link',
    target: 'own record / own child',
    path: (i) => `/api/athletes/${i.elsie}/export-link`,
    expect: { head: 200, coach: 403, analyst: 403, athlete: 200, guardian: 200 },
  },
  {
    route: 'POST /api/athletes/:id/export-link',
    target: 'other group',
    path: (i) => `/api/athletes/${i.signe}/export-link`,
    expect: { head: 200, coach: 403, analyst: 403, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/athletes/:id/export.zip',
    target: 'own record / own child',
    path: (i) => `/api/athletes/${i.elsie}/export.zip`,
    expect: { head: 200, coach: 403, analyst: 403, athlete: 200, guardian: 200 },
  },
  {
    route: 'GET /api/athletes/:id/export.zip',
    target: 'other group',
    path: (i) => `/api/athletes/${i.signe}/export.zip`,
    expect: { head: 200, coach: 403, analyst: 403, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/club/privacy',
    target: 'club',
    path: () => '/api/club/privacy',
    expect: { ...all(403), head: 200 },
  },
  {
    route: 'PUT /api/club/privacy',
    target: 'club',
    path: () => '/api/club/privacy',
    body: () => ({ consentGraceDays: 30, retentionDaysAfterSeason: 365 }),
    expect: { ...all(403), head: 200 },
  },
  {
    route: 'DELETE /api/athletes/:id',
    target: 'an athlete of the club',
    path: (i, role) => `/api/athletes/${role === 'head' ? i.eraseAthlete : i.elsie}`,
    expect: { head: 200, coach: 403, analyst: 403, athlete: 403, guardian: 403 },
  },
  {
    route: 'DELETE /api/clips/:id',
    target: 'uploaded by the head coach',
    path: (i, role) => `/api/clips/${role === 'head' ? i.eraseByHead : i.clipElsie}`,
    expect: { head: 204, coach: 403, analyst: 403, athlete: 403, guardian: 403 },
  },
  {
    route: 'DELETE /api/clips/:id',
    target: 'uploaded by the coach',
    path: (i, role) =>
      `/api/clips/${role === 'coach' ? i.eraseByCoach : role === 'head' ? i.eraseByCoachForHead : i.clipElsie}`,
    expect: staffOnly(204),
  },
  { route: 'GET /api/reviews', target: 'within reach', path: () => '/api/reviews', expect: all(200) },
  {
    route: 'POST /api/reviews',
    target: 'coached athlete',
    path: () => '/api/reviews',
    body: (i) => ({ clipId: i.clipElsie, athleteId: i.elsie }),
    expect: staffOnly(201),
  },
  {
    route: 'GET /api/reviews/:id',
    target: 'published, own / own child',
    path: (i) => `/api/reviews/${i.reviewElsie}`,
    expect: all(200),
  },
  {
    route: 'GET /api/reviews/:id',
    target: 'published, other group athlete',
    path: (i) => `/api/reviews/${i.reviewSigne}`,
    expect: { head: 200, coach: 404, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'GET /api/reviews/:id',
    target: 'draft of own athlete',
    path: (i) => `/api/reviews/${i.reviewDraft}`,
    expect: { head: 200, coach: 200, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'PATCH /api/reviews/:id',
    target: 'draft of coached athlete',
    path: (i) => `/api/reviews/${i.reviewDraft}`,
    body: () => ({ summary: `Edited ${(seq += 1)}` }),
    expect: staffOnly(200),
  },
  {
    route: 'GET /api/reviews/:id/view',
    target: 'published, own / own child',
    path: (i) => `/api/reviews/${i.reviewElsie}/view`,
    expect: all(200),
  },
  {
    route: 'GET /api/reviews/:id/view',
    target: 'published, other group athlete',
    path: (i) => `/api/reviews/${i.reviewSigne}/view`,
    expect: { head: 200, coach: 404, analyst: 200, athlete: 404, guardian: 404 },
  },
  {
    route: 'POST /api/reviews/:id/publish',
    target: 'draft of coached athlete',
    path: (i, role) => `/api/reviews/${i.toPublish[role]}/publish`,
    expect: staffOnly(200),
  },
  {
    route: 'POST /api/reviews/:id/unpublish',
    target: 'published, coached athlete',
    path: (i, role) => `/api/reviews/${i.toWithdraw[role]}/unpublish`,
    expect: staffOnly(200),
  },
  {
    route: 'GET /api/reviews/:id/receipts',
    target: 'published, coached athlete',
    path: (i) => `/api/reviews/${i.reviewElsie}/receipts`,
    expect: { head: 200, coach: 200, analyst: 200, athlete: 403, guardian: 403 },
  },
];

/** Routes anyone may call; their behaviour is covered in auth and invitation tests. */
const PUBLIC_ROUTES = [
  'GET /api/health',
  'POST /api/auth/login',
  'POST /api/auth/refresh',
  'POST /api/auth/logout',
  'GET /api/invitations/:token',
  'POST /api/invitations/accept',
  'POST /api/auth/password-reset',
  'GET /api/auth/password-reset/:token',
  'POST /api/auth/password-reset/:token',
  'GET /dev/mailbox',
  'GET /dev/mailbox.json',
];

const ROLES: DemoRole[] = ['head', 'coach', 'analyst', 'athlete', 'guardian'];

let server: TestServer;
let video: VideoFixture;
let ids: Ids;

beforeAll(async () => {
  [server, video] = await Promise.all([createTestServer(), videoFixture('mp4')]);
  const [s1, s2] = await server.sessionIds();
  const base = {
    elsie: await server.athleteId('Elsie'),
    kit: await server.athleteId('Kit'),
    signe: await server.athleteId('Signe'),
    noor: await server.athleteId('Noor'),
    u14: await server.ageGroupId('U14'),
    u16: await server.ageGroupId('U16'),
    s1,
    s2,
  };
  const seedClip = async (sessionId: string, athleteId: string, by: DemoRole = 'head') => {
    const res = await server.http
      .post('/api/clips')
      .set(await server.bearer(by))
      .field('sessionId', sessionId)
      .field('athleteIds', athleteId)
      .field('view', 'side')
      .attach('file', video.path);
    if (res.status !== 201) throw new Error(`seed clip: ${res.status} ${JSON.stringify(res.body)}`);
    return res.body.clip.id as string;
  };
  const clips = {
    clipElsie: await seedClip(s1, base.elsie),
    clipElsieUnshared: await seedClip(s1, base.elsie),
    eraseByHead: await seedClip(s1, base.elsie),
    eraseByCoach: await seedClip(s1, base.elsie, 'coach'),
    eraseByCoachForHead: await seedClip(s1, base.elsie, 'coach'),
    clipKit: await seedClip(s2, base.kit),
    clipSigne: await seedClip(s1, base.signe),
  };
  // Posters, thumbnails and frame results need processed clips.
  await server.runtime.mediaQueue.idle();
  const note = async (role: DemoRole, text: string) => {
    const res = await server.http
      .post(`/api/clips/${clips.clipElsie}/notes`)
      .set(await server.bearer(role))
      .send({ timeMs: 480, frameIndex: 12, text });
    if (res.status !== 201) throw new Error(`seed note: ${res.status} ${JSON.stringify(res.body)}`);
    return res.body.note.id as string;
  };
  const doomed = async (role: DemoRole) => {
    const out = {} as Record<DemoRole, string>;
    for (const r of ROLES) out[r] = await note(role, `To be deleted by ${r}`);
    return out;
  };
  // Flags of a model no row posts frames for, so the band changes below do not judge them away.
  const flag = async (clipId: string, athleteId: string, ageGroupId: string) => {
    const id = randomUUID();
    await server.runtime.dataSource.query(
      `INSERT INTO flag (id, clipId, model, metric, groupKey, turnIndex, firstFrame, lastFrame, frameCount, frameIndex,
         value, bandMin, bandMax, bandVersion, distance, severity, athleteId, ageGroupId, status, createdAt, updatedAt)
       VALUES (?, ?, 'blazepose', 'kneeSeparationRatio', 't0', 0, 2, 9, 8, 5, 0.6, 0.8, 1.3, 1, 0.2, 'low', ?, ?,
         'unreviewed', datetime('now'), datetime('now'))`,
      [id, clipId, athleteId, ageGroupId],
    );
    return id;
  };
  const change = await server.http
    .put(`/api/tolerance-bands/${base.u14}/shoulderTilt`)
    .set(await server.bearer('head'))
    .send({ min: -9, max: 9, target: 0 });
  if (change.status !== 200)
    throw new Error(`seed band change: ${change.status} ${JSON.stringify(change.body)}`);
  await server.runtime.jobs.idle();
  const post = async (url: string, body: object) => {
    const res = await server.http
      .post(url)
      .set(await server.bearer('head'))
      .send(body);
    if (res.status !== 201) throw new Error(`seed ${url}: ${res.status} ${JSON.stringify(res.body)}`);
    return res.body as Record<string, { id: string }>;
  };
  const season = (
    await post('/api/seasons', { name: '2000-99', startsOn: '2000-01-01', endsOn: '2099-12-31' })
  ).season.id;
  const point = async (athleteId: string, title: string) =>
    (await post(`/api/athletes/${athleteId}/focus-points`, { seasonId: season, title })).focusPoint.id;
  const doomedPoint = {} as Record<DemoRole, string>;
  for (const r of ROLES) doomedPoint[r] = await point(base.elsie, `To be removed by ${r}`);
  const plan = {
    season,
    pointElsie: await point(base.elsie, 'Knees apart'),
    pointSigne: await point(base.signe, 'Level shoulders'),
    pointsKit: [await point(base.kit, 'Early pole plant'), await point(base.kit, 'Hands forward')],
    doomedPoint,
    still: (
      await post('/api/compare-stills', {
        clipAId: clips.clipElsie,
        clipBId: clips.clipKit,
        frameA: 0,
        frameB: 0,
        png: ONE_PIXEL_PNG,
      })
    ).still.id,
  };
  const review = async (clipId: string, athleteId: string, publish: boolean) => {
    const id = (await post('/api/reviews', { clipId, athleteId })).review.id;
    const saved = await server.http
      .patch(`/api/reviews/${id}`)
      .set(await server.bearer('head'))
      .send({ summary: 'Knees apart through the apex.' });
    if (saved.status !== 200) throw new Error(`seed review: ${saved.status} ${JSON.stringify(saved.body)}`);
    if (publish) {
      const res = await server.http.post(`/api/reviews/${id}/publish`).set(await server.bearer('head'));
      if (res.status !== 200) throw new Error(`publish review: ${res.status} ${JSON.stringify(res.body)}`);
    }
    return id;
  };
  const toPublish = {} as Record<DemoRole, string>;
  const toWithdraw = {} as Record<DemoRole, string>;
  for (const r of ROLES) {
    toPublish[r] = await review(clips.clipElsie, base.elsie, false);
    toWithdraw[r] = await review(clips.clipElsie, base.elsie, true);
  }
  const withdrawByHead = (
    await post('/api/athletes', {
      firstName: 'Mae',
      lastName: 'Withdrawing',
      birthYear: 2013,
      ageGroupId: base.u14,
    })
  ).athlete.id as string;
  const consented = await server.http
    .post(`/api/athletes/${withdrawByHead}/consent`)
    .set(await server.bearer('head'))
    .send({ guardianName: 'Sami Gorrie', method: 'signed_form' });
  if (consented.status !== 200) throw new Error(`seed consent: ${consented.status}`);
  const guardianMe = await server.http.get('/api/me').set(await server.bearer('guardian'));
  const withdrawnAthlete = (
    await post('/api/athletes', {
      firstName: 'Wyn',
      lastName: 'Withdrawn',
      birthYear: 2013,
      ageGroupId: base.u14,
    })
  ).athlete.id as string;
  const consentWyn = await server.http
    .post(`/api/athletes/${withdrawnAthlete}/consent`)
    .set(await server.bearer('head'))
    .send({ guardianName: 'Pat Withdrawn', method: 'email' });
  if (consentWyn.status !== 200) throw new Error(`seed consent: ${consentWyn.status}`);
  const clipWithdrawn = await seedClip(s1, withdrawnAthlete);
  await server.runtime.mediaQueue.idle();
  const withdrawn = await server.http
    .post(`/api/athletes/${withdrawnAthlete}/consent/withdraw`)
    .set(await server.bearer('head'))
    .send({ decidedBy: 'Pat Withdrawn', method: 'email' });
  if (withdrawn.status !== 200) throw new Error(`seed withdrawal: ${withdrawn.status}`);
  const eraseAthlete = (
    await post('/api/athletes', {
      firstName: 'Ola',
      lastName: 'Leaving',
      birthYear: 2012,
      ageGroupId: base.u14,
    })
  ).athlete.id;
  const reviews = {
    eraseAthlete,
    withdrawByHead,
    finn: await server.athleteId('Finn'),
    guardianUser: guardianMe.body.user.id as string,
    clipWithdrawn,
    reviewElsie: await review(clips.clipElsie, base.elsie, true),
    reviewSigne: await review(clips.clipSigne, base.signe, true),
    reviewDraft: await review(clips.clipElsie, base.elsie, false),
    toPublish,
    toWithdraw,
  };
  ids = {
    ...base,
    ...clips,
    ...plan,
    ...reviews,
    flagElsie: await flag(clips.clipElsie, base.elsie, base.u14),
    flagSigne: await flag(clips.clipSigne, base.signe, base.u16),
    job: change.body.job.id as string,
    noteByHead: await note('head', 'Stance wider through the apex'),
    noteByCoach: await note('coach', 'Level shoulders at the apex'),
    doomedByHead: await doomed('head'),
    doomedByCoach: await doomed('coach'),
  };
});
afterAll(async () => {
  await server.close();
  await removeVideoFixtures();
});

async function call(row: Row, auth: Record<string, string>, role: DemoRole) {
  const method = row.route.split(' ')[0];
  const url = row.path(ids, role);
  if (method === 'GET') {
    const req = server.http.get(url).set(auth);
    return row.range ? req.set('Range', 'bytes=0-15') : req;
  }
  if (method === 'DELETE') return server.http.delete(url).set(auth);
  if (method === 'PATCH')
    return server.http
      .patch(url)
      .set(auth)
      .send(row.body ? row.body(ids, role) : {});
  if (method === 'PUT')
    return server.http
      .put(url)
      .set(auth)
      .send(row.body ? row.body(ids, role) : {});
  const req = server.http.post(url).set(auth);
  if (row.upload) {
    for (const [k, v] of Object.entries(row.upload(ids))) req.field(k, v);
    return req.attach('file', video.path);
  }
  return req.send(row.body ? row.body(ids, role) : {});
}

describe('role x route matrix', () => {
  it('covers every route the app registers', () => {
    const covered = new Set([...ROWS.map((r) => r.route), ...PUBLIC_ROUTES]);
    const missing = listRoutes(server.app).filter((r) => !covered.has(r));
    expect(missing, 'add a ROWS entry (expected status per role) for each of these routes').toEqual([]);
  });

  it('lets the analyst create nothing', () => {
    // Club records; a member's own password (POST /api/auth/password) is not one.
    const writes = ROWS.filter((r) => r.route.startsWith('POST') && !r.route.startsWith('POST /api/auth/'));
    expect(writes.length).toBeGreaterThan(0);
    for (const row of writes) expect(row.expect.analyst, row.route).toBe(403);
  });

  for (const row of ROWS) {
    describe(`${row.route} (${row.target})`, () => {
      it('401 without a token', async () => {
        const res = await call(row, {}, 'head');
        expect(res.status).toBe(401);
      });
      for (const role of ROLES) {
        it(`${role} -> ${row.expect[role]}`, async () => {
          const res = await call(row, await server.bearer(role), role);
          expect(res.status, JSON.stringify(res.body)).toBe(row.expect[role]);
          if (res.status >= 400) expect(typeof res.body.error.message).toBe('string');
        });
      }
    });
  }
});

describe('what each role sees in lists', () => {
  const names = (body: { athletes: { firstName: string }[] }) => body.athletes.map((a) => a.firstName).sort();

  it('athlete: only herself; guardian: her two children; coach: only coached groups', async () => {
    const athlete = await server.http.get('/api/athletes').set(await server.bearer('athlete'));
    expect(names(athlete.body)).toEqual(['Elsie']);
    const guardian = await server.http.get('/api/athletes').set(await server.bearer('guardian'));
    expect(names(guardian.body)).toEqual(['Elsie', 'Finn']);
    const coach = await server.http.get('/api/athletes').set(await server.bearer('coach'));
    const groups = new Set(coach.body.athletes.map((a: { ageGroup: { name: string } }) => a.ageGroup.name));
    expect([...groups].sort()).toEqual(['U12', 'U14']);
    const head = await server.http.get('/api/athletes').set(await server.bearer('head'));
    expect(head.body.athletes.length).toBeGreaterThanOrEqual(14);
  });

  it('hides guardian e-mails from the analyst only', async () => {
    const analyst = await server.http.get(`/api/athletes/${ids.elsie}`).set(await server.bearer('analyst'));
    expect(analyst.body.athlete.guardians).toEqual([
      { id: expect.any(String), name: 'Ruth Marrow', email: null },
    ]);
    const coach = await server.http.get(`/api/athletes/${ids.elsie}`).set(await server.bearer('coach'));
    expect(coach.body.athlete.guardians[0].email).toBe('guardian@larchwood.example');
  });

  it('athlete and guardian see only clips and sessions of their own athletes', async () => {
    for (const role of ['athlete', 'guardian'] as const) {
      const clips = await server.http.get('/api/clips').set(await server.bearer(role));
      const clipIds = clips.body.clips.map((c: { id: string }) => c.id);
      expect(clipIds).toContain(ids.clipElsie);
      expect(clipIds).not.toContain(ids.clipKit);
      expect(clipIds).not.toContain(ids.clipSigne);
      const sessions = await server.http.get('/api/sessions').set(await server.bearer(role));
      expect(sessions.body.sessions.map((s: { id: string }) => s.id)).toEqual([ids.s1]);
    }
  });

  it('coach reads every club session but counts only clips of coached athletes', async () => {
    const res = await server.http.get('/api/sessions').set(await server.bearer('coach'));
    const byId = new Map(
      res.body.sessions.map((s: { id: string; clipCount: number }) => [s.id, s.clipCount]),
    );
    expect(byId.has(ids.s1) && byId.has(ids.s2)).toBe(true);
    const head = await server.http.get('/api/sessions').set(await server.bearer('head'));
    const headById = new Map(
      head.body.sessions.map((s: { id: string; clipCount: number }) => [s.id, s.clipCount]),
    );
    // s1 holds Signe's clip (U16), which the coach does not count.
    expect(Number(headById.get(ids.s1)) - Number(byId.get(ids.s1))).toBeGreaterThanOrEqual(1);
  });
});
