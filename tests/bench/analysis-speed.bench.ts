// Analysis speed in Node, each figure beside the raw library or the goal it is held to, measured side
// by side in one run (issue "Fast analysis"):
//  - pose time per frame: the product's detector (tracking, region, mapping) against the
//    pose-detection library's own estimatePoses on the same consecutive frames of a 60 fps clip;
//  - whole-clip throughput: decode + detect (the CLI and the server's worker), and a server analysis
//    job end to end (download, worker thread, stored in batches with flags), frames per second;
//  - series analysis (smoothing, turns, summary) of 10,000 frames;
//  - frame ingest: 10,000 frames posted in 500-frame batches, stored, measured and flagged;
//  - peak memory of each (growth of the process's resident set over the step, sampled every 5 ms).
//
//   npx tsx tests/bench/analysis-speed.bench.ts [--frames 120] [--write docs/benchmarks.md]
import { mkdirSync } from 'node:fs';
import { cpus, totalmem } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { parseArgs } from 'node:util';
import * as tf from '@tensorflow/tfjs-core';
import { POSE_MODELS } from '@shared/keypoints';
import { loadModel } from '@shared/pose/pose-detector';
import { analyzeSeries, type SeriesFrameInput } from '@shared/series';
import { analyzeMediaFile } from '@server/pose/analyze-media';
import { fileModelSource } from '@server/pose/model-files';
import { createNodePoseDetector } from '@server/pose/node-detector';
import { decodeVideoFrames } from '@server/pose/video-frames';
import type { ClipDto } from '@shared/schemas/clip.schema';
import { encodeClip, frontTurnsClip } from '../../fixtures/phantom/phantom-clip';
import { createTestServer } from '../helpers/server-harness';
import { writeDocSection } from '../pose/doc-section';
import { removeRenderedVideos, renderVideo, settled, uploadClip } from '../server/clip-fixtures';
import { clip as syntheticClip } from '../shared/series/synthetic-clip';

const { values } = parseArgs({
  options: { frames: { type: 'string', default: '120' }, write: { type: 'string' } },
});
const FRAMES = Number(values.frames);
const median = (v: number[]) => [...v].sort((a, b) => a - b)[Math.floor(v.length / 2)];
const say = (text: string) => process.stderr.write(`${text}\n`);

/** Runs `step` while sampling the resident set; returns its result, wall time and peak growth (MiB). */
async function measured<T>(step: () => Promise<T>): Promise<{ value: T; ms: number; peakMiB: number }> {
  global.gc?.();
  const base = process.memoryUsage().rss;
  let peak = base;
  const timer = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 5);
  const start = performance.now();
  try {
    const value = await step();
    peak = Math.max(peak, process.memoryUsage().rss);
    return { value, ms: performance.now() - start, peakMiB: (peak - base) / 2 ** 20 };
  } finally {
    clearInterval(timer);
  }
}

const rows: string[] = [];
const row = (...cells: string[]) => rows.push(`| ${cells.join(' | ')} |`);

// A 60 fps phantom clip, its frames decoded once into memory for the per-frame comparison.
const dir = join(process.cwd(), 'fixtures', 'generated', 'bench');
mkdirSync(dir, { recursive: true });
const clip60 = frontTurnsClip({ fps: 60 });
clip60.frames = clip60.frames.slice(0, FRAMES);
const mp4 = join(dir, 'front-turns-60fps.mp4');
await encodeClip(clip60, { mp4 });
const decoded: { rgb: Uint8Array; width: number; height: number; timeMs: number }[] = [];
for await (const f of decodeVideoFrames(mp4, { every: 1 }))
  decoded.push({ rgb: f.rgb, width: f.width, height: f.height, timeMs: f.timeMs });
const { width, height } = decoded[0];

