import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ClipDto } from '@shared/schemas/clip.schema';
import type { FocusPointDto, SeasonPlanResponse } from '@shared/schemas/plan.schema';
import { createTestServer, type DemoRole, type TestServer } from '../helpers/server-harness';
import { clip as syntheticClip } from '../shared/series/synthetic-clip';
import { removeRenderedVideos, renderVideo, settled, shareWithAthlete, uploadClip } from './clip-fixtures';

// Seasons, season plans and the progress of each measured focus point, through the real API on SQLite.
// The progress values are checked against medians this test computes itself from the stored rows
// (frame_result and clip_turns), not through the product's own code.

const SECONDS = 8;
const FPS = 25;
/** 1 × 1 PNG. */
const PNG =
  'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==';

let server: TestServer;
let elsie: string;
let season: string;
let autumn: ClipDto;
let spring: ClipDto;
let sideClip: ClipDto;

// Two front runs of the synthetic skier (tests/shared/series/synthetic-clip.ts): a turn every 800 ms,
// the shoulders tilted 6° in autumn and 2° in spring, the legs a little straighter in spring.
const run = (tilt: number, extension: number) =>
  syntheticClip(SECONDS * FPS, FPS, (t) => ({
    inclinationDeg: 25 * Math.sin((2 * Math.PI * t) / 1600),
    legExtension: extension + 0.03 * Math.sin((2 * Math.PI * t) / 800),
    shoulderTiltDeg: tilt,
  }));

async function as(role: DemoRole) {
  return server.bearer(role);
}

async function plan(role: DemoRole = 'coach'): Promise<SeasonPlanResponse> {
  const res = await server.http.get(`/api/athletes/${elsie}/plan`).set(await as(role));
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as SeasonPlanResponse;
}

