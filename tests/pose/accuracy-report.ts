// Accuracy of each pose model on the phantom set: per-joint pixel error (in torso lengths) and
// per-metric error against the phantom's analytic truth.
//
//   npx tsx tests/pose/accuracy-report.ts [--count 400] [--models lightning,thunder,blazepose] [--write docs/accuracy.md]
//
// Without --write it prints the tables; with it, it rewrites that file (prose + tables + command).

import { writeFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import type { PoseModelName } from '@shared/keypoints';
import type { MetricKey } from '@shared/metrics';
import { createNodePoseDetector } from '@server/pose/node-detector';
import { phantomSet } from '../../fixtures/phantom/phantom-set';
import { renderPhantom, type PhantomFrameSpec } from '../../fixtures/phantom/render-phantom';
import {
  BODY_JOINTS,
  detectStill,
  evaluateFrame,
  pooledErrors,
  quantile,
  summarise,
  type FrameEvaluation,
} from './phantom-eval';
import { SET_LIMITS } from './tolerances';

const { values } = parseArgs({
  options: {
    count: { type: 'string', default: '400' },
    models: { type: 'string', default: 'lightning,thunder,blazepose' },
    write: { type: 'string' },
    seed: { type: 'string', default: '2024' },
    'refine-models': { type: 'string', default: 'lightning,thunder' },
  },
});
const count = Number(values.count);
const seed = Number(values.seed);
const models = (values.models as string).split(',') as PoseModelName[];

type Group = 'front (toward camera)' | 'side' | 'front (from behind)';
const groupOf = (s: PhantomFrameSpec): Group =>
  s.pose.view === 'side'
    ? 'side'
    : s.pose.facing === 'away'
      ? 'front (from behind)'
      : 'front (toward camera)';

const specs = phantomSet({ count, seed, minSize: 0.2, maxSize: 0.85 });
const f2 = (v: number) => (Number.isFinite(v) ? v.toFixed(2) : '–');
const f3 = (v: number) => (Number.isFinite(v) ? v.toFixed(3) : '–');

const METRIC_UNITS: Partial<Record<MetricKey, string>> = {
  stanceWidthRatio: 'ratio',
  kneeSeparationRatio: 'ratio',
  legExtension: 'ratio',
  foreAftOffset: 'shin lengths',
  comForeAft: 'shin lengths',
};

interface ModelRun {
  model: PoseModelName;
  backend: string;
  byGroup: Map<Group, FrameEvaluation[]>;
  swapped: number;
  small: FrameEvaluation[];
}

async function runModel(model: PoseModelName, refineColdStart = true): Promise<ModelRun> {
  const detector = await createNodePoseDetector(model, { refineColdStart });
  const byGroup = new Map<Group, FrameEvaluation[]>();
  const small: FrameEvaluation[] = [];
  let swapped = 0;
  for (const [i, spec] of specs.entries()) {
    const frame = renderPhantom(spec);
    const keypoints = await detectStill(detector, frame);
    const evaluation = evaluateFrame(keypoints, frame.truth);
    const group = groupOf(spec);
    if (!byGroup.has(group)) byGroup.set(group, []);
    byGroup.get(group)!.push(evaluation);
    if (group !== 'front (from behind)' && spec.skierHeight / spec.height < 0.35) small.push(evaluation);
    if (group === 'front (from behind)' && keypoints.length > 0) {
      // Left/right swapped: the detected left hip is nearer the true right hip than the true left.
      const hip = keypoints.find((k) => k.name === 'left_hip');
      const t = frame.truth.joints;
      if (
        hip &&
        Math.hypot(hip.x - t.right_hip[0], hip.y - t.right_hip[1]) <
          Math.hypot(hip.x - t.left_hip[0], hip.y - t.left_hip[1])
      )
        swapped++;
    }
    if ((i + 1) % 50 === 0)
      process.stderr.write(`${model}${refineColdStart ? '' : ' (one pass)'}: ${i + 1}/${specs.length}\n`);
  }
  detector.dispose();
  return {
    model,
    backend: detector.backend,
    byGroup,
    swapped,
    small,
  };
}

function jointTable(runs: ModelRun[], group: Group): string {
  const lines = [
    `| joint | ${runs.map((r) => `${r.model} median / p90`).join(' | ')} |`,
    `|---|${runs.map(() => '---').join('|')}|`,
  ];
  for (const joint of BODY_JOINTS) {
    const cells = runs.map((r) => {
      const s = summarise(r.model, r.byGroup.get(group) ?? []).joints[joint];
      return `${f3(s.median)} / ${f3(s.p90)}`;
    });
    lines.push(`| ${joint} | ${cells.join(' | ')} |`);
  }
  return lines.join('\n');
}

function metricTable(runs: ModelRun[], group: Group): string {
  const keys = new Set<MetricKey>();
  for (const r of runs)
    for (const e of r.byGroup.get(group) ?? [])
      for (const [k, v] of Object.entries(e.metricError)) if (v !== null) keys.add(k as MetricKey);
  const lines = [
    `| metric (unit) | ${runs.map((r) => `${r.model} median abs / p90 abs / mean (bias)`).join(' | ')} |`,
    `|---|${runs.map(() => '---').join('|')}|`,
  ];
  for (const key of keys) {
    const cells = runs.map((r) => {
      const m = summarise(r.model, r.byGroup.get(group) ?? []).metrics[key];
      const fmt = METRIC_UNITS[key] ? f3 : f2;
      return m ? `${fmt(m.medianAbs)} / ${fmt(m.p90Abs)} / ${fmt(m.bias)}` : '–';
    });
    lines.push(`| ${key} (${METRIC_UNITS[key] ?? 'deg'}) | ${cells.join(' | ')} |`);
  }
  return lines.join('\n');
}

function overview(runs: ModelRun[]): string {
  const groups = [...new Set(specs.map(groupOf))];
  const lines = [
    `| model | backend | ${groups.map((g) => `found: ${g}`).join(' | ')} | small skiers (< 35 % of frame height): found, median joint error |`,
    `|---|---|${groups.map(() => '---').join('|')}|---|`,
  ];
  for (const r of runs) {
    const found = groups.map((g) => {
      const e = r.byGroup.get(g) ?? [];
      return `${e.filter((x) => x.found).length}/${e.length}`;
    });
    const smallErrors = r.small.flatMap((e) =>
      Object.values(e.jointError).filter((v): v is number => v !== null),
    );
    lines.push(
      `| ${r.model} | ${r.backend} | ${found.join(' | ')} | ${r.small.filter((e) => e.found).length}/${r.small.length}, ${f3(quantile(smallErrors, 0.5))} |`,
    );
  }
  return lines.join('\n');
}

const runs: ModelRun[] = [];
for (const model of models) runs.push(await runModel(model));
const refineModels = (values['refine-models'] as string).split(',').filter(Boolean) as PoseModelName[];
const onePass: ModelRun[] = [];
for (const model of refineModels) onePass.push(await runModel(model, false));

/** All body joints of the frames toward the camera and from the side, pooled. */
function pooled(run: ModelRun): number[] {
  return [...(run.byGroup.get('front (toward camera)') ?? []), ...(run.byGroup.get('side') ?? [])].flatMap(
    (e) => Object.values(e.jointError).filter((v): v is number => v !== null),
  );
}

let limitsFailed = false;
function limitsTable(): string {
  const lines = [
    '| model | median joint error (limit) | p90 joint error (limit) | found (limit) | within limits |',
    '|---|---|---|---|---|',
  ];
  for (const run of runs) {
    const limit = SET_LIMITS[run.model];
    const p = pooledErrors([
      ...(run.byGroup.get('front (toward camera)') ?? []),
      ...(run.byGroup.get('side') ?? []),
    ]);
    const ok = p.median <= limit.medianError && p.p90 <= limit.p90Error && p.found >= limit.minFound;
    if (!ok) limitsFailed = true;
    lines.push(
      `| ${run.model} | ${f3(p.median)} (≤ ${limit.medianError}) | ${f3(p.p90)} (≤ ${limit.p90Error}) | ${(p.found * 100).toFixed(0)} % (≥ ${limit.minFound * 100} %) | ${ok ? 'yes' : '**no**'} |`,
    );
  }
  return lines.join('\n');
}

function refineTable(): string {
  const lines = [
    '| model | passes on a still | found (front toward + side) | joint error median / p90 / p99 (torso lengths) |',
    '|---|---|---|---|',
  ];
  for (const one of onePass) {
    const two = runs.find((r) => r.model === one.model);
    for (const [label, run] of [
      ['one (first pass only)', one],
      ['two (refined, default)', two],
    ] as const) {
      if (!run) continue;
      const v = pooled(run);
      const found = [...(run.byGroup.get('front (toward camera)') ?? []), ...(run.byGroup.get('side') ?? [])];
      lines.push(
        `| ${run.model} | ${label} | ${found.filter((e) => e.found).length}/${found.length} | ${f3(quantile(v, 0.5))} / ${f3(quantile(v, 0.9))} / ${f3(quantile(v, 0.99))} |`,
      );
    }
  }
  return lines.join('\n');
}

const command = `npx tsx tests/pose/accuracy-report.ts --count ${count} --seed ${seed} --models ${models.join(',')} --refine-models ${refineModels.join(',')}${values.write ? ` --write ${values.write}` : ''}`;
const behind = runs
  .map((r) => {
    const found = (r.byGroup.get('front (from behind)') ?? []).filter((e) => e.found).length;
    return `${r.model} ${r.swapped}/${found}`;
  })
  .join(', ');

const tables = `## Overview

${overview(runs)}

## Limits the tests enforce

Pooled over every body joint of the frames toward the camera and from the side; the limits are
\`SET_LIMITS\` in \`tests/pose/tolerances.ts\`, which \`tests/pose/phantom-set.test.ts\` checks on a
48-frame sample of this set.

${limitsTable()}

## Joint error, front view toward the camera (torso lengths)

${jointTable(runs, 'front (toward camera)')}

## Joint error, side view (torso lengths)

${jointTable(runs, 'side')}

## Metric error, front view toward the camera (detected − true)

${metricTable(runs, 'front (toward camera)')}

## Metric error, side view (detected − true)

${metricTable(runs, 'side')}

## Cold-start refinement

${refineTable()}

## From behind

Frames of a skier going away from the camera where the model swapped the skier's left and right
(detected left hip nearer the true right hip): ${behind}. Joint errors for these frames are not in the
tables above; see "Findings".`;

if (!values.write) {
  process.stdout.write(`${tables}\n\nCommand: ${command}\n`);
} else {
  const doc = `# Pose accuracy on the phantom skier

Generated by

\`\`\`
${command}
\`\`\`

(${specs.length} phantom stills from \`fixtures/phantom/phantom-set.ts\`, seed ${seed}: front views toward the
camera and from behind, side views facing left and right; frames 640×480, 960×540, 1280×720 and 480×640;
skier height 20–85 % of the frame height; camera roll ±6° from the front, slopes 4–18° from the side;
four outfits. Node, WASM backend, the same detector module the browser worker uses, one still at a time
with the detector reset before each. Run on this project's 2-core machine.)

- **Joint error** is the distance between the detected and the true joint divided by the true torso
  length (hip midpoint to shoulder midpoint) of that frame; median and 90th percentile over the frames
  where the model found the skier.
- **Metric error** is the metric from \`shared/metrics\` on the detected keypoints (confidence floor 0, the
  true snow line as reference) minus the phantom's analytic truth (\`fixtures/phantom/phantom-truth.ts\`).
- What the tests enforce: \`tests/pose/phantom-set.test.ts\` holds a 48-frame sample of this set to the
  limits in the "Limits" table; \`tests/pose/detector.test.ts\` (Node) and
  \`tests/e2e/pose-worker.e2e.test.ts\` (browser worker) hold six fixed frames to the per-joint and
  per-metric tolerances in \`tests/pose/tolerances.ts\`. Speed: \`tests/bench/pose.bench.ts\`.

${tables}

## Findings

- **Ankles are the weakest joints** on the phantom as on real skiers: the boot hides the ankle, and the
  models put it higher and further forward in the boot than the joint centre (side view), which biases
  shin angle and ankle flexion. Treat ankle-based metrics with their confidence.
- **BlazePose's heel and foot-tip points do not follow a ski boot**: with them, ankle flexion (foot
  line heel → foot tip) is off by about 20° on average in the side-view table above, while MoveNet's
  value (foot taken along the snow line, docs/metrics.md's fallback) is within a few degrees. For skiers in
  boots on skis the snow-line fallback is the better foot line.
- **From behind, left and right get swapped** on most frames: without a face the models read the figure
  as facing the camera. Front-view metrics are signed by the skier's own left, so a swapped frame
  flips their sign. A clip filmed from behind needs the labels swapped (a per-clip "filmed from behind"
  setting) before its metrics mean anything; \`swapLeftRight\` in \`shared/pose/keypoint-mapping.ts\` does
  that, and on the phantom's frames from behind it brings Lightning's median joint error from 0.74 to
  0.07 torso lengths (\`tests/pose/phantom-set.test.ts\`).
- **Cold-start refinement** (\`refineColdStart\`, on by default) runs a second pass on the region the
  first pass found; the table above shows what it does to the error of a still. It costs a second pass
  per still; frames of a clip after the first use the tracked region and run once.
- **Front-view knees** are placed less well than side-view knees (the knee bends toward the camera and
  only a light patch on the pants marks it), which shows in knee separation and knee angulation.
- **Small skiers**: BlazePose's person detector misses many skiers below about a third of the frame
  height (overview, last column), where MoveNet still finds most; prefer MoveNet for wide shots, or
  crop to the skier.
- **A real photograph** (\`tests/pose/photo.test.ts\`, the public-domain astronaut portrait): both MoveNet
  models put the face within a few pixels and the shoulders within the annotation's uncertainty;
  BlazePose finds the face but puts both shoulders on the suit's neck ring.
- A phantom is easier than snow glare, motion blur, bibs and gates: read these numbers as a lower bound
  of the error on real footage and as a regression check on the pipeline.
`;
  writeFileSync(values.write, doc);
  process.stderr.write(`wrote ${values.write}\n`);
}
if (limitsFailed) {
  process.stderr.write('some models are outside the limits in tests/pose/tolerances.ts\n');
  process.exitCode = 1;
}
