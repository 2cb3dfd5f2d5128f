import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ClipDto } from '@shared/schemas/clip.schema';
import type { FlagDto, FlagListResponse } from '@shared/schemas/flag.schema';
import type { ClipFramesResponse } from '@shared/schemas/frames.schema';
import type {
  ToleranceBandChangeResponse,
  ToleranceBandListResponse,
} from '@shared/schemas/tolerance.schema';
import { createTestServer, type DemoRole, type TestServer } from '../helpers/server-harness';
import { clip as syntheticClip } from '../shared/series/synthetic-clip';
import { removeRenderedVideos, renderVideo, settled, shareWithAthlete, uploadClip } from './clip-fixtures';

// Tolerance bands coaches set, the background re-check a change starts, and flags as coaching points.

const SECONDS = 8;
const FPS = 25;

let server: TestServer;
let u14: string;
let u16: string;
let clip: ClipDto;
let sharing: string;

// The synthetic front-view skier (tests/shared/series/synthetic-clip.ts): ±25° of lean with a 1.6 s
// period, so a turn every 800 ms (10 turns in 8 s), with the shoulders tilted 6° the whole time:
// inside the ±8° common-practice band of U14 (docs/metrics.md), outside a band of ±5°.
const frames = syntheticClip(SECONDS * FPS, FPS, (t) => ({
  inclinationDeg: 25 * Math.sin((2 * Math.PI * t) / 1600),
  legExtension: 0.85,
  shoulderTiltDeg: 6,
}));

async function as(role: DemoRole) {
  return server.bearer(role);
}

async function readFrames(): Promise<ClipFramesResponse> {
  const res = await server.http.get(`/api/clips/${clip.id}/frames?model=lightning`).set(await as('coach'));
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as ClipFramesResponse;
}

async function putBand(role: DemoRole, ageGroupId: string, metric: string, body: unknown) {
  return server.http
    .put(`/api/tolerance-bands/${ageGroupId}/${metric}`)
    .set(await as(role))
    .send(body as object);
}

/** Changes a band as the head coach and waits for the re-check it queues. */
async function changeBand(metric: string, body: unknown): Promise<ToleranceBandChangeResponse> {
  const res = await putBand('head', u14, metric, body);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  await server.runtime.jobs.idle();
  return res.body as ToleranceBandChangeResponse;
}

const tiltFlags = (read: ClipFramesResponse) => read.flags.filter((f) => f.metric === 'shoulderTilt');

beforeAll(async () => {
  server = await createTestServer();
  u14 = await server.ageGroupId('U14');
  u16 = await server.ageGroupId('U16');
  const [sessionId] = await server.sessionIds();
  const video = await renderVideo('h264-mp4', { seconds: SECONDS, fps: FPS });
  const elsie = await server.athleteId('Elsie');
  clip = await settled(
    server,
    (await uploadClip(server, video.path, { sessionId, athleteIds: elsie, view: 'front' })).id,
  );
  const res = await server.http
    .post(`/api/clips/${clip.id}/frames`)
    .set(await as('coach'))
    .send({ model: 'lightning', frames });
  expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
  // Elsie and her guardian read the clip (and its flags) through a published review.
  sharing = await shareWithAthlete(server, clip.id, elsie);
}, 120_000);
afterAll(async () => {
  await server.close();
  await removeRenderedVideos();
});