async function addPoint(body: object, role: DemoRole = 'coach') {
  return server.http
    .post(`/api/athletes/${elsie}/focus-points`)
    .set(await as(role))
    .send({ seasonId: season, ...body });
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

/** The stored rows of a clip, read straight from SQLite. */
async function storedRows(clipId: string) {
  const frames = (await server.runtime.dataSource.query(
    `SELECT frameIndex, metrics FROM frame_result WHERE clipId = ? AND model = 'lightning' ORDER BY frameIndex`,
    [clipId],
  )) as { frameIndex: number; metrics: string }[];
  const [turnRow] = (await server.runtime.dataSource.query(
    `SELECT turns FROM clip_turns WHERE clipId = ? AND model = 'lightning'`,
    [clipId],
  )) as { turns: string }[];
  const byFrame = new Map(
    frames.map((f) => [f.frameIndex, JSON.parse(f.metrics) as Record<string, number | null>]),
  );
  const turns = JSON.parse(turnRow.turns) as {
    startFrame: number;
    apexFrame: number;
    endFrame: number;
    insideShoulderDrop: number | null;
  }[];
  return { byFrame, turns };
}

beforeAll(async () => {
  server = await createTestServer();
  elsie = await server.athleteId('Elsie');
  const [s1, s2] = await server.sessionIds();
  const video = await renderVideo('h264-mp4', { seconds: SECONDS, fps: FPS });
  const upload = async (sessionId: string, view: 'front' | 'side') =>
    settled(server, (await uploadClip(server, video.path, { sessionId, athleteIds: elsie, view })).id);
  autumn = await upload(s1, 'front');
  spring = await upload(s2, 'front');
  sideClip = await upload(s2, 'side');
  for (const [c, frames] of [
    [autumn, run(6, 0.82)],
    [spring, run(2, 0.86)],
    [sideClip, run(2, 0.86)],
  ] as const) {
    const res = await server.http
      .post(`/api/clips/${c.id}/frames`)
      .set(await as('coach'))
      .send({ model: 'lightning', frames });
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
  }
  const created = await server.http
    .post('/api/seasons')
    .set(await as('head'))
    .send({ name: '2026-27', startsOn: '2000-07-01', endsOn: '2099-06-30' });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  season = created.body.season.id;
}, 180_000);
afterAll(async () => {
  await server.close();
  await removeRenderedVideos();
});

describe('season plan', () => {
  it('lists the season’s clips oldest first with their turns, and no focus points yet', async () => {
    const p = await plan();
    expect(p.season?.name).toBe('2026-27');
    expect(p.clips.map((c) => c.id)).toEqual([autumn.id, spring.id, sideClip.id]);
    expect(p.clips.map((c) => c.turnCount)).toEqual([10, 10, 0]);
    expect(p.focusPoints).toEqual([]);
    expect(p.canEdit).toBe(true);
  });

  it('progress values equal the medians computed here from the stored frames and turns', async () => {
    const tilt = await addPoint({
      title: 'Level shoulders',
      metric: 'shoulderTilt',
      phase: 'apex',
      targetMin: -3,
      targetMax: 3,
    });
    const drop = await addPoint({
      title: 'Inside shoulder up',
      metric: 'insideShoulderDrop',
      phase: 'apex',
      targetMax: 3,
    });
    const extension = await addPoint({
      title: 'Stay low',
      metric: 'legExtension',
      phase: 'transition',
      direction: 'decrease',
    });
    const whole = await addPoint({
      title: 'Knees apart',
      metric: 'kneeSeparationRatio',
      phase: 'turn',
      targetMin: 0.8,
      targetMax: 1.3,
    });
    for (const res of [tilt, drop, extension, whole]) expect(res.status, JSON.stringify(res.body)).toBe(201);
    const p = await plan();
    const byPoint = new Map(p.progress.map((x) => [x.focusPointId, x.points]));

    for (const c of [autumn, spring]) {
      const { byFrame, turns } = await storedRows(c.id);
      const expected = {
        [tilt.body.focusPoint.id]: turns.map((t) => byFrame.get(t.apexFrame)!.shoulderTilt!),
        [drop.body.focusPoint.id]: turns.map((t) => t.insideShoulderDrop!),
        [extension.body.focusPoint.id]: turns
          .filter((t, i) => i + 1 < turns.length && turns[i + 1].startFrame === t.endFrame)
          .map((t) => byFrame.get(t.endFrame)!.legExtension!),
        [whole.body.focusPoint.id]: turns.map((t) =>
          median(
            [...byFrame.entries()]
              .filter(([f]) => f >= t.startFrame && f < t.endFrame)
              .map(([, m]) => m.kneeSeparationRatio!),
          ),
        ),
      };
      for (const [pointId, values] of Object.entries(expected)) {
        const point = byPoint.get(pointId)!.find((x) => x.clipId === c.id)!;
        expect(values.length).toBeGreaterThan(0);
        expect(point.count, pointId).toBe(values.length);
        expect(point.median!).toBeCloseTo(median(values), 9);
        expect(point.min!).toBeCloseTo(Math.min(...values), 9);
        expect(point.max!).toBeCloseTo(Math.max(...values), 9);
      }
    }
    // The spring clip's shoulders are 4° more level by construction.
    const tiltPoints = byPoint.get(tilt.body.focusPoint.id)!;
    expect(Math.abs(tiltPoints[0].median! - tiltPoints[1].median!)).toBeCloseTo(4, 0);
    // The side-view clip is not plotted for a front-view metric, and says why.
    const side = tiltPoints.find((x) => x.clipId === sideClip.id)!;
    expect(side.median).toBeNull();
    expect(side.reason).toBe('Filmed from the side; shoulder tilt is measured in a front view');
  });

  it('marks one baseline per athlete and season; the chart marks it', async () => {
    const res = await server.http
      .put(`/api/athletes/${elsie}/baseline`)
      .set(await as('coach'))
      .send({ seasonId: season, clipId: autumn.id });
    expect(res.status).toBe(200);
    const again = await server.http
      .put(`/api/athletes/${elsie}/baseline`)
      .set(await as('head'))
      .send({ seasonId: season, clipId: spring.id });
    expect(again.status).toBe(200);
    const p = await plan('coach');
    expect(p.baselineClipId).toBe(spring.id);
    expect(await server.count('season_baseline')).toBe(1);
    expect(p.progress[0].points.filter((x) => x.baseline).map((x) => x.clipId)).toEqual([spring.id]);
    // The athlete reads her plan, and its chart holds only the clips a review has shared with her.
    const own = await plan('athlete');
    expect(own.canEdit).toBe(false);
    expect(own.clips).toEqual([]);
    await shareWithAthlete(server, spring.id, elsie);
    expect((await plan('athlete')).clips.map((c) => c.id)).toEqual([spring.id]);
  });

  it('reorders the whole plan, by the order sent', async () => {
    const before = (await plan()).focusPoints.map((p: FocusPointDto) => p.id);
    const reversed = [...before].reverse();
    const res = await server.http
      .put(`/api/athletes/${elsie}/focus-points/order`)
      .set(await as('coach'))
      .send({ seasonId: season, ids: reversed });
    expect(res.status).toBe(200);
    expect((await plan('guardian')).focusPoints.map((p) => p.id)).toEqual(reversed);
  });

  it('edits and removes a focus point; a free-text point keeps no target', async () => {
    const created = await addPoint({ title: 'Early pole plant', cue: 'Touch as the skis go flat' });
    expect(created.status).toBe(201);
    expect(created.body.focusPoint).toMatchObject({
      metric: null,
      phase: null,
      targetMin: null,
      status: 'planned',
    });
    const id = created.body.focusPoint.id as string;
    const edited = await server.http
      .put(`/api/focus-points/${id}`)
      .set(await as('coach'))
      .send({ seasonId: season, title: 'Early pole plant', status: 'reached' });
    expect(edited.body.focusPoint.status).toBe('reached');
    expect((await server.http.delete(`/api/focus-points/${id}`).set(await as('coach'))).status).toBe(204);
    expect((await plan()).focusPoints.some((p) => p.id === id)).toBe(false);
  });

  it('keeps a side-by-side still with the clip pair and returns its bytes', async () => {
    await shareWithAthlete(server, autumn.id, elsie);
    const saved = await server.http
      .post('/api/compare-stills')
      .set(await as('coach'))
      .send({
        clipAId: autumn.id,
        clipBId: spring.id,
        frameA: 30,
        frameB: 30,
        caption: 'Both at the apex of turn 2',
        png: PNG,
      });
    expect(saved.status, JSON.stringify(saved.body)).toBe(201);
    const list = await server.http
      .get(`/api/compare-stills?a=${spring.id}&b=${autumn.id}`)
      .set(await as('athlete'));
    expect(list.body.stills.map((s: { caption: string }) => s.caption)).toEqual([
      'Both at the apex of turn 2',
    ]);
    const image = await server.http
      .get(`/api/compare-stills/${saved.body.still.id}/image`)
      .set(await as('guardian'))
      .buffer(true)
      .parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => done(null, Buffer.concat(chunks)));
      });
    expect(image.headers['content-type']).toBe('image/png');
    expect((image.body as Buffer).equals(Buffer.from(PNG.split(',')[1], 'base64'))).toBe(true);
  });
});

