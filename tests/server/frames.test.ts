import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Keypoint } from '@shared/keypoints';
import { computeFrameMetrics } from '@shared/metrics';
import type { ClipDto } from '@shared/schemas/clip.schema';
import type { ClipFlagDto as FlagDto } from '@shared/schemas/flag.schema';
import type { ClipFramesResponse } from '@shared/schemas/frames.schema';
import { createTestServer, type TestServer } from '../helpers/server-harness';
import { clip as syntheticClip } from '../shared/series/synthetic-clip';
import { removeRenderedVideos, renderVideo, settled, shareWithAthlete, uploadClip } from './clip-fixtures';

// 8 s at 25 fps: 200 frames, long enough for several turns of the synthetic skier below.
const SECONDS = 8;
const FPS = 25;

let server: TestServer;
let sessionId: string;
let elsie: string;
let front: ClipDto;
let second: ClipDto;

/**
 * A front-view frame whose shoulders tilt by a hand-derived angle. Image pixels, y down: the left
 * shoulder (skier's left) at (140, 90), the right at (100, 100). In y-up terms d = left − right =
 * (40, 10), so shoulderTilt = atan2(10, |40|) = 14.036° (docs/metrics.md definition), 6.036° above the
 * ±8° band of U14 (docs/metrics.md "Tolerance bands": level shoulders within ±8°).
 */
const TILTED: Keypoint[] = [
  { name: 'left_shoulder', x: 140, y: 90, score: 0.9 },
  { name: 'right_shoulder', x: 100, y: 100, score: 0.9 },
  { name: 'left_hip', x: 130, y: 150, score: 0.9 },
  { name: 'right_hip', x: 110, y: 150, score: 0.9 },
];
const TILT_DEG = (Math.atan2(10, 40) * 180) / Math.PI; // 14.0362…

/** The same shoulders level: no flag. */
const LEVEL: Keypoint[] = TILTED.map((k) => (k.name === 'right_shoulder' ? { ...k, y: 90 } : k));

async function coach() {
  return server.bearer('coach');
}

async function postFrames(clipId: string, body: unknown) {
  return server.http
    .post(`/api/clips/${clipId}/frames`)
    .set(await coach())
    .send(body as object);
}

async function readFrames(clipId: string, model = 'lightning'): Promise<ClipFramesResponse> {
  const res = await server.http.get(`/api/clips/${clipId}/frames?model=${model}`).set(await coach());
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as ClipFramesResponse;
}

// Flags group neighbouring frames outside a band (one per turn or stretch): the shoulder-tilt flag
// whose stretch holds this frame.
const tiltFlags = (flags: FlagDto[], frameIndex: number) =>
  flags.filter((f) => f.metric === 'shoulderTilt' && f.firstFrame <= frameIndex && frameIndex <= f.lastFrame);

beforeAll(async () => {
  server = await createTestServer();
  [sessionId] = await server.sessionIds();
  elsie = await server.athleteId('Elsie');
  const video = await renderVideo('h264-mp4', { seconds: SECONDS, fps: FPS });
  const uploaded = [
    await uploadClip(server, video.path, { sessionId, athleteIds: elsie, view: 'front' }),
    await uploadClip(server, video.path, { sessionId, athleteIds: elsie, view: 'front' }),
  ];
  front = await settled(server, uploaded[0].id);
  second = await settled(server, uploaded[1].id);
});
afterAll(async () => {
  await server.close();
  await removeRenderedVideos();
});

