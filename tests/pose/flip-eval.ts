// Test-time flipping against the raw library call, side by side in one run: each phantom still read
// once as the library reads it (with the detector's cropped second pass), and read again with its
// mirror image averaged in (left and right swapped back, each point weighted by score). Joint error and
// side-view knee-flexion error against the phantom's truth.
//
//   npx tsx tests/pose/flip-eval.ts [--count 96] [--seed 2024] [--models lightning,thunder,blazepose] [--write docs/accuracy.md]

import { parseArgs } from 'node:util';
import { emitDocSection } from './doc-section';
import type { PoseModelName } from '@shared/keypoints';
import { computeFrameMetrics } from '@shared/metrics';
import { createNodePoseDetector } from '@server/pose/node-detector';
import { phantomSet } from '../../fixtures/phantom/phantom-set';
import { renderPhantom } from '../../fixtures/phantom/render-phantom';
import { detectStill, evaluateFrame, pooledErrors, quantile, type FrameEvaluation } from './phantom-eval';

export interface FlipRun {
  raw: FrameEvaluation[];
  flipped: FrameEvaluation[];
  kneeRaw: number[];
  kneeFlipped: number[];
}

export async function flipRun(model: PoseModelName, count: number, seed: number): Promise<FlipRun> {
  const specs = phantomSet({ count, seed, minSize: 0.2, maxSize: 0.85 }).filter(
    (s) => s.pose.facing !== 'away',
  );
  const detector = await createNodePoseDetector(model);
  const run: FlipRun = { raw: [], flipped: [], kneeRaw: [], kneeFlipped: [] };
  const knees = (
    keypoints: Parameters<typeof computeFrameMetrics>[0]['keypoints'],
    line: [[number, number], [number, number]],
    truth: Record<string, number | null>,
  ) => {
    const m = computeFrameMetrics({
      keypoints,
      view: 'side',
      referenceLine: line,
      confidenceFloor: 0,
    }).metrics;
    const out: number[] = [];
    for (const key of ['kneeFlexionLeft', 'kneeFlexionRight'] as const) {
      const want = truth[key];
      const got = m[key];
      if (want !== null && want !== undefined && got !== null) out.push(Math.abs(got - want));
    }
    return out;
  };
  try {
    for (const spec of specs) {
      const frame = renderPhantom(spec);
      const raw = await detectStill(detector, frame);
      const flipped = await detectStill(detector, frame, { flipAverage: true });
      run.raw.push(evaluateFrame(raw, frame.truth));
      run.flipped.push(evaluateFrame(flipped, frame.truth));
      if (spec.pose.view === 'side') {
        run.kneeRaw.push(...knees(raw, frame.truth.referenceLine, frame.truth.metrics));
        run.kneeFlipped.push(...knees(flipped, frame.truth.referenceLine, frame.truth.metrics));
      }
    }
  } finally {
    detector.dispose();
  }
  return run;
}

const isMain = process.argv[1]?.endsWith('flip-eval.ts');
if (isMain) {
  const { values } = parseArgs({
    options: {
      count: { type: 'string', default: '96' },
      seed: { type: 'string', default: '2024' },
      models: { type: 'string', default: 'lightning,thunder,blazepose' },
      write: { type: 'string' },
    },
  });
  const count = Number(values.count);
  const seed = Number(values.seed);
  const models = (values.models as string).split(',') as PoseModelName[];
  const f3 = (v: number) => (Number.isFinite(v) ? v.toFixed(3) : '–');
  const f1 = (v: number) => (Number.isFinite(v) ? v.toFixed(1) : '–');
  const rows = [
    '| model | median joint error: library → flipped | p90 joint error: library → flipped | side-view knee flexion, median error: library → flipped |',
    '|---|---|---|---|',
  ];
  for (const model of models) {
    process.stderr.write(`${model}…\n`);
    const r = await flipRun(model, count, seed);
    const a = pooledErrors(r.raw);
    const b = pooledErrors(r.flipped);
    rows.push(
      `| ${model} | ${f3(a.median)} → ${f3(b.median)} | ${f3(a.p90)} → ${f3(b.p90)} | ${f1(quantile(r.kneeRaw, 0.5))}° → ${f1(quantile(r.kneeFlipped, 0.5))}° |`,
    );
  }
  const command = `npx tsx tests/pose/flip-eval.ts --count ${count} --seed ${seed} --models ${models.join(',')}${values.write ? ` --write ${values.write}` : ''}`;
  emitDocSection(
    'flip-eval',
    'Test-time flipping against the library',
    command,
    [
      `The accuracy set's first ${count} stills less those from behind (toward the camera and from the side). "Library" is one read as the pose-detection library gives it (with the detector's cropped second pass); "flipped" adds a read of the mirror image, with left and right swapped back, each point the score-weighted mean of the two reads (\`flipAverage\` in \`shared/pose/pose-detector.ts\`, twice the passes).`,
      '',
      ...rows,
    ],
    values.write,
  );
}
