// How fast pose detection runs in Node (WASM): model load and warm-up, a still (cold start, two
// passes), tracked clip frames (one pass), and a whole phantom clip through ffmpeg decoding.
// Prints figures only:  npx tsx tests/bench/pose.bench.ts [FRAMES]
import { mkdirSync } from 'node:fs';
import { cpus } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { POSE_MODELS } from '@shared/keypoints';
import { analyzeMediaFile } from '@server/pose/analyze-media';
import { createNodePoseDetector } from '@server/pose/node-detector';
import { encodeClip, frontTurnsClip } from '../../fixtures/phantom/phantom-clip';
import { renderPhantom } from '../../fixtures/phantom/render-phantom';

const frames = Number(process.argv[2] ?? 40);
const median = (v: number[]) => [...v].sort((a, b) => a - b)[Math.floor(v.length / 2)];
const out = (label: string, value: string) => process.stdout.write(`${label.padEnd(52)} ${value}\n`);

out('machine', `${cpus().length} × ${cpus()[0]?.model ?? 'cpu'}, Node ${process.version}`);
const clip = frontTurnsClip();
const rendered = clip.frames.slice(0, frames).map((spec) => renderPhantom(spec));

for (const model of POSE_MODELS) {
  const detector = await createNodePoseDetector(model);
  out(`${model}: load / warm-up`, `${detector.loadMs.toFixed(0)} ms / ${detector.warmupMs.toFixed(0)} ms`);
  const still = rendered[0];
  const input = (i: number) => ({
    data: rendered[i].rgba,
    width: still.width,
    height: still.height,
    channels: 4 as const,
  });
  const cold: number[] = [];
  for (let i = 0; i < 5; i++) {
    detector.reset();
    cold.push((await detector.detect(input(0))).timings.detectMs);
  }
  out(`${model}: still, cold start (2 passes), median of 5`, `${median(cold).toFixed(1)} ms`);
  detector.reset();
  const tracked: number[] = [];
  for (let i = 0; i < rendered.length; i++) {
    const r = await detector.detect(input(i), { timeMs: (i * 1000) / clip.fps });
    if (i > 0) tracked.push(r.timings.detectMs);
  }
  out(
    `${model}: clip frame, tracked (1 pass), median of ${tracked.length}`,
    `${median(tracked).toFixed(1)} ms (${(1000 / median(tracked)).toFixed(1)} frames/s)`,
  );
  detector.dispose();
}

const dir = join(process.cwd(), 'fixtures', 'generated', 'bench');
mkdirSync(dir, { recursive: true });
const mp4 = join(dir, 'front-turns.mp4');
await encodeClip(clip, { mp4 });
for (const model of POSE_MODELS) {
  const start = performance.now();
  let n = 0;
  for await (const _frame of analyzeMediaFile(mp4, { model, every: 1 })) n++;
  const ms = performance.now() - start;
  out(
    `${model}: ${n}-frame 640×360 MP4, decode + detect`,
    `${(ms / 1000).toFixed(1)} s (${((n * 1000) / ms).toFixed(1)} frames/s)`,
  );
}
