// How long re-checking stored frames takes after a band changes, and whether the API stays answered
// meanwhile: 100,000 stored frames (40 clips of 2,500 frames, 100 s at 25 fps each) re-judged by the
// background job, with a health read every 10 ms during the job. Prints figures and ratios only.
import { randomUUID } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { performance } from 'node:perf_hooks';
import { computeFrameMetrics } from '@shared/metrics';
import { analyzeSeries, stretchGapFrames } from '@shared/series';
import { turnWindow } from '@shared/tolerance';
import type { FrameResult } from '@server/entities/frame-result.entity';
import { UnitOfWork } from '@server/repositories/unit-of-work';
import { copyClip } from '../helpers/copy-rows';
import { createTestServer } from '../helpers/server-harness';
import { clip as syntheticClip } from '../shared/series/synthetic-clip';
import { removeRenderedVideos, renderVideo, settled, uploadClip } from '../server/clip-fixtures';

const CLIPS = 40;
const FPS = 25;
const FRAMES_PER_CLIP = 2_500;

const quantile = (sorted: number[], q: number) =>
  sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];
const out = (label: string, value: string) => process.stdout.write(`${label.padEnd(56)} ${value}\n`);

async function healthLatencies(base: string, until: () => boolean, gapMs = 10): Promise<number[]> {
  const times: number[] = [];
  while (!until()) {
    const t = performance.now();
    const res = await fetch(`${base}/api/health`);
    await res.arrayBuffer();
    times.push(performance.now() - t);
    await new Promise((r) => setTimeout(r, gapMs));
  }
  return times.sort((a, b) => a - b);
}

const server = await createTestServer();
const http = server.app.listen(0, '127.0.0.1');
await new Promise((r) => http.once('listening', r));
const base = `http://127.0.0.1:${(http.address() as AddressInfo).port}`;
try {
  const [sessionId] = await server.sessionIds();
  const elsie = await server.athleteId('Elsie');
  const u14 = await server.ageGroupId('U14');
  const video = await renderVideo('h264-mp4', {
    seconds: FRAMES_PER_CLIP / FPS,
    fps: FPS,
    width: 160,
    height: 120,
  });
  const template = await settled(
    server,
    (await uploadClip(server, video.path, { sessionId, athleteIds: elsie, view: 'front' })).id,
  );

  // One synthetic front-view run (shoulders 6° off level, inside ±8°), its turns found once, stored
  // for every clip as the series refresh would store them.
  const frames = syntheticClip(FRAMES_PER_CLIP, FPS, (t) => ({
    inclinationDeg: 25 * Math.sin((2 * Math.PI * t) / 1600),
    legExtension: 0.85,
    shoulderTiltDeg: 6,
  }));
  const metrics = frames.map((f) => computeFrameMetrics({ keypoints: f.keypoints, view: 'front' }));
  const series = analyzeSeries(frames, { view: 'front', fps: FPS });
  const turns = series.turns.map(turnWindow);
  const ds = server.runtime.dataSource;
  const uow = new UnitOfWork(ds);
  const seedStart = performance.now();
  for (let c = 0; c < CLIPS; c++) {
    const id = c === 0 ? template.id : await copyClip(ds, template.id, elsie, false);
    const now = new Date();
    const rows: FrameResult[] = frames.map((f, i) => ({
      id: randomUUID(),
      clipId: id,
      frameIndex: f.frameIndex,
      timeMs: f.timeMs,
      model: 'lightning',
      keypoints: f.keypoints,
      metrics: metrics[i].metrics,
      reasons: metrics[i].reasons as Record<string, string>,
      corrected: false,
      createdAt: now,
      updatedAt: now,
    }));
    await uow.transaction((m) => uow.of(m).frames.insertMany(rows));
    await uow.repos.clipTurns.save({
      id: randomUUID(),
      clipId: id,
      model: 'lightning',
      turns,
      maxGapFrames: stretchGapFrames(frames, FPS),
      updatedAt: now,
    });
  }
  out(
    'stored frames seeded',
    `${(CLIPS * FRAMES_PER_CLIP).toLocaleString('en-GB')} in ${((performance.now() - seedStart) / 1000).toFixed(1)} s`,
  );

  const idle = await healthLatencies(
    base,
    (() => {
      const end = performance.now() + 3000;
      return () => performance.now() > end;
    })(),
  );
  const auth = await server.bearer('head');
  const start = performance.now();
  const res = await fetch(`${base}/api/tolerance-bands/${u14}/shoulderTilt`, {
    method: 'PUT',
    headers: { ...auth, 'Content-Type': 'application/json' },
    body: JSON.stringify({ min: -5, max: 5, target: 0 }),
  });
  const answered = performance.now() - start;
  if (res.status !== 200) throw new Error(`PUT band: ${res.status} ${await res.text()}`);
  const { job } = (await res.json()) as { job: { id: string } };
  let finished = false;
  const done = server.runtime.jobs.idle().then(() => {
    finished = true;
  });
  const during = await healthLatencies(base, () => finished);
  await done;
  const seconds = (performance.now() - start) / 1000;
  const view = (await (await fetch(`${base}/api/jobs/${job.id}`, { headers: auth })).json()) as {
    status: string;
    done: number;
    total: number;
  };
  const flags = (
    (await ds.query(`SELECT COUNT(*) AS n FROM flag WHERE metric = 'shoulderTilt'`)) as { n: number }[]
  )[0].n;

  out('band change answered (job queued)', `${answered.toFixed(0)} ms`);
  out(
    're-check of stored frames',
    `${seconds.toFixed(1)} s for ${view.total.toLocaleString('en-GB')} frames (${view.status})`,
  );
  out('frames judged per second', `${Math.round(view.total / seconds).toLocaleString('en-GB')}`);
  out(
    'shoulder-tilt flags stored (one per turn)',
    `${flags} (${CLIPS} clips × ${turns.length} turns = ${CLIPS * turns.length})`,
  );
  out(
    'health read, idle: p50 / p99 / max',
    `${quantile(idle, 0.5).toFixed(1)} / ${quantile(idle, 0.99).toFixed(1)} / ${idle[idle.length - 1].toFixed(1)} ms (${idle.length} reads)`,
  );
  out(
    'health read, during the job: p50 / p99 / max',
    `${quantile(during, 0.5).toFixed(1)} / ${quantile(during, 0.99).toFixed(1)} / ${during[during.length - 1].toFixed(1)} ms (${during.length} reads)`,
  );
  out('p99 during / p99 idle', `${(quantile(during, 0.99) / quantile(idle, 0.99)).toFixed(1)}×`);
} finally {
  http.close();
  await server.close();
  await removeRenderedVideos();
}
