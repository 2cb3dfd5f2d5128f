import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { createTestServer, type TestServer } from '../helpers/server-harness';
import { clip as syntheticClip } from '../shared/series/synthetic-clip';
import {
  removeRenderedVideos,
  renderVideo,
  rowsMentioning as rowsMentioningIn,
  settled,
  shareWithAthlete,
  uploadClip,
} from './clip-fixtures';

// Erasure on request, of a clip and of an athlete: afterwards no row of any table and no object in the
// store refers to what was erased, and the audit keeps who erased what kind of record and when, with no
// name and no id.

const PNG =
  'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==';

let server: TestServer;
let elsie: string;
let sessionId: string;
let videoPath: string;

const rowsMentioning = (text: string) => rowsMentioningIn(server, text);

/** A clip of Elsie with everything a clip gathers: frames, turns, flags, a note, a review, a still. */
async function fullClip(role: 'coach' | 'head' = 'coach'): Promise<ClipDto> {
  const clip = await settled(
    server,
    (await uploadClip(server, videoPath, { sessionId, athleteIds: elsie, view: 'front' }, role)).id,
  );
  const auth = await server.bearer(role);
  const frames = syntheticClip(clip.frameCount!, 25, (t) => ({
    inclinationDeg: 25 * Math.sin((2 * Math.PI * t) / 1600),
    legExtension: 0.85,
    shoulderTiltDeg: 12,
  }));
  expect(
    (await server.http.post(`/api/clips/${clip.id}/frames`).set(auth).send({ model: 'lightning', frames }))
      .status,
  ).toBe(200);
  await server.http.get(`/api/clips/${clip.id}/frames?model=lightning`).set(auth); // waits for turns and flags
  await server.http
    .post(`/api/clips/${clip.id}/notes`)
    .set(auth)
    .send({ timeMs: 200, frameIndex: 5, text: 'Level shoulders' });
  await shareWithAthlete(server, clip.id, elsie);
  return clip;
}

beforeAll(async () => {
  server = await createTestServer();
  elsie = await server.athleteId('Elsie');
  [sessionId] = await server.sessionIds();
  videoPath = (await renderVideo('h264-mp4', { seconds: 2, fps: 25 })).path;
}, 180_000);
afterAll(async () => {
  await server.close();
  await removeRenderedVideos();
});

describe('erasing a clip', () => {
  it('leaves no row and no object that refers to it; the audit entry holds no name', async () => {
    const clip = await fullClip();
    const other = await fullClip();
    // A side-by-side still of the two, kept under the other clip's folder.
    const still = await server.http
      .post('/api/compare-stills')
      .set(await server.bearer('coach'))
      .send({ clipAId: other.id, clipBId: clip.id, frameA: 1, frameB: 1, png: PNG });
    expect(still.status).toBe(201);
    expect(await server.count('flag')).toBeGreaterThan(0);
    expect((await rowsMentioning(clip.id)).length).toBeGreaterThan(5);
    expect((await server.runtime.storage.listKeys()).some((k) => k.includes(clip.id))).toBe(true);

    const res = await server.http.delete(`/api/clips/${clip.id}`).set(await server.bearer('coach'));
    expect(res.status, JSON.stringify(res.body)).toBe(204);

    expect(await rowsMentioning(clip.id)).toEqual([]);
    const keys = await server.runtime.storage.listKeys();
    expect(keys.filter((k) => k.includes(clip.id) || k.includes(still.body.still.id))).toEqual([]);
    // The other clip keeps its own rows and objects.
    expect(keys.some((k) => k.includes(other.id))).toBe(true);
    expect((await server.http.get(`/api/clips/${other.id}`).set(await server.bearer('athlete'))).status).toBe(
      200,
    );
    const [entry] = (await server.runtime.dataSource.query(
      `SELECT * FROM audit_event WHERE action = 'clip.erase' ORDER BY createdAt DESC LIMIT 1`,
    )) as Record<string, unknown>[];
    expect(entry).toMatchObject({ targetType: 'clip', targetId: null, details: null });
    expect(JSON.stringify(entry)).not.toMatch(/Elsie|Marrow|phantom|\.mp4/);
    // Readers get 404 at once.
    expect((await server.http.get(`/api/clips/${clip.id}`).set(await server.bearer('head'))).status).toBe(
      404,
    );
  });

  it('refuses a coach who did not upload it, an athlete, and another club’s clip: nothing removed', async () => {
    const byHead = await fullClip('head');
    const before = await rowsMentioning(byHead.id);
    for (const [role, status] of [
      ['coach', 403],
      ['analyst', 403],
      ['athlete', 403],
      ['guardian', 403],
    ] as const) {
      const res = await server.http.delete(`/api/clips/${byHead.id}`).set(await server.bearer(role));
      expect(res.status, role).toBe(status);
      expect(typeof res.body.error.message).toBe('string');
    }
    const unknown = await server.http
      .delete('/api/clips/00000000-0000-4000-8000-000000000000')
      .set(await server.bearer('head'));
    expect(unknown.status).toBe(404);
    expect((await server.http.delete('/api/clips/not-an-id').set(await server.bearer('head'))).status).toBe(
      400,
    );
    expect(await rowsMentioning(byHead.id)).toEqual(before);
    // The head coach may.
    expect(
      (await server.http.delete(`/api/clips/${byHead.id}`).set(await server.bearer('head'))).status,
    ).toBe(204);
  });
});

