// How fast the frames export streams, and whether its memory stays flat: 1,000,000 stored frames (400
// front-view clips of 2,500 frames) downloaded as frames.csv over HTTP, the client counting lines
// without keeping them. Prints rows per second and the peak growth of the process's resident memory.
// EXPORT_ROWS=200000 npm run bench -- export runs a smaller one.
import { spawn } from 'node:child_process';
import { once } from 'node:events';
import { performance } from 'node:perf_hooks';
import { UnitOfWork } from '@server/repositories/unit-of-work';
import { copyClip } from '../helpers/copy-rows';
import { healthLatencies, latencySummary, startBenchFixture } from './bench-fixture';

const FPS = 25;
const FRAMES_PER_CLIP = 2_500;
const ROWS = Number(process.env.EXPORT_ROWS ?? 1_000_000);
const CLIPS = Math.max(1, Math.round(ROWS / FRAMES_PER_CLIP));
const MB = 1024 * 1024;

// Reads the export, counting bytes and lines; says "tenth" once a tenth of the expected rows are in.
const CLIENT = `
const res = await fetch(process.env.URL, { headers: { Authorization: process.env.AUTH } });
if (!res.ok) { console.error('export', res.status, await res.text()); process.exit(1); }
let bytes = 0, lines = 0, told = false;
for await (const chunk of res.body) {
  bytes += chunk.byteLength;
  for (let i = chunk.indexOf(10); i !== -1; i = chunk.indexOf(10, i + 1)) lines++;
  if (!told && lines > Number(process.env.TENTH)) { told = true; console.log('tenth'); }
}
console.log(bytes + ' ' + lines);
`;

const out = (label: string, value: string) => process.stdout.write(`${label.padEnd(48)} ${value}\n`);

const fixture = await startBenchFixture(FRAMES_PER_CLIP, FPS);
const { server, base, elsie } = fixture;
try {
  const ds = server.runtime.dataSource;
  const uow = new UnitOfWork(ds);
  await uow.transaction((m) => uow.of(m).frames.insertMany(fixture.frameRows(fixture.templateId)));
  // The other clips copy the first one's rows inside SQLite (fast), under new clip ids.
  const seedStart = performance.now();
  await uow.transaction(async (m) => {
    for (let c = 1; c < CLIPS; c++) await copyClip(m, fixture.templateId, elsie, true);
  });
  const stored = ((await ds.query('SELECT COUNT(*) AS n FROM frame_result')) as { n: number }[])[0].n;
  out(
    'stored frames seeded',
    `${stored.toLocaleString('en-GB')} in ${((performance.now() - seedStart) / 1000).toFixed(1)} s`,
  );

  const auth = await server.bearer('analyst');
  const run = async (label: string, query: string) => {
    const baseline = process.memoryUsage().rss;
    let peak = baseline;
    let peakHeap = process.memoryUsage().heapUsed;
    const sampler = setInterval(() => {
      const m = process.memoryUsage();
      peak = Math.max(peak, m.rss);
      peakHeap = Math.max(peakHeap, m.heapUsed);
    }, 50);
    const start = performance.now();
    // The client is another process, so the memory sampled here is the server's alone.
    const client = spawn(process.execPath, ['--input-type=module', '-e', CLIENT], {
      env: {
        ...process.env,
        URL: `${base}/api/exports/frames.csv${query}`,
        AUTH: auth.Authorization,
        TENTH: String(Math.round(stored / 10)),
      },
      stdio: ['ignore', 'pipe', 'inherit'],
    });
    let atTenth = 0;
    let report = '';
    client.stdout.setEncoding('utf8');
    client.stdout.on('data', (text: string) => {
      report += text;
      if (!atTenth && report.includes('tenth')) atTenth = process.memoryUsage().rss;
    });
    await once(client, 'exit');
    const [bytes, lines] = report.trim().split('\n').at(-1)!.split(' ').map(Number);
    const atEnd = process.memoryUsage().rss;
    const seconds = (performance.now() - start) / 1000;
    clearInterval(sampler);
    const dataRows = lines - 1;
    out(`${label}: rows`, dataRows.toLocaleString('en-GB'));
    out(`${label}: size, time`, `${(bytes / MB).toFixed(0)} MB in ${seconds.toFixed(1)} s`);
    out(
      `${label}: rows per second`,
      `${Math.round(dataRows / seconds).toLocaleString('en-GB')} (goal 100,000: ${(dataRows / seconds / 100_000).toFixed(2)}×)`,
    );
    out(
      `${label}: resident memory before / peak`,
      `${(baseline / MB).toFixed(0)} / ${(peak / MB).toFixed(0)} MB (growth ${((peak - baseline) / MB).toFixed(0)} MB, goal under 50)`,
    );
    out(
      `${label}: resident at 10% of rows / at the end`,
      `${(atTenth / MB).toFixed(0)} / ${(atEnd / MB).toFixed(0)} MB; peak JS heap ${(peakHeap / MB).toFixed(0)} MB`,
    );
  };
  await run('all 22 metrics (54 columns)', '');
  await run('two metrics (14 columns)', '?metrics=stanceWidthRatio,shoulderTilt');
  // The API during a large export: a health read every 10 ms while the 54-column export runs.
  let exporting = true;
  const probe = healthLatencies(base, () => !exporting);
  await run('again, with health reads alongside', '');
  exporting = false;
  out('health read during that export: p50 / p99 / max', latencySummary(await probe));

  // A client that goes away mid-download: the server stops the export and goes on answering.
  const abort = new AbortController();
  const partial = await fetch(`${base}/api/exports/frames.csv`, { headers: auth, signal: abort.signal });
  await partial.body!.getReader().read();
  abort.abort();
  const after = performance.now() + 1000;
  out(
    'health read in the second after a client left',
    latencySummary(await healthLatencies(base, () => performance.now() > after)),
  );
} finally {
  await fixture.close();
}
