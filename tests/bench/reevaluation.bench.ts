// How long re-checking stored frames takes after a band changes, and whether the API stays answered
// meanwhile: 100,000 stored frames (40 clips of 2,500 frames, 100 s at 25 fps each) re-judged by the
// background job, with a health read every 10 ms during the job. Prints figures and ratios only.
import { randomUUID } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { analyzeSeries, stretchGapFrames } from '@shared/series';
import { turnWindow } from '@shared/tolerance';
import { UnitOfWork } from '@server/repositories/unit-of-work';
import { copyClip } from '../helpers/copy-rows';
import { healthLatencies, latencySummary, quantile, startBenchFixture } from './bench-fixture';

const CLIPS = 40;
const FPS = 25;
const FRAMES_PER_CLIP = 2_500;

const out = (label: string, value: string) => process.stdout.write(`${label.padEnd(56)} ${value}\n`);

const fixture = await startBenchFixture(FRAMES_PER_CLIP, FPS);
const { server, base, elsie, frames } = fixture;
try {
  const u14 = await server.ageGroupId('U14');
  // The skier's shoulders are 6° off level (inside ±8°); its turns are found once and stored for
  // every clip, as the series refresh would store them.
  const turns = analyzeSeries(frames, { view: 'front', fps: FPS }).turns.map(turnWindow);
  const ds = server.runtime.dataSource;
  const uow = new UnitOfWork(ds);
  const seedStart = performance.now();
  for (let c = 0; c < CLIPS; c++) {
    const id = c === 0 ? fixture.templateId : await copyClip(ds, fixture.templateId, elsie, false);
    await uow.transaction((m) => uow.of(m).frames.insertMany(fixture.frameRows(id)));
    await uow.repos.clipTurns.save({
      id: randomUUID(),
      clipId: id,
      model: 'lightning',
      turns,
      maxGapFrames: stretchGapFrames(frames, FPS),
      updatedAt: new Date(),
    });
  }
  out(
    'stored frames seeded',
    `${(CLIPS * FRAMES_PER_CLIP).toLocaleString('en-GB')} in ${((performance.now() - seedStart) / 1000).toFixed(1)} s`,
  );

  const idleUntil = performance.now() + 3000;
  const idle = await healthLatencies(base, () => performance.now() > idleUntil);
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
  out('health read, idle: p50 / p99 / max', latencySummary(idle));
  out('health read, during the job: p50 / p99 / max', latencySummary(during));
  out('p99 during / p99 idle', `${(quantile(during, 0.99) / quantile(idle, 0.99)).toFixed(1)}×`);
} finally {
  await fixture.close();
}
