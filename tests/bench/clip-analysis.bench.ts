// How long the clip workspace's server side takes: making playable copies, storing a whole clip's
// frame results in 500-frame batches, and reading them back (series computed, then cached).
// Prints figures only.
import { performance } from 'node:perf_hooks';
import { createTestServer } from '../helpers/server-harness';
import { clip as syntheticClip } from '../shared/series/synthetic-clip';
import { removeRenderedVideos, renderVideo, settled, uploadClip } from '../server/clip-fixtures';

const FPS = 30;
const SECONDS = 100; // 3,000 frames: a long training run

function line(label: string, ms: number, extra = ''): void {
  process.stdout.write(`${label.padEnd(52)} ${ms.toFixed(0).padStart(7)} ms${extra ? `  ${extra}` : ''}\n`);
}

const server = await createTestServer();
try {
  const [sessionId] = await server.sessionIds();
  const athleteIds = await server.athleteId('Elsie');
  const auth = await server.bearer('coach');

  for (const [kind, label] of [
    ['h264-mp4', 'H.264 MP4 640×360 10 s (poster, thumbnails only)'],
    ['xvid-avi', 'Xvid AVI 640×360 10 s (+ H.264 copy)'],
    ['hevc-mp4', 'HEVC MP4 640×360 10 s (+ H.264 copy)'],
  ] as const) {
    const video = await renderVideo(kind, { seconds: 10, fps: FPS, width: 640, height: 360 });
    const start = performance.now();
    const uploaded = await uploadClip(server, video.path, { sessionId, athleteIds, view: 'front' });
    const ready = await settled(server, uploaded.id);
    line(`upload to ready: ${label}`, performance.now() - start, ready.status);
  }

  const video = await renderVideo('h264-mp4', { seconds: SECONDS, fps: FPS, width: 160, height: 120 });
  const clip = await settled(
    server,
    (await uploadClip(server, video.path, { sessionId, athleteIds, view: 'front' })).id,
  );
  const frames = syntheticClip(SECONDS * FPS, FPS, (t) => ({
    inclinationDeg: 25 * Math.sin((2 * Math.PI * t) / 1600),
    legExtension: 0.85 + 0.08 * Math.cos((2 * Math.PI * t) / 800),
    shoulderTiltDeg: 10 * Math.sin((2 * Math.PI * t) / 1600),
  }));

  let start = performance.now();
  let slowest = 0;
  for (let i = 0; i < frames.length; i += 500) {
    const t = performance.now();
    const res = await server.http
      .post(`/api/clips/${clip.id}/frames`)
      .set(auth)
      .send({ model: 'lightning', frames: frames.slice(i, i + 500) });
    if (res.status !== 200) throw new Error(`batch ${i}: ${res.status} ${JSON.stringify(res.body)}`);
    slowest = Math.max(slowest, performance.now() - t);
  }
  line(
    `POST ${frames.length} frames in 500-frame batches (new rows)`,
    performance.now() - start,
    `slowest batch ${slowest.toFixed(0)} ms (the last one also computes turns)`,
  );

  start = performance.now();
  await server.http
    .post(`/api/clips/${clip.id}/frames`)
    .set(auth)
    .send({ model: 'lightning', frames: frames.slice(0, 500) });
  line('POST 500 frames again (updates)', performance.now() - start);

  start = performance.now();
  let res = await server.http.get(`/api/clips/${clip.id}/frames?model=lightning`).set(auth);
  line(
    `GET ${res.body.frames.length} frames, series computed`,
    performance.now() - start,
    `${res.body.series.turns.length} turns, ${res.body.flags.length} flags, ${(res.text.length / 1e6).toFixed(1)} MB`,
  );
  start = performance.now();
  res = await server.http.get(`/api/clips/${clip.id}/frames?model=lightning`).set(auth);
  line(`GET ${res.body.frames.length} frames, series cached`, performance.now() - start);

  start = performance.now();
  await server.http
    .patch(`/api/clips/${clip.id}`)
    .set(auth)
    .send({
      referenceLine: [
        [0, 100],
        [160, 96],
      ],
    });
  line(`PATCH snow line: recompute ${frames.length} frames and flags`, performance.now() - start);

  start = performance.now();
  await server.http
    .put(`/api/clips/${clip.id}/frames/1500`)
    .set(auth)
    .send({ model: 'lightning', keypoints: frames[1500].keypoints });
  line('PUT one corrected frame (turns wait for the next read)', performance.now() - start);
} finally {
  await server.close();
  await removeRenderedVideos();
}