describe('POST /api/clips/:id/frames validation', () => {
  const good = { frameIndex: 0, timeMs: 0, keypoints: TILTED };

  const cases: [string, unknown, string][] = [
    [
      'an unknown keypoint name',
      {
        model: 'lightning',
        frames: [{ ...good, keypoints: [{ name: 'left_toe', x: 1, y: 2, score: 0.5 }] }],
      },
      'frames.0.keypoints.0.name',
    ],
    [
      'a coordinate that is not a number',
      {
        model: 'lightning',
        frames: [{ ...good, keypoints: [{ name: 'nose', x: 'NaN', y: 2, score: 0.5 }] }],
      },
      'frames.0.keypoints.0.x',
    ],
    [
      'a score above 1',
      { model: 'lightning', frames: [{ ...good, keypoints: [{ name: 'nose', x: 1, y: 2, score: 1.5 }] }] },
      'frames.0.keypoints.0.score',
    ],
    [
      'a negative frame index',
      { model: 'lightning', frames: [{ ...good, frameIndex: -1 }] },
      'frames.0.frameIndex',
    ],
    [
      'a fractional frame index',
      { model: 'lightning', frames: [{ ...good, frameIndex: 2.5 }] },
      'frames.0.frameIndex',
    ],
    ['the same frame twice', { model: 'lightning', frames: [good, good] }, 'frames.1.frameIndex'],
    [
      'a BlazePose-only point from a MoveNet model',
      { model: 'thunder', frames: [{ ...good, keypoints: [{ name: 'left_heel', x: 1, y: 2, score: 0.5 }] }] },
      'frames.0.keypoints.0.name',
    ],
    ['an unknown model', { model: 'posenet', frames: [good] }, 'model'],
    [
      'a careful flag that is not true or false',
      { model: 'lightning', careful: 'yes', frames: [good] },
      'careful',
    ],
    ['no frames', { model: 'lightning', frames: [] }, 'frames'],
    [
      'more than 500 frames',
      { model: 'lightning', frames: Array.from({ length: 501 }, (_, i) => ({ ...good, frameIndex: i })) },
      'frames',
    ],
  ];

  for (const [what, body, path] of cases) {
    it(`rejects ${what} with 400 naming ${path}, storing nothing`, async () => {
      const before = await server.count('frame_result');
      const res = await postFrames(front.id, body);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      const paths = (res.body.error.details.issues as { path: (string | number)[] }[]).map((i) =>
        i.path.join('.'),
      );
      expect(paths).toContain(path);
      expect(await server.count('frame_result')).toBe(before);
    });
  }

  it('rejects a frame index past the clip’s last frame, saying which', async () => {
    const res = await postFrames(front.id, {
      model: 'lightning',
      frames: [good, { ...good, frameIndex: SECONDS * FPS }],
    });
    expect(res.status).toBe(400);
    expect(res.body.error.details.issues[0].path).toEqual(['frames', 1, 'frameIndex']);
    expect(res.body.error.message).toContain(`past the clip's last frame (${SECONDS * FPS - 1})`);
    expect((await readFrames(front.id)).frames).toEqual([]);
  });

  it('rejects a literal NaN (not JSON) as a malformed body', async () => {
    const res = await server.http
      .post(`/api/clips/${front.id}/frames`)
      .set(await coach())
      .set('Content-Type', 'application/json')
      .send(
        '{"model":"lightning","frames":[{"frameIndex":0,"timeMs":0,"keypoints":[{"name":"nose","x":NaN,"y":1,"score":1}]}]}',
      );
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('malformed_body');
  });

  it('refuses results for a clip that is not processed yet (409)', async () => {
    await server.runtime.dataSource.query(`UPDATE clip SET status = 'processing' WHERE id = ?`, [second.id]);
    try {
      const res = await postFrames(second.id, { model: 'lightning', frames: [good] });
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('clip_not_ready');
    } finally {
      await server.runtime.dataSource.query(`UPDATE clip SET status = 'ready' WHERE id = ?`, [second.id]);
    }
  });
});