describe('bad input gets a clear 4xx and changes nothing', () => {
  it.each([
    [
      'POST /api/seasons: end before start',
      'head',
      'post',
      '/api/seasons',
      { name: 'X', startsOn: '2030-07-01', endsOn: '2030-01-01' },
      400,
    ],
    [
      'POST /api/seasons: overlaps 2026-27',
      'head',
      'post',
      '/api/seasons',
      { name: 'Overlap', startsOn: '2030-01-01', endsOn: '2030-06-01' },
      409,
    ],
    [
      'POST /api/seasons: same name',
      'head',
      'post',
      '/api/seasons',
      { name: '2026-27', startsOn: '1990-01-01', endsOn: '1990-06-01' },
      409,
    ],
    [
      'POST /api/seasons: not a day',
      'head',
      'post',
      '/api/seasons',
      { name: 'Y', startsOn: '2031-02-30', endsOn: '2031-06-01' },
      400,
    ],
    [
      'POST focus point: min above max',
      'coach',
      'post',
      'points',
      { title: 'K', metric: 'kneeSeparationRatio', phase: 'apex', targetMin: 1.3, targetMax: 0.8 },
      400,
    ],
    [
      'POST focus point: unknown metric',
      'coach',
      'post',
      'points',
      { title: 'K', metric: 'elbowFlair', phase: 'apex', targetMin: 1 },
      400,
    ],
    [
      'POST focus point: rise at the apex',
      'coach',
      'post',
      'points',
      { title: 'K', metric: 'transitionRise', phase: 'apex', targetMax: 0.05 },
      400,
    ],
    [
      'POST focus point: unknown season',
      'coach',
      'post',
      'points',
      { title: 'K', seasonId: '00000000-0000-4000-8000-000000000000' },
      404,
    ],
    ['POST focus point: not JSON fields', 'coach', 'post', 'points', { title: 42 }, 400],
    [
      'PUT order: not every point',
      'coach',
      'put',
      'order',
      { ids: ['00000000-0000-4000-8000-000000000000'] },
      400,
    ],
    [
      'PUT order: a point twice',
      'coach',
      'put',
      'order',
      { ids: ['00000000-0000-4000-8000-000000000000', '00000000-0000-4000-8000-000000000000'] },
      400,
    ],
    ['PUT baseline: a clip of another athlete', 'head', 'put', 'baseline', { clipId: 'kit-clip' }, 400],
    ['PUT baseline: not a clip id', 'coach', 'put', 'baseline', { clipId: 'nope' }, 400],
    [
      'PUT focus point: no such point',
      'coach',
      'put',
      '/api/focus-points/00000000-0000-4000-8000-000000000000',
      { title: 'K' },
      404,
    ],
    ['DELETE focus point: not an id', 'coach', 'delete', '/api/focus-points/nope', {}, 400],
    ['GET plan: not an athlete id', 'coach', 'get', '/api/athletes/nope/plan', {}, 400],
    [
      'GET plan: unknown season',
      'coach',
      'get',
      'plan?seasonId=00000000-0000-4000-8000-000000000000',
      {},
      404,
    ],
    ['POST still: same clip twice', 'coach', 'post', '/api/compare-stills', { same: true }, 400],
    [
      'POST still: not a PNG',
      'coach',
      'post',
      '/api/compare-stills',
      { png: 'data:image/png;base64,SGVsbG8gd29ybGQ=' },
      400,
    ],
    [
      'POST still: a JPEG data URL',
      'coach',
      'post',
      '/api/compare-stills',
      { png: 'data:image/jpeg;base64,/9j/4AAQ' },
      400,
    ],
    [
      'GET still image: unknown',
      'coach',
      'get',
      '/api/compare-stills/00000000-0000-4000-8000-000000000000/image',
      {},
      404,
    ],
  ] as const)('%s', async (_name, role, method, target, body, status) => {
    const counts = async () =>
      Promise.all(['season', 'focus_point', 'season_baseline', 'compare_still'].map((t) => server.count(t)));
    const before = await counts();
    const kitClip = (await server.runtime.dataSource.query('SELECT id FROM clip LIMIT 1')) as {
      id: string;
    }[];
    const url =
      target === 'points'
        ? `/api/athletes/${elsie}/focus-points`
        : target === 'order'
          ? `/api/athletes/${elsie}/focus-points/order`
          : target === 'baseline'
            ? `/api/athletes/${elsie}/baseline`
            : target.startsWith('plan')
              ? `/api/athletes/${elsie}/${target}`
              : target;
    let payload: Record<string, unknown> = { ...body };
    if (target === 'points' || target === 'order' || target === 'baseline')
      payload = { seasonId: season, ...payload };
    if (target === '/api/focus-points/00000000-0000-4000-8000-000000000000')
      payload = { seasonId: season, ...payload };
    if (payload.clipId === 'kit-clip') {
      // A clip of Kit (not Elsie): uploaded here so the baseline check has a real clip to refuse.
      payload.clipId = kitClip[0]?.id ?? autumn.id;
      const kit = await server.athleteId('Kit');
      const [s1] = await server.sessionIds();
      const video = await renderVideo('h264-mp4', { seconds: 1, fps: FPS });
      payload.clipId = (
        await uploadClip(server, video.path, { sessionId: s1, athleteIds: kit, view: 'front' }, 'head')
      ).id;
    }
    if (target === '/api/compare-stills')
      payload = {
        clipAId: autumn.id,
        clipBId: payload.same ? autumn.id : spring.id,
        frameA: 1,
        frameB: 1,
        png: (payload.png as string | undefined) ?? PNG,
      };
    const req = server.http[method](url).set(await as(role));
    const res = method === 'get' || method === 'delete' ? await req : await req.send(payload);
    expect(res.status, JSON.stringify(res.body)).toBe(status);
    expect(typeof res.body.error.message).toBe('string');
    expect(await counts()).toEqual(before);
  });
});