describe('a band change re-checks stored frames through the job', () => {
  it('flags the tilted shoulders once per turn when the band is narrowed, and drops them when it is reset', async () => {
    const before = await readFrames();
    const turns = before.series!.turns;
    expect(turns).toHaveLength(10);
    expect(tiltFlags(before)).toEqual([]);

    const narrowed = await changeBand('shoulderTilt', { min: -5, max: 5, target: 0 });
    expect(narrowed.band).toMatchObject({ min: -5, max: 5, source: 'club', version: 2 });
    expect(narrowed.band.meaning).toBe(
      'Right shoulder higher by more than 5.0°, or left shoulder higher by more than 5.0°',
    );
    const job = await server.http.get(`/api/jobs/${narrowed.job.id}`).set(await as('coach'));
    expect(job.body).toMatchObject({ status: 'done', total: SECONDS * FPS, done: SECONDS * FPS });

    const after = await readFrames();
    const flagged = tiltFlags(after);
    // One flag per turn: every frame is inside a turn (the first and last turns reach the clip edges).
    expect(flagged.map((f) => f.turnIndex)).toEqual(turns.map((t) => t.index));
    expect(flagged.reduce((n, f) => n + f.frameCount, 0)).toBe(SECONDS * FPS);
    for (const f of flagged) {
      expect(f).toMatchObject({ side: 'above', min: -5, max: 5, bandVersion: 2, status: 'unreviewed' });
      expect(f.value).toBeCloseTo(6, 6);
    }

    const reset = await server.http
      .post(`/api/tolerance-bands/${u14}/shoulderTilt/reset`)
      .set(await as('coach'));
    expect(reset.status, JSON.stringify(reset.body)).toBe(200);
    expect(reset.body.band).toMatchObject({ min: -8, max: 8, source: 'common practice', version: 3 });
    await server.runtime.jobs.idle();
    expect(tiltFlags(await readFrames())).toEqual([]);
  });

  it('keeps every change with who, when, and the band before and after', async () => {
    const res = await server.http
      .get(`/api/tolerance-bands/history?ageGroupId=${u14}`)
      .set(await as('analyst'));
    expect(res.status).toBe(200);
    const changes = res.body.changes.filter((c: { metric: string }) => c.metric === 'shoulderTilt');
    expect(changes.map((c: { version: number; action: string }) => [c.version, c.action])).toEqual([
      [3, 'reset'],
      [2, 'edit'],
    ]);
    expect(changes[1]).toMatchObject({
      ageGroupName: 'U14',
      changedBy: 'Ingrid Falkner',
      before: { min: -8, max: 8, target: 0, source: 'common practice' },
      after: { min: -5, max: 5, target: 0, source: 'club' },
    });
    expect(changes[0]).toMatchObject({
      changedBy: 'Tomas Reinholt',
      after: { min: -8, max: 8, source: 'common practice' },
    });
  });

  it('a reviewed flag stays reviewed when the same habit in the same turn is found again', async () => {
    await changeBand('shoulderTilt', { min: -5, max: 5, target: 0 });
    const [first] = tiltFlags(await readFrames());
    const review = await server.http
      .patch(`/api/flags/${first.id}`)
      .set(await as('coach'))
      .send({ status: 'reviewed', comment: 'Shoulders drill on Saturday' });
    expect(review.status, JSON.stringify(review.body)).toBe(200);
    expect(review.body).toMatchObject({
      status: 'reviewed',
      comment: 'Shoulders drill on Saturday',
      statusBy: 'Tomas Reinholt',
    });
    // A tighter band: the same turns are flagged again, with the new version; the review is kept.
    await changeBand('shoulderTilt', { min: -4, max: 4, target: 0 });
    const again = tiltFlags(await readFrames());
    expect(again.find((f) => f.id === first.id)).toMatchObject({ status: 'reviewed', bandVersion: 5 });
    expect(again.filter((f) => f.status === 'unreviewed')).toHaveLength(again.length - 1);
    // Other coaches see it: the head coach's list of reviewed flags holds it with the comment.
    const list = await server.http.get('/api/flags?status=reviewed').set(await as('head'));
    expect((list.body as FlagListResponse).flags.map((f) => [f.id, f.comment])).toEqual([
      [first.id, 'Shoulders drill on Saturday'],
    ]);
    // The athlete sees that it was reviewed, not the coaches' comment or who wrote it.
    const own = await server.http.get('/api/flags?status=reviewed').set(await as('athlete'));
    expect((own.body as FlagListResponse).flags.map((f) => [f.id, f.comment, f.statusBy])).toEqual([
      [first.id, null, null],
    ]);
  });
});