rows.push('### Pose detection per frame, Node (WASM), against the library');
rows.push('');
rows.push(
  `The first ${decoded.length} frames of a ${width}×${height} phantom clip at 60 fps, decoded once into memory; each model runs over them in order (tracking on), after a warm-up of five frames, the library's call and the product's interleaved frame by frame. "Library" is the pose-detection library's \`estimatePoses\` on a tensor of the frame; "product" is the app's detector on the same frames (tensor, tracking, keypoint mapping). Median per frame.`,
);
rows.push('');
row(
  'model',
  'library, ms/frame',
  'product, ms/frame',
  'product / library',
  'peak memory growth (library → product)',
);
row('---', '---', '---', '---', '---');
const source = fileModelSource();
for (const model of POSE_MODELS) {
  say(`per frame: ${model}`);
  // The product's detector first: it starts the WASM backend both then use.
  const product = await createNodePoseDetector(model);
  const raw = await loadModel(model, source, undefined);
  const tensorOf = (f: (typeof decoded)[number]) =>
    tf.tensor3d(Int32Array.from(f.rgb), [f.height, f.width, 3], 'int32');
  // Warm-up pass of both.
  for (const f of decoded.slice(0, 5)) {
    const t = tensorOf(f);
    await raw.estimatePoses(t, { maxPoses: 1, flipHorizontal: false }, f.timeMs);
    t.dispose();
    await product.detect(
      { data: f.rgb, width: f.width, height: f.height, channels: 3 },
      { timeMs: f.timeMs },
    );
  }
  raw.reset();
  product.reset();
  // Interleaved frame by frame (each keeps its own tracking state), so drift of the machine's load
  // or of the JIT touches both alike.
  const rawTimes: number[] = [];
  const productTimes: number[] = [];
  let rawPeak = 0;
  let productPeak = 0;
  for (const [i, f] of decoded.entries()) {
    const rawStep = await measured(async () => {
      const t = tensorOf(f);
      await raw.estimatePoses(t, { maxPoses: 1, flipHorizontal: false }, f.timeMs);
      t.dispose();
    });
    const productStep = await measured(() =>
      product.detect({ data: f.rgb, width: f.width, height: f.height, channels: 3 }, { timeMs: f.timeMs }),
    );
    rawPeak = Math.max(rawPeak, rawStep.peakMiB);
    productPeak = Math.max(productPeak, productStep.peakMiB);
    // The first frame of a clip is read twice by the product (the cold-start second pass); not compared.
    if (i > 0) {
      rawTimes.push(rawStep.ms);
      productTimes.push(productStep.ms);
    }
  }
  const rawRun = { peakMiB: rawPeak };
  const productRun = { peakMiB: productPeak };
  const a = median(rawTimes);
  const b = median(productTimes);
  row(
    model,
    a.toFixed(1),
    b.toFixed(1),
    `${(b / a).toFixed(3)} (${b / a - 1 >= 0 ? '+' : '−'}${Math.abs((b / a - 1) * 100).toFixed(1)} %)`,
    `${rawRun.peakMiB.toFixed(0)} MiB → ${productRun.peakMiB.toFixed(0)} MiB`,
  );
  raw.dispose();
  product.dispose();
}

rows.push('');
rows.push('### Whole clip, Node, frames per second');
rows.push('');
rows.push(
  `The same ${decoded.length}-frame 60 fps clip from the MP4 file: "decode + detect" is what the CLI and a server worker do (ffmpeg decoding, the product's detector); "library on decoded frames" is the library alone on the frames already in memory (the ceiling without decoding).`,
);
rows.push('');
row(
  'model',
  'library on decoded frames, frames/s',
  'decode + detect, frames/s',
  'ratio',
  'peak memory growth',
);
row('---', '---', '---', '---', '---');
for (const model of POSE_MODELS) {
  say(`whole clip: ${model}`);
  const raw = await loadModel(model, source, undefined);
  const rawRun = await measured(async () => {
    for (const f of decoded) {
      const t = tf.tensor3d(Int32Array.from(f.rgb), [f.height, f.width, 3], 'int32');
      await raw.estimatePoses(t, { maxPoses: 1, flipHorizontal: false }, f.timeMs);
      t.dispose();
    }
  });
  raw.dispose();
  const run = await measured(async () => {
    let n = 0;
    for await (const _frame of analyzeMediaFile(mp4, { model, every: 1 })) n++;
    return n;
  });
  const rawFps = (decoded.length * 1000) / rawRun.ms;
  const fps = (run.value * 1000) / run.ms;
  row(model, rawFps.toFixed(1), fps.toFixed(1), (fps / rawFps).toFixed(2), `${run.peakMiB.toFixed(0)} MiB`);
}

