import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ClipFramesResponse } from '@shared/schemas/frames.schema';
import { createTestServer, type TestServer } from '../helpers/server-harness';
import { clip as syntheticClip } from '../shared/series/synthetic-clip';
import { removeRenderedVideos, renderVideo, settled, uploadClip } from './clip-fixtures';

// A clip filmed from behind (docs/metrics.md, "Filmed from behind"): changing the clip's facing swaps
// the stored points' left and right and measures every frame again, so metrics, turns and flags are the
// skier's own sides; changing it back restores them exactly.

let server: TestServer;
let videoPath: string;
let sessionId: string;
let elsie: string;

beforeAll(async () => {
  server = await createTestServer();
  [sessionId] = await server.sessionIds();
  elsie = await server.athleteId('Elsie');
  videoPath = (await renderVideo('h264-mp4', { seconds: 2, fps: 25 })).path;
}, 180_000);
afterAll(async () => {
  await server.close();
  await removeRenderedVideos();
});

describe('a clip’s facing', () => {
  it('swaps stored left and right when it changes, and measures again', async () => {
    const clip = await settled(
      server,
      (await uploadClip(server, videoPath, { sessionId, athleteIds: elsie, view: 'front' })).id,
    );
    expect(clip.facing).toBe('toward');
    const auth = await server.bearer('coach');
    const frames = syntheticClip(clip.frameCount!, 25, (t) => ({
      inclinationDeg: 20 * Math.sin((2 * Math.PI * t) / 1600),
      legExtension: 0.85,
      shoulderTiltDeg: 6,
    }));
    expect(
      (await server.http.post(`/api/clips/${clip.id}/frames`).set(auth).send({ model: 'lightning', frames }))
        .status,
    ).toBe(200);
    const read = async () =>
      (await server.http.get(`/api/clips/${clip.id}/frames?model=lightning`).set(auth))
        .body as ClipFramesResponse;
    const before = await read();

    const patched = await server.http.patch(`/api/clips/${clip.id}`).set(auth).send({ facing: 'away' });
    expect(patched.status, JSON.stringify(patched.body)).toBe(200);
    expect(patched.body.clip.facing).toBe('away');
    const after = await read();
    const point = (f: ClipFramesResponse['frames'][number], name: string) =>
      f.keypoints.find((k) => k.name === name)!;
    for (const [i, frame] of after.frames.entries()) {
      const was = before.frames[i];
      expect(point(frame, 'left_hip')).toMatchObject({
        x: point(was, 'right_hip').x,
        y: point(was, 'right_hip').y,
      });
      expect(frame.metrics.shoulderTilt).toBeCloseTo(-was.metrics.shoulderTilt!, 9);
      if (was.metrics.inclination !== null)
        expect(frame.metrics.inclination).toBeCloseTo(-was.metrics.inclination, 9);
    }
    // Turns keep their frames, with the other direction.
    expect(before.series!.turns.length).toBeGreaterThan(1);
    expect(after.series!.turns.map((t) => [t.apexFrame, t.direction])).toEqual(
      before.series!.turns.map((t) => [t.apexFrame, t.direction === 'left' ? 'right' : 'left']),
    );

    // Back to toward the camera: exactly what was stored first.
    await server.http.patch(`/api/clips/${clip.id}`).set(auth).send({ facing: 'toward' });
    const back = await read();
    expect(back.frames.map((f) => f.keypoints)).toEqual(before.frames.map((f) => f.keypoints));
    expect(back.frames.map((f) => f.metrics)).toEqual(before.frames.map((f) => f.metrics));
  });

  it('is taken at upload, and refuses a value it does not know, changing nothing', async () => {
    const clip = await uploadClip(server, videoPath, {
      sessionId,
      athleteIds: elsie,
      view: 'front',
      facing: 'away',
    });
    expect(clip.facing).toBe('away');
    const auth = await server.bearer('coach');
    const bad = await server.http.patch(`/api/clips/${clip.id}`).set(auth).send({ facing: 'sideways' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.issues[0].path).toEqual(['facing']);
    const badUpload = await server.http
      .post('/api/clips')
      .set(auth)
      .field('sessionId', sessionId)
      .field('athleteIds', elsie)
      .field('view', 'front')
      .field('facing', 'upside-down')
      .attach('file', videoPath);
    expect(badUpload.status).toBe(400);
    for (const role of ['analyst', 'athlete', 'guardian'] as const)
      expect(
        (
          await server.http
            .patch(`/api/clips/${clip.id}`)
            .set(await server.bearer(role))
            .send({ facing: 'toward' })
        ).status,
        role,
      ).toBeGreaterThanOrEqual(403);
    expect((await server.http.get(`/api/clips/${clip.id}`).set(auth)).body.clip.facing).toBe('away');
  });

  it('keeps the athlete the coach picked, checks the point is in the clip, and forgets it on request', async () => {
    const clip = await settled(
      server,
      (await uploadClip(server, videoPath, { sessionId, athleteIds: elsie, view: 'front' })).id,
    );
    expect(clip.athletePick).toBeNull();
    const auth = await server.bearer('coach');
    const pick = { frameIndex: 3, x: 100, y: 80 };
    const saved = await server.http.patch(`/api/clips/${clip.id}`).set(auth).send({ athletePick: pick });
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    expect(saved.body.clip.athletePick).toEqual(pick);
    for (const [bad, field] of [
      [{ frameIndex: clip.frameCount! + 5, x: 10, y: 10 }, 'frameIndex'],
      [{ frameIndex: 1, x: clip.width! + 50, y: 10 }, null],
      [{ frameIndex: 1, x: -3, y: 10 }, 'x'],
      [{ frameIndex: 1.5, x: 3, y: 10 }, 'frameIndex'],
      [{ frameIndex: 1, x: 3 }, 'y'],
      [{ frameIndex: 1, x: 3, y: 3, size: 2 }, null],
    ] as const) {
      const res = await server.http.patch(`/api/clips/${clip.id}`).set(auth).send({ athletePick: bad });
      expect(res.status, JSON.stringify(bad)).toBe(400);
      if (field) expect(JSON.stringify(res.body.error.details.issues[0].path)).toContain(field);
    }
    expect((await server.http.get(`/api/clips/${clip.id}`).set(auth)).body.clip.athletePick).toEqual(pick);
    const forgotten = await server.http.patch(`/api/clips/${clip.id}`).set(auth).send({ athletePick: null });
    expect(forgotten.body.clip.athletePick).toBeNull();
  });
});