describe('GET /api/flags', () => {
  it('lists the club’s flags within the caller’s reach, filtered and paged', async () => {
    // The synthetic skier stands 1.5 hip widths wide at the feet and knees (outside 0.8 to 1.3) and
    // tilts the shoulders 6° (outside ±4° now): three habits in each of the 10 turns.
    const all = (await server.http.get('/api/flags?pageSize=100').set(await as('coach')))
      .body as FlagListResponse;
    expect(all.total).toBe(30);
    expect(new Set(all.flags.map((f) => f.metric))).toEqual(
      new Set(['shoulderTilt', 'stanceWidthRatio', 'kneeSeparationRatio']),
    );
    const page2 = (await server.http.get('/api/flags?pageSize=4&page=2').set(await as('coach')))
      .body as FlagListResponse;
    expect(page2).toMatchObject({ total: 30, page: 2, pageSize: 4 });
    expect(page2.flags).toHaveLength(4);
    expect(page2.flags.map((f) => f.id)).toEqual(all.flags.slice(4, 8).map((f) => f.id));
    const one: FlagDto = all.flags.find((f) => f.metric === 'shoulderTilt')!;
    expect(one).toMatchObject({
      clipId: clip.id,
      athlete: { name: 'Elsie Marrow' },
      ageGroup: { id: u14, name: 'U14' },
      metric: 'shoulderTilt',
    });
    expect(one.timeMs).toBeCloseTo((one.frameIndex * 1000) / FPS, 6);
    expect(one.thumbnails?.url).toMatch(/\/api\/clips\/.+\/thumbnails\?token=/);
    const filtered = async (query: string, role: DemoRole = 'coach') =>
      ((await server.http.get(`/api/flags?${query}`).set(await as(role))).body as FlagListResponse).total;
    expect(await filtered(`clipId=${clip.id}&metric=shoulderTilt`)).toBe(10);
    expect(await filtered('metric=hipTilt')).toBe(0);
    expect(await filtered(`ageGroupId=${u16}`)).toBe(0);
    expect(await filtered(`ageGroupId=${u14}&status=unreviewed`)).toBe(29);
    expect(await filtered('from=2100-01-01')).toBe(0);
    // Elsie herself and her guardian see her flags, of clips a published review shares with them.
    await server.http.post(`/api/reviews/${sharing}/unpublish`).set(await as('coach'));
    expect(await filtered('pageSize=100', 'athlete')).toBe(0);
    await server.http.post(`/api/reviews/${sharing}/publish`).set(await as('coach'));
    expect(await filtered('pageSize=100', 'athlete')).toBe(30);
    expect(await filtered('pageSize=100', 'guardian')).toBe(30);
  });

  it.each([
    ['status=open', 'status'],
    ['page=0', 'page'],
    ['pageSize=500', 'pageSize'],
    ['metric=kneeAngle', 'metric'],
    ['athleteId=elsie', 'athleteId'],
    ['from=yesterday', 'from'],
    ['from=2026-12-02&to=2026-12-01', 'to'],
    ['colour=red', ''],
  ])('refuses %s with a 400 naming the field', async (query, field) => {
    const res = await server.http.get(`/api/flags?${query}`).set(await as('coach'));
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.error)).toContain(field);
  });

  it.each([
    [{ status: 'done' }, 'status'],
    [{ status: 'reviewed', comment: 'x'.repeat(1001) }, 'comment'],
    [{ status: 'reviewed', extra: true }, 'extra'],
  ])('refuses a review of %j with a 400 and changes nothing', async (body, field) => {
    const [flag] = (await server.http.get('/api/flags?status=unreviewed').set(await as('coach'))).body.flags;
    const res = await server.http
      .patch(`/api/flags/${flag.id}`)
      .set(await as('coach'))
      .send(body);
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.error)).toContain(field);
    const still = await server.http.get(`/api/flags?status=unreviewed&pageSize=100`).set(await as('coach'));
    expect(still.body.flags.map((f: FlagDto) => f.id)).toContain(flag.id);
  });
});

describe('who may change a band', () => {
  it('refuses a coach outside the group and the analyst, and stores nothing', async () => {
    const changes = await server.count('tolerance_band_change');
    const jobs = await server.count('job');
    const coach = await putBand('coach', u16, 'kneeSeparationRatio', { min: 0.7, max: 1.3, target: 1 });
    expect(coach.status).toBe(403);
    expect(coach.body.error.message).toBe('Only the head coach and the coaches of U16 can change its bands');
    const analyst = await putBand('analyst', u14, 'kneeSeparationRatio', { min: 0.7, max: 1.3, target: 1 });
    expect(analyst.status).toBe(403);
    const reset = await server.http
      .post(`/api/tolerance-bands/${u16}/kneeSeparationRatio/reset`)
      .set(await as('coach'));
    expect(reset.status).toBe(403);
    expect(await server.count('tolerance_band_change')).toBe(changes);
    expect(await server.count('job')).toBe(jobs);
    const list = (await server.http.get('/api/tolerance-bands').set(await as('coach')))
      .body as ToleranceBandListResponse;
    const u12 = await server.ageGroupId('U12');
    expect(list.editableAgeGroupIds.sort()).toEqual([u12, u14].sort());
  });
});