// The server's analysis job end to end, Lightning, one worker.
say('server job');
const server = await createTestServer({ ANALYSIS_WORKERS: '1', AUTO_ANALYSIS: 'off' });
let jobFps = 0;
let jobPeak = 0;
let ingestRows = 0;
let ingestMs = 0;
let ingestPeak = 0;
try {
  const [sessionId] = await server.sessionIds();
  const athleteIds = await server.athleteId('Elsie');
  const uploaded = await settled(
    server,
    (await uploadClip(server, mp4, { sessionId, athleteIds, view: 'front' })).id,
  );
  const auth = await server.bearer('coach');
  const job = await measured(async () => {
    await server.http.post(`/api/clips/${uploaded.id}/server-analysis`).set(auth).send({});
    await server.runtime.analyses.idle();
  });
  const done = (await server.http.get(`/api/clips/${uploaded.id}`).set(auth)).body.clip as ClipDto;
  jobFps = ((done.serverAnalysis?.done ?? 0) * 1000) / job.ms;
  jobPeak = job.peakMiB;

  // Frame ingest: 10,000 frames of the synthetic skier through the API, then turns and flags.
  say('ingest');
  const N = 10_000;
  const long = await renderVideo('h264-mp4', {
    seconds: Math.ceil(N / 30),
    fps: 30,
    width: 160,
    height: 120,
  });
  const target = await settled(
    server,
    (await uploadClip(server, long.path, { sessionId, athleteIds, view: 'front' })).id,
  );
  const frames = syntheticClip(N, 30, (t) => ({
    inclinationDeg: 25 * Math.sin((2 * Math.PI * t) / 1600),
    legExtension: 0.85 + 0.08 * Math.cos((2 * Math.PI * t) / 800),
    shoulderTiltDeg: 10 * Math.sin((2 * Math.PI * t) / 1600),
  }));
  const ingest = await measured(async () => {
    for (let i = 0; i < frames.length; i += 500) {
      const res = await server.http
        .post(`/api/clips/${target.id}/frames`)
        .set(auth)
        .send({ model: 'lightning', frames: frames.slice(i, i + 500) });
      if (res.status !== 200) throw new Error(`batch ${i}: ${res.status}`);
    }
    // Stored, measured, and the turns and flags of the whole clip in place.
    const read = await server.http.get(`/api/clips/${target.id}/frames?model=lightning`).set(auth);
    return read.body.frames.length as number;
  });
  ingestRows = ingest.value;
  ingestMs = ingest.ms;
  ingestPeak = ingest.peakMiB;
} finally {
  await server.close();
  await removeRenderedVideos();
}
rows.push(
  `| server analysis job (lightning): upload ready → every frame stored with flags | – | ${jobFps.toFixed(1)} | – | ${jobPeak.toFixed(0)} MiB (the worker thread's share included) |`,
);

// Series analysis of 10,000 frames.
say('series');
const N = 10_000;
const seriesFrames: SeriesFrameInput[] = syntheticClip(N, 30, (t) => ({
  inclinationDeg: 25 * Math.sin((2 * Math.PI * t) / 1600),
  legExtension: 0.85 + 0.05 * Math.cos((2 * Math.PI * t) / 800),
  shoulderTiltDeg: -0.2 * 25 * Math.sin((2 * Math.PI * t) / 1600),
}));
analyzeSeries(seriesFrames, { view: 'front', fps: 30 });
const seriesTimes: number[] = [];
let seriesPeak = 0;
for (let r = 0; r < 5; r++) {
  const run = await measured(async () => analyzeSeries(seriesFrames, { view: 'front', fps: 30 }));
  seriesTimes.push(run.ms);
  seriesPeak = Math.max(seriesPeak, run.peakMiB);
}
const seriesMs = median(seriesTimes);

rows.push('');
rows.push('### Series analysis and frame ingest');
rows.push('');
row('figure', 'value', 'goal', 'value / goal', 'peak memory growth');
row('---', '---', '---', '---', '---');
row(
  'series analysis (gap filling, smoothing, metrics, turns, summary) of 10,000 front frames, median of 5',
  `${seriesMs.toFixed(0)} ms`,
  '200 ms',
  (seriesMs / 200).toFixed(2),
  `${seriesPeak.toFixed(0)} MiB`,
);
row(
  `frame ingest: ${ingestRows.toLocaleString('en')} frames posted in 500-frame batches, stored, measured, turns and flags`,
  `${((ingestRows * 1000) / ingestMs).toFixed(0)} rows/s (${(ingestMs / 1000).toFixed(1)} s)`,
  '–',
  '–',
  `${ingestPeak.toFixed(0)} MiB`,
);

const command = `npx tsx tests/bench/analysis-speed.bench.ts --frames ${FRAMES}${values.write ? ` --write ${values.write}` : ''}`;
const section = [
  '<!-- analysis-speed:start -->',
  '## Analysis speed in Node, against the library',
  '',
  `Generated by \`${command}\` on ${cpus().length} × ${cpus()[0]?.model ?? 'cpu'}, ${(totalmem() / 2 ** 30).toFixed(0)} GiB, Node ${process.version}, WASM backend.`,
  '',
  ...rows,
  '<!-- analysis-speed:end -->',
].join('\n');
if (values.write) writeDocSection(values.write, 'analysis-speed', section);
process.stdout.write(`${section}\n`);
