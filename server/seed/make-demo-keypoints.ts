// npx tsx server/seed/make-demo-keypoints.ts [FOOTAGE_NAME ...]
// Runs the analyze CLI (MoveNet Lightning, Node WASM) over the phantom demo footage and writes the
// keypoints the demo seed stores, so a first start shows curves without running a detector.
import { execFile } from 'node:child_process';
import fs from 'node:fs/promises';
import path from 'node:path';
import { promisify } from 'node:util';
import { keypointSchema } from '@shared/schemas/frames.schema';
import {
  DEMO_CLIP_PLAN,
  DEMO_FOOTAGE_DIR,
  DEMO_KEYPOINTS_DIR,
  sha256File,
  type DemoKeypointFile,
} from './demo-clips';

const run = promisify(execFile);
const MODEL = 'lightning';
const round = (value: number, digits: number) => Number(value.toFixed(digits));

// Optional footage names limit the run to those clips (the others keep their committed keypoints).
const only = process.argv.slice(2);
const footage = [...new Map(DEMO_CLIP_PLAN.map((p) => [p.footage, p])).entries()].filter(
  ([name]) => only.length === 0 || only.includes(name),
);
await fs.mkdir(DEMO_KEYPOINTS_DIR, { recursive: true });
for (const [name, { view, pick }] of footage) {
  const clip = path.join(DEMO_FOOTAGE_DIR, `${name}.mp4`);
  // A clip with other people in it follows the athlete the coach picked, as the app would.
  const picked = pick ? ['--pick', `${pick.x},${pick.y}@${pick.frameIndex}`] : [];
  const args = ['tsx', 'server/cli/analyze.ts', '--model', MODEL, '--view', view, ...picked, '--json', clip];
  const { stdout } = await run('npx', args, { maxBuffer: 256 * 1024 * 1024 });
  const frames = stdout
    .trim()
    .split('\n')
    .map((line) => JSON.parse(line) as { frame: number; timeMs: number; keypoints: unknown[] })
    .map((f) => ({
      frameIndex: f.frame,
      timeMs: f.timeMs,
      // Hundredths of a pixel and thousandths of a score are well inside what the detector resolves.
      keypoints: f.keypoints.map((k) => {
        const p = keypointSchema.parse(k);
        return { name: p.name, x: round(p.x, 2), y: round(p.y, 2), score: round(p.score, 3) };
      }),
    }));
  const out: DemoKeypointFile = {
    footage: clip,
    sha256: await sha256File(clip),
    model: MODEL,
    view,
    madeWith: `npm run -s analyze -- ${args.slice(2).join(' ')}`,
    frames,
  };
  const file = path.join(DEMO_KEYPOINTS_DIR, `${name}.${MODEL}.json`);
  await fs.writeFile(file, `${JSON.stringify(out)}\n`);
  console.error(`${file}: ${frames.length} frames`);
}
