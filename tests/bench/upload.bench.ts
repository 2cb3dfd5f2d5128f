// Clip upload and Range playback through the real stack (multer -> temp file -> S3 fake). Prints figures only.
// Peak RSS growth shows whether the upload path buffers whole files (it should stay far below the file size).
import fs from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { createTestServer } from '../helpers/server-harness';
import { removeVideoFixtures, videoFixture } from '../helpers/video-fixture';

const SIZE_MB = Number(process.env.BENCH_UPLOAD_MB ?? 256);

const server = await createTestServer({ MAX_UPLOAD_BYTES: String((SIZE_MB + 16) * 1024 * 1024) });
const scratch = await fs.mkdtemp(path.join(os.tmpdir(), 'stanceline-bench-'));
try {
  const video = await videoFixture('mp4');
  const big = path.join(scratch, 'long-run.mp4');
  // A real clip followed by padding: the container sniff and probe read the real part, the rest is bulk.
  const handle = await fs.open(big, 'w');
  await handle.write(video.bytes);
  const chunk = Buffer.alloc(1024 * 1024, 0);
  for (let i = 0; i < SIZE_MB; i += 1) await handle.write(chunk);
  await handle.close();
  const bytes = (await fs.stat(big)).size;

  const [sessionId] = await server.sessionIds();
  const elsie = await server.athleteId('Elsie');
  const auth = await server.bearer('coach');

  const baseline = process.memoryUsage().rss;
  let peak = baseline;
  const sampler = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 20);
  const start = performance.now();
  const res = await server.http
    .post('/api/clips')
    .set(auth)
    .field('sessionId', sessionId)
    .field('athleteIds', elsie)
    .field('view', 'side')
    .attach('file', big);
  const ms = performance.now() - start;
  clearInterval(sampler);
  if (res.status !== 201) throw new Error(`upload failed: ${res.status} ${JSON.stringify(res.body)}`);

  const mb = bytes / 1024 / 1024;
  const line = (label: string, value: string) => process.stdout.write(`${label.padEnd(46)} ${value}\n`);
  line('upload size', `${mb.toFixed(1)} MiB`);
  line('upload time (client -> S3 fake, incl. probe)', `${ms.toFixed(0)} ms`);
  line('upload throughput', `${(mb / (ms / 1000)).toFixed(1)} MiB/s`);
  line('peak RSS growth during upload', `${((peak - baseline) / 1024 / 1024).toFixed(1)} MiB`);

  const url = res.body.clip.mediaUrl as string;
  const reads = 50;
  const readStart = performance.now();
  for (let i = 0; i < reads; i += 1) {
    const offset = Math.floor((bytes - 1024 * 1024) * (i / reads));
    const r = await server.http.get(url).set('Range', `bytes=${offset}-${offset + 1024 * 1024 - 1}`);
    if (r.status !== 206) throw new Error(`range read: ${r.status}`);
  }
  line('1 MiB Range read (mean of 50 seeks)', `${((performance.now() - readStart) / reads).toFixed(1)} ms`);
} finally {
  await server.close();
  await fs.rm(scratch, { recursive: true, force: true });
  await removeVideoFixtures();
}