describe('bad band input', () => {
  it.each([
    ['the lowest above the highest', 'stanceWidthRatio', { min: 1.4, max: 0.8 }, 'min', 'swap them'],
    ['NaN sent as text', 'stanceWidthRatio', { min: 'NaN', max: 1.3 }, 'min', 'Enter a number'],
    ['a string', 'shoulderTilt', { min: 'minus eight', max: 8 }, 'min', 'Enter a number'],
    ['a value the metric cannot take', 'shoulderTilt', { min: -120, max: 8 }, 'min', 'between -90 and 90'],
    ['a ratio below zero for leg extension', 'legExtension', { min: -0.2, max: 1 }, 'min', 'between 0 and 1'],
    [
      'a target outside the band',
      'shoulderTilt',
      { min: -8, max: 8, target: 9 },
      'target',
      'outside the band',
    ],
    ['an unknown field', 'shoulderTilt', { min: -8, max: 8, colour: 'red' }, 'colour', ''],
    ['an unknown metric', 'kneeAngle', { min: 0, max: 1 }, 'metric', 'Unknown metric'],
  ])('refuses %s: 400 with the field named, nothing stored', async (_what, metric, body, field, words) => {
    const changes = await server.count('tolerance_band_change');
    const res = await putBand('head', u14, metric, body);
    expect(res.status).toBe(400);
    const issues = res.body.error.details.issues as { path: string[]; message: string }[];
    // An unknown field is named in the message of the object's issue, the others by their path.
    const issue = issues.find((i) => i.path[0] === field) ?? issues.find((i) => i.message.includes(field));
    expect(issue, JSON.stringify(issues)).toBeDefined();
    expect(issue!.message).toContain(words);
    expect(await server.count('tolerance_band_change')).toBe(changes);
  });

  it('refuses malformed ids and queries on the other band and job routes with a 400', async () => {
    const head = await as('head');
    const cases: [string, Promise<{ status: number; body: { error: { message: string } } }>, string][] = [
      [
        'reset of an unknown metric',
        server.http.post(`/api/tolerance-bands/${u14}/kneeAngle/reset`).set(head),
        'metric',
      ],
      [
        'reset of a group that is not an id',
        server.http.post('/api/tolerance-bands/U14/shoulderTilt/reset').set(head),
        'ageGroupId',
      ],
      ['a job id that is not an id', server.http.get('/api/jobs/latest').set(head), 'id'],
      [
        'history of a group that is not an id',
        server.http.get('/api/tolerance-bands/history?ageGroupId=U14').set(head),
        'ageGroupId',
      ],
      [
        'history with no room for a change',
        server.http.get('/api/tolerance-bands/history?limit=0').set(head),
        'limit',
      ],
      [
        'a flag id that is not an id',
        server.http.patch('/api/flags/first').set(head).send({ status: 'reviewed' }),
        'id',
      ],
    ];
    for (const [what, request, field] of cases) {
      const res = await request;
      expect(res.status, what).toBe(400);
      expect(JSON.stringify(res.body.error), what).toContain(field);
    }
    const missing = await server.http.get('/api/jobs/00000000-0000-4000-8000-000000000000').set(head);
    expect(missing.status).toBe(404);
  });

  it('refuses an age group that is not an id (400) and one of no club group (404)', async () => {
    const bad = await putBand('head', 'U14', 'shoulderTilt', { min: -8, max: 8 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.issues[0].path).toEqual(['ageGroupId']);
    const unknown = await putBand('head', '00000000-0000-4000-8000-000000000000', 'shoulderTilt', {
      min: -8,
      max: 8,
    });
    expect(unknown.status).toBe(404);
  });
});