describe('stored metrics and flags', () => {
  it('ignores metrics sent by the client and stores what shared/metrics computes from the keypoints', async () => {
    const res = await postFrames(front.id, {
      model: 'lightning',
      frames: [
        { frameIndex: 3, timeMs: 120, keypoints: TILTED, metrics: { shoulderTilt: 0, inclination: 99 } },
      ],
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.stored).toBe(1);
    const stored = (await readFrames(front.id)).frames.find((f) => f.frameIndex === 3)!;
    const expected = computeFrameMetrics({ keypoints: TILTED, view: 'front' });
    expect(stored.metrics).toEqual(expected.metrics);
    expect(stored.reasons).toEqual(expected.reasons);
    expect(stored.metrics.shoulderTilt).toBeCloseTo(TILT_DEG, 6);
    expect(stored.corrected).toBe(false);
  });

  it('stores a flag for the frame whose shoulder tilt is outside the U14 band', async () => {
    const { flags } = await readFrames(front.id);
    const [flag] = tiltFlags(flags, 3);
    expect(flag).toMatchObject({ model: 'lightning', min: -8, max: 8, side: 'above', turnIndex: null });
    expect(flag.value).toBeCloseTo(TILT_DEG, 6);
    expect(flag.distance).toBeCloseTo(TILT_DEG - 8, 6);
    const rows = (await server.runtime.dataSource.query(
      `SELECT f.metric, b.source FROM flag f JOIN tolerance_band b ON b.id = f.toleranceBandId WHERE f.clipId = ? AND f.frameIndex = 3`,
      [front.id],
    )) as { metric: string; source: string }[];
    expect(rows).toContainEqual({ metric: 'shoulderTilt', source: 'common practice' });
  });

  it('raises no flag for level shoulders, and replaces the frame’s flags when it is posted again', async () => {
    const res = await postFrames(front.id, {
      model: 'lightning',
      frames: [
        { frameIndex: 3, timeMs: 120, keypoints: LEVEL },
        { frameIndex: 4, timeMs: 160, keypoints: TILTED },
      ],
    });
    expect(res.body.stored).toBe(2);
    const { flags } = await readFrames(front.id);
    expect(tiltFlags(flags, 3)).toEqual([]);
    expect(tiltFlags(flags, 4)).toHaveLength(1);
    expect(res.body.flags).toBe(flags.length);
  });

  it('shows the stored analysis on the clip', async () => {
    const res = await server.http.get(`/api/clips/${front.id}`).set(await coach());
    expect(res.body.clip.analysis).toMatchObject({ frameCount: 2, model: 'lightning' });
    expect(res.body.clip.ageGroup.name).toBe('U14');
  });
});

describe('corrections', () => {
  it('PUT stores the coach’s keypoints as corrected and recomputes at once', async () => {
    const res = await server.http
      .put(`/api/clips/${front.id}/frames/4`)
      .set(await coach())
      .send({ model: 'lightning', keypoints: LEVEL });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.frame).toMatchObject({ frameIndex: 4, timeMs: 160, corrected: true });
    expect(res.body.frame.metrics.shoulderTilt).toBe(0);
    expect(tiltFlags((await readFrames(front.id)).flags, 4)).toEqual([]);
  });

  it('a later detection does not overwrite a corrected frame; a later correction does', async () => {
    const detected = await postFrames(front.id, {
      model: 'lightning',
      frames: [
        { frameIndex: 4, timeMs: 160, keypoints: TILTED },
        { frameIndex: 5, timeMs: 200, keypoints: TILTED },
      ],
    });
    expect(detected.body.stored).toBe(1);
    let frame4 = (await readFrames(front.id)).frames.find((f) => f.frameIndex === 4)!;
    expect(frame4).toMatchObject({ corrected: true, keypoints: LEVEL });

    const corrected = await postFrames(front.id, {
      model: 'lightning',
      frames: [{ frameIndex: 4, timeMs: 160, keypoints: TILTED, corrected: true }],
    });
    expect(corrected.body.stored).toBe(1);
    frame4 = (await readFrames(front.id)).frames.find((f) => f.frameIndex === 4)!;
    expect(frame4).toMatchObject({ corrected: true, keypoints: TILTED });
  });

  it('a correction for a frame not yet stored takes its time from the frame rate', async () => {
    const res = await server.http
      .put(`/api/clips/${front.id}/frames/50`)
      .set(await coach())
      .send({ model: 'lightning', keypoints: LEVEL });
    expect(res.status).toBe(200);
    // frame 50 at 25 fps: 50 × 1000 / 25 = 2000 ms.
    expect(res.body.frame.timeMs).toBe(2000);
  });

  it('rejects a correction past the clip’s end or with bad keypoints', async () => {
    const past = await server.http
      .put(`/api/clips/${front.id}/frames/${SECONDS * FPS}`)
      .set(await coach())
      .send({ model: 'lightning', keypoints: LEVEL });
    expect(past.status).toBe(400);
    const bad = await server.http
      .put(`/api/clips/${front.id}/frames/6`)
      .set(await coach())
      .send({ model: 'lightning', keypoints: [{ name: 'left_shoulder', x: 1, y: 2 }] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.issues[0].path).toEqual(['keypoints', 0, 'score']);
  });
});

describe('snow line and view', () => {
  it('a snow line along the shoulders makes them level against it; clearing it restores the image horizontal', async () => {
    // The line from (0, 100) to (40, 90) has the shoulders' direction (40, 10) in y-up terms.
    const set = await server.http
      .patch(`/api/clips/${front.id}`)
      .set(await coach())
      .send({
        referenceLine: [
          [0, 100],
          [40, 90],
        ],
      });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    expect(set.body.clip.referenceLine).toEqual([
      [0, 100],
      [40, 90],
    ]);
    let frames = await readFrames(front.id);
    const frame5 = frames.frames.find((f) => f.frameIndex === 5)!;
    expect(frame5.metrics.shoulderTilt).toBeCloseTo(0, 9);
    expect(tiltFlags(frames.flags, 5)).toEqual([]);
    // Level shoulders on frame 3 now tilt against the line by the same angle, the other way.
    expect(frames.frames.find((f) => f.frameIndex === 3)!.metrics.shoulderTilt).toBeCloseTo(-TILT_DEG, 6);
    expect(tiltFlags(frames.flags, 3)[0]).toMatchObject({ side: 'below' });

    const cleared = await server.http
      .patch(`/api/clips/${front.id}`)
      .set(await coach())
      .send({ referenceLine: null });
    expect(cleared.body.clip.referenceLine).toBeNull();
    frames = await readFrames(front.id);
    expect(frames.frames.find((f) => f.frameIndex === 5)!.metrics.shoulderTilt).toBeCloseTo(TILT_DEG, 6);
    expect(tiltFlags(frames.flags, 5)).toHaveLength(1);
  });

  it('rejects a snow line whose two points coincide', async () => {
    const res = await server.http
      .patch(`/api/clips/${front.id}`)
      .set(await coach())
      .send({
        referenceLine: [
          [10, 10],
          [10, 10],
        ],
      });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toContain('at least a pixel apart');
  });

  it('switching the view recomputes: front-only metrics become null with "wrong view" and lose their flags', async () => {
    const res = await server.http
      .patch(`/api/clips/${front.id}`)
      .set(await coach())
      .send({ view: 'side' });
    expect(res.body.clip.view).toBe('side');
    const frames = await readFrames(front.id);
    const frame5 = frames.frames.find((f) => f.frameIndex === 5)!;
    expect(frame5.metrics.shoulderTilt).toBeNull();
    expect(frame5.reasons.shoulderTilt).toBe('wrong view');
    expect(frames.flags.filter((f) => f.metric === 'shoulderTilt')).toEqual([]);
    await server.http
      .patch(`/api/clips/${front.id}`)
      .set(await coach())
      .send({ view: 'front' });
    expect(tiltFlags((await readFrames(front.id)).flags, 5)).toHaveLength(1);
  });

  it('a frame’s own snow line holds for that frame only, over the clip’s line', async () => {
    const set = await server.http
      .patch(`/api/clips/${front.id}`)
      .set(await coach())
      .send({
        frameReferenceLines: [
          {
            frameIndex: 5,
            referenceLine: [
              [0, 100],
              [40, 90],
            ],
          },
        ],
      });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    expect(set.body.clip.frameReferenceLines).toEqual([
      {
        frameIndex: 5,
        referenceLine: [
          [0, 100],
          [40, 90],
        ],
      },
    ]);
    let frames = await readFrames(front.id);
    expect(frames.frames.find((f) => f.frameIndex === 5)!.metrics.shoulderTilt).toBeCloseTo(0, 9);
    expect(frames.frames.find((f) => f.frameIndex === 4)!.metrics.shoulderTilt).toBeCloseTo(TILT_DEG, 6);
    expect(tiltFlags(frames.flags, 5)).toEqual([]);

    const cleared = await server.http
      .patch(`/api/clips/${front.id}`)
      .set(await coach())
      .send({ frameReferenceLines: [{ frameIndex: 5, referenceLine: null }] });
    expect(cleared.body.clip.frameReferenceLines).toEqual([]);
    frames = await readFrames(front.id);
    expect(frames.frames.find((f) => f.frameIndex === 5)!.metrics.shoulderTilt).toBeCloseTo(TILT_DEG, 6);

    const past = await server.http
      .patch(`/api/clips/${front.id}`)
      .set(await coach())
      .send({
        frameReferenceLines: [
          {
            frameIndex: SECONDS * FPS,
            referenceLine: [
              [0, 0],
              [10, 0],
            ],
          },
        ],
      });
    expect(past.status).toBe(400);
    expect(past.body.error.details.issues[0].path).toEqual(['frameReferenceLines', 0, 'frameIndex']);
  });

  it('keeps the default model', async () => {
    const res = await server.http
      .patch(`/api/clips/${front.id}`)
      .set(await coach())
      .send({ defaultModel: 'blazepose' });
    expect(res.body.clip.defaultModel).toBe('blazepose');
    const empty = await server.http
      .patch(`/api/clips/${front.id}`)
      .set(await coach())
      .send({});
    expect(empty.status).toBe(400);
  });
});

describe('whole clip: series, turns and transition flags', () => {
  // The synthetic skier (tests/shared/series/synthetic-clip.ts) leans ±25° with a 1.6 s period, so
  // it turns every 800 ms with transitions at 0, 800, 1600 ms…; standHeight = 4 + 0.3·cos(2πt/800)
  // is 4.3 hip widths at each transition and 3.7 at each apex: a transition rise of 4.3 / 3.7 − 1 =
  // 0.162 by construction, above the 0.05 band ("no standing tall in the transition", docs/metrics.md).
  const frames = syntheticClip(SECONDS * FPS, FPS, (t) => ({
    inclinationDeg: 25 * Math.sin((2 * Math.PI * t) / 1600),
    legExtension: 0.85,
    standHeight: 4 + 0.3 * Math.cos((2 * Math.PI * t) / 800),
    shoulderTiltDeg: 0,
  }));

  it('stores all frames, finds the turns and stores one transition flag per turn that ends in a transition', async () => {
    const res = await postFrames(second.id, { model: 'thunder', frames });
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
    expect(res.body.stored).toBe(SECONDS * FPS);
    const read = await readFrames(second.id, 'thunder');
    expect(read.frames).toHaveLength(SECONDS * FPS);
    const turns = read.series!.turns;
    // 8 s of 800 ms turns: 10 turns, the first and last cut by the clip's edges.
    expect(turns).toHaveLength(10);
    // Every turn but the last ends in a transition, so each has a rise (the last is cut by the clip's end).
    const ending = turns.filter((t) => t.transitionRise !== null);
    expect(ending.map((t) => t.index)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8]);
    const riseFlags = read.flags.filter((f) => f.metric === 'transitionRise');
    expect(riseFlags.map((f) => f.turnIndex).sort((a, b) => a! - b!)).toEqual(ending.map((t) => t.index));
    for (const flag of riseFlags) {
      const turn = turns[flag.turnIndex!];
      expect(flag.frameIndex).toBe(turn.endFrame);
      expect(flag).toMatchObject({ max: 0.05, side: 'above' });
      // Smoothing at 6 Hz barely touches a 1.25 Hz swing: within 0.02 of the constructed 0.16.
      expect(flag.value).toBeCloseTo(0.162, 1);
      expect(Math.abs(flag.value - 0.162)).toBeLessThan(0.02);
    }
  });

  it('a second visit reads the same stored results and series', async () => {
    const first = await readFrames(second.id, 'thunder');
    const again = await readFrames(second.id, 'thunder');
    expect(again).toEqual(first);
    // Another model's results are kept apart.
    expect((await readFrames(second.id, 'lightning')).frames).toEqual([]);
  });

  it('frames filmed with a tilted camera, each with its own snow line, give the same turns', async () => {
    // The same skier with every point and the snow line turned 12° about the image origin
    // (y-up rotation, x' = x·cos − y·sin, y' = x·sin + y·cos): every angle is measured against
    // the line, so the series must not change.
    const theta = (12 * Math.PI) / 180;
    const turn = (x: number, y: number): [number, number] => {
      const [X, Y] = [x, -y];
      return [X * Math.cos(theta) - Y * Math.sin(theta), -(X * Math.sin(theta) + Y * Math.cos(theta))];
    };
    const tilted = frames.map((f) => ({
      ...f,
      keypoints: f.keypoints.map((k) => {
        const [x, y] = turn(k.x, k.y);
        return { ...k, x, y };
      }),
    }));
    const video = await renderVideo('h264-mp4', { seconds: SECONDS, fps: FPS });
    const clip = await settled(
      server,
      (await uploadClip(server, video.path, { sessionId, athleteIds: elsie, view: 'front' })).id,
    );
    expect((await postFrames(clip.id, { model: 'thunder', frames: tilted })).status).toBe(200);
    const line = [turn(0, 0), turn(100, 0)];
    const patched = await server.http
      .patch(`/api/clips/${clip.id}`)
      .set(await coach())
      .send({ frameReferenceLines: tilted.map((f) => ({ frameIndex: f.frameIndex, referenceLine: line })) });
    expect(patched.status, JSON.stringify(patched.body).slice(0, 300)).toBe(200);

    const upright = (await readFrames(second.id, 'thunder')).series!;
    const leaning = (await readFrames(clip.id, 'thunder')).series!;
    expect(leaning.turns.map((t) => [t.direction, t.apexFrame, t.endFrame])).toEqual(
      upright.turns.map((t) => [t.direction, t.apexFrame, t.endFrame]),
    );
    leaning.turns.forEach((t, i) => {
      expect(t.apexValues.inclination!).toBeCloseTo(upright.turns[i].apexValues.inclination!, 6);
      if (t.transitionRise !== null)
        expect(t.transitionRise).toBeCloseTo(upright.turns[i].transitionRise!, 6);
    });
  });

  it('the analysts and athletes may read but not write', async () => {
    await shareWithAthlete(server, second.id, elsie);
    const athlete = await server.http
      .get(`/api/clips/${second.id}/frames?model=thunder`)
      .set(await server.bearer('athlete'));
    expect(athlete.status).toBe(200);
    expect(athlete.body.frames).toHaveLength(SECONDS * FPS);
    const analyst = await server.http
      .post(`/api/clips/${second.id}/frames`)
      .set(await server.bearer('analyst'))
      .send({ model: 'thunder', frames: frames.slice(0, 1) });
    expect(analyst.status).toBe(403);
  });
});

