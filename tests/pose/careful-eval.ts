// Careful reading of whole clips against the usual reading, side by side in one run: the demo club's
// four phantom clips read by the server's path (analyzeMediaFile, the coach's pick where the demo has
// one) once as usual and once carefully (each frame, or the followed athlete's box, read with its
// mirror image too, left and right swapped back, each point the score-weighted mean of the two reads).
// Every frame against the rendered truth: joint error in torso lengths, metric error in the metric's unit.
//
//   npx tsx tests/pose/careful-eval.ts [--models lightning,thunder,blazepose] [--write docs/accuracy.md]

import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Keypoint, PoseModelName } from '@shared/keypoints';
import { analyzeMediaFile } from '@server/pose/analyze-media';
import { DEMO_CLIP_PLAN, DEMO_FOOTAGE_DIR } from '@server/seed/demo-clips';
import type { PhantomTruth } from '../../fixtures/phantom/render-phantom';
import { emitDocSection, modelEvalArgs } from './doc-section';
import { CHECKED_METRICS, evaluateFrame, pooledErrors, quantile, type FrameEvaluation } from './phantom-eval';

const CLIPS = ['phantom-front-turns', 'phantom-side-run', 'phantom-spring-turns', 'phantom-crossing-turns'];

export interface CarefulSummary {
  jointMedian: number;
  jointP90: number;
  /** Median |error| per checked metric of the clip's view. */
  metrics: Record<string, number>;
  ms: number;
}

async function readClip(
  name: string,
  model: PoseModelName,
  careful: boolean,
): Promise<{ frameIndex: number; keypoints: Keypoint[] }[]> {
  const pick = DEMO_CLIP_PLAN.find((p) => p.footage === name && p.pick)?.pick;
  const frames: { frameIndex: number; keypoints: Keypoint[] }[] = [];
  for await (const f of analyzeMediaFile(join(DEMO_FOOTAGE_DIR, `${name}.mp4`), {
    model,
    every: 1,
    careful,
    pick: pick ? { x: pick.x, y: pick.y, frame: pick.frameIndex } : null,
  }))
    if (f.frame !== null) frames.push({ frameIndex: f.frame, keypoints: f.keypoints });
  return frames;
}

/** The four demo clips read by one model, usually and carefully. */
export async function carefulRun(model: PoseModelName): Promise<Record<'usual' | 'careful', CarefulSummary>> {
  const out = {} as Record<'usual' | 'careful', CarefulSummary>;
  for (const careful of [false, true]) {
    const evaluations: FrameEvaluation[] = [];
    const metricErrors: Record<string, number[]> = {};
    const start = performance.now();
    let frames = 0;
    for (const name of CLIPS) {
      const truth = JSON.parse(
        readFileSync(join('fixtures', 'phantom', 'demo', `${name}.truth.json`), 'utf8'),
      ) as { frames: PhantomTruth[] };
      for (const f of await readClip(name, model, careful)) {
        const want = truth.frames[f.frameIndex];
        const evaluation = evaluateFrame(f.keypoints, want);
        evaluations.push(evaluation);
        frames += 1;
        for (const { key, view } of CHECKED_METRICS) {
          const error = evaluation.metricError[key];
          if (view === want.view && error !== null && error !== undefined)
            (metricErrors[key] ??= []).push(Math.abs(error));
        }
      }
    }
    const pooled = pooledErrors(evaluations);
    out[careful ? 'careful' : 'usual'] = {
      jointMedian: pooled.median,
      jointP90: pooled.p90,
      metrics: Object.fromEntries(Object.entries(metricErrors).map(([k, v]) => [k, quantile(v, 0.5)])),
      ms: (performance.now() - start) / frames,
    };
  }
  return out;
}

const isMain = process.argv[1]?.endsWith('careful-eval.ts');
if (isMain) {
  const { models, write } = modelEvalArgs();
  const rows: string[] = [];
  let keys: string[] = [];
  for (const model of models) {
    process.stderr.write(`${model}…\n`);
    const run = await carefulRun(model);
    keys = Object.keys(run.usual.metrics);
    const pair = (a: number, b: number, digits: number) => `${a.toFixed(digits)} → ${b.toFixed(digits)}`;
    rows.push(
      `| ${model} | ${pair(run.usual.jointMedian, run.careful.jointMedian, 4)} | ${pair(run.usual.jointP90, run.careful.jointP90, 4)} | ${keys.map((k) => pair(run.usual.metrics[k], run.careful.metrics[k], 2)).join(' | ')} | ${Math.round(run.usual.ms)} → ${Math.round(run.careful.ms)} |`,
    );
  }
  const command = `npx tsx tests/pose/careful-eval.ts --models ${models.join(',')}${write ? ` --write ${write}` : ''}`;
  emitDocSection(
    'careful-eval',
    'Careful reading of clips',
    command,
    [
      `The demo club's four phantom clips (25 fps; ${CLIPS.join(', ')}; the crossing clip followed from the coach's pick) read on the server's path once as usual and once carefully: each frame (or the followed athlete's box) read with its mirror image too, left and right swapped back, each point the score-weighted mean of the two reads (\`flipAverage\` in \`shared/pose/pose-detector.ts\`). Every frame against the rendered truth; "usual → careful". Joint errors in torso lengths, metric errors (medians) in degrees or ratio; the last column is this machine's milliseconds a frame in Node (WASM), decoding included.`,
      '',
      `| model | median joint error | p90 joint error | ${keys.join(' | ')} | ms a frame |`,
      `|---|---|---|${keys.map(() => '---|').join('')}---|`,
      ...rows,
    ],
    write,
  );
}