describe('erasing an athlete', () => {
  it('refuses a coach, an analyst and an unknown athlete, removing nothing', async () => {
    const before = await rowsMentioning(elsie);
    for (const role of ['coach', 'analyst', 'athlete', 'guardian'] as const) {
      const res = await server.http.delete(`/api/athletes/${elsie}`).set(await server.bearer(role));
      expect(res.status, role).toBe(403);
    }
    const unknown = await server.http
      .delete('/api/athletes/00000000-0000-4000-8000-000000000000')
      .set(await server.bearer('head'));
    expect(unknown.status).toBe(404);
    expect(await rowsMentioning(elsie)).toEqual(before);
  });

  it('leaves no row and no object that refers to her; her sibling and their guardian stay', async () => {
    const clip = await fullClip();
    const season = await server.http
      .post('/api/seasons')
      .set(await server.bearer('head'))
      .send({ name: '2026-27', startsOn: '2000-01-01', endsOn: '2099-12-31' });
    const point = await server.http
      .post(`/api/athletes/${elsie}/focus-points`)
      .set(await server.bearer('coach'))
      .send({ seasonId: season.body.season.id, title: 'Knees apart' });
    expect(point.status).toBe(201);
    await server.http
      .put(`/api/athletes/${elsie}/baseline`)
      .set(await server.bearer('coach'))
      .send({ seasonId: season.body.season.id, clipId: clip.id });
    const [{ userId }] = (await server.runtime.dataSource.query('SELECT userId FROM athlete WHERE id = ?', [
      elsie,
    ])) as { userId: string }[];
    const [{ guardianUserId }] = (await server.runtime.dataSource.query(
      'SELECT guardianUserId FROM guardian_link WHERE athleteId = ?',
      [elsie],
    )) as { guardianUserId: string }[];
    const finn = await server.athleteId('Finn');
    expect((await rowsMentioning(elsie)).length).toBeGreaterThan(5);
    expect((await rowsMentioning(userId)).length).toBeGreaterThan(0);

    const res = await server.http.delete(`/api/athletes/${elsie}`).set(await server.bearer('head'));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.clips).toBeGreaterThanOrEqual(1);

    expect(await rowsMentioning(elsie)).toEqual([]);
    expect(await rowsMentioning(userId)).toEqual([]);
    expect(await rowsMentioning('Elsie')).toEqual([]);
    expect(await rowsMentioning('athlete@larchwood.example')).toEqual([]);
    expect((await server.runtime.storage.listKeys()).filter((k) => k.includes(clip.id))).toEqual([]);
    // Her brother and their guardian (who is also his) stay.
    expect((await rowsMentioning(finn)).length).toBeGreaterThan(0);
    expect((await rowsMentioning(guardianUserId)).length).toBeGreaterThan(0);
    const [entry] = (await server.runtime.dataSource.query(
      `SELECT * FROM audit_event WHERE action = 'athlete.erase' ORDER BY createdAt DESC LIMIT 1`,
    )) as Record<string, unknown>[];
    expect(entry).toMatchObject({ targetType: 'athlete', targetId: null, details: null });
    expect(JSON.stringify(entry)).not.toMatch(/Elsie|Marrow/);
  });
});