describe('careful reading', () => {
  it('records frames read carefully, and a hand correction keeps that record', async () => {
    const res = await postFrames(front.id, {
      model: 'lightning',
      careful: true,
      frames: [{ frameIndex: 7, timeMs: 280, keypoints: LEVEL }],
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const frame = (n: number) => readFrames(front.id).then((r) => r.frames.find((f) => f.frameIndex === n)!);
    expect(await frame(7)).toMatchObject({ careful: true, corrected: false });
    expect((await frame(5)).careful).toBe(false);
    await server.http
      .put(`/api/clips/${front.id}/frames/7`)
      .set(await coach())
      .send({ model: 'lightning', keypoints: LEVEL })
      .expect(200);
    expect(await frame(7)).toMatchObject({ careful: true, corrected: true });
    // Level shoulders: no flags to disturb the stretches the other tests read.
    // Read again at the usual pace, a frame says so.
    await postFrames(front.id, {
      model: 'lightning',
      frames: [{ frameIndex: 8, timeMs: 320, keypoints: LEVEL }],
    });
    expect((await frame(8)).careful).toBe(false);
  });
});

describe('a facing turned while frames were being read', () => {
  it('swaps a batch read for the other facing, keeps one read for the clip’s, and refuses an unknown facing', async () => {
    const turned = await server.http
      .patch(`/api/clips/${front.id}`)
      .set(await coach())
      .send({ facing: 'away' });
    expect(turned.status).toBe(200);
    const at = (frame: number) =>
      readFrames(front.id).then((r) => r.frames.find((f) => f.frameIndex === frame)!.keypoints);
    const leftShoulder = (points: Keypoint[]) => points.find((k) => k.name === 'left_shoulder')!;
    const sent = TILTED.find((k) => k.name === 'left_shoulder')!;
    const other = TILTED.find((k) => k.name === 'right_shoulder')!;

    // Read before the turn (oriented for "toward"): stored with the sides swapped, as the turn swapped the rest.
    await postFrames(front.id, {
      model: 'lightning',
      facing: 'toward',
      frames: [{ frameIndex: 11, timeMs: 440, keypoints: TILTED }],
    }).then((r) => expect(r.status).toBe(200));
    expect(leftShoulder(await at(11))).toMatchObject({ x: other.x, y: other.y });
    // Read for the clip's facing, or not saying: stored as sent.
    for (const [frameIndex, facing] of [
      [12, 'away'],
      [13, undefined],
    ] as const) {
      await postFrames(front.id, {
        model: 'lightning',
        ...(facing ? { facing } : {}),
        frames: [{ frameIndex, timeMs: frameIndex * 40, keypoints: TILTED }],
      }).then((r) => expect(r.status).toBe(200));
      expect(leftShoulder(await at(frameIndex))).toMatchObject({ x: sent.x, y: sent.y });
    }
    const bad = await postFrames(front.id, {
      model: 'lightning',
      facing: 'sideways',
      frames: [{ frameIndex: 14, timeMs: 560, keypoints: TILTED }],
    });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body)).toContain('facing');
  });
});
