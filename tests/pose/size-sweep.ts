// Joint error against the skier's height in the frame, 10 % to 80 %, for each model: one pass over the
// whole frame ("before") against the detector's default, a second pass on the crop around the skier the
// first pass found, scaled to the model's input ("after"; `refineColdStart`). Phantom stills toward the
// camera and from the side (fixtures/phantom/phantom-set.ts, the same poses at every height).
//
//   npx tsx tests/pose/size-sweep.ts [--per-size 24] [--seed 2024] [--models lightning,thunder,blazepose] [--write docs/accuracy.md]
//
// With --write it replaces the section between the size-sweep markers of that file.

import { parseArgs } from 'node:util';
import { emitDocSection } from './doc-section';
import type { PoseModelName } from '@shared/keypoints';
import { createNodePoseDetector } from '@server/pose/node-detector';
import { phantomSet } from '../../fixtures/phantom/phantom-set';
import { renderPhantom } from '../../fixtures/phantom/render-phantom';
import { detectStill, evaluateFrame, pooledErrors, type FrameEvaluation } from './phantom-eval';

export const SWEEP_SIZES = [0.1, 0.15, 0.2, 0.3, 0.45, 0.6, 0.8] as const;

/** The same poses, frames and camera at each skier height (only the skier's height changes). */
export function sweepSpecs(size: number, perSize: number, seed: number) {
  // Whole groups of four (toward, side right, from behind, side left), less those from behind.
  return phantomSet({ count: Math.ceil((perSize * 4) / 3), seed, minSize: size, maxSize: size })
    .filter((s) => s.pose.facing !== 'away')
    .slice(0, perSize);
}

export async function sweepModel(
  model: PoseModelName,
  refineColdStart: boolean,
  perSize: number,
  seed: number,
  sizes: readonly number[] = SWEEP_SIZES,
): Promise<Map<number, FrameEvaluation[]>> {
  const detector = await createNodePoseDetector(model, { refineColdStart });
  const out = new Map<number, FrameEvaluation[]>();
  try {
    for (const size of sizes) {
      const evals: FrameEvaluation[] = [];
      for (const spec of sweepSpecs(size, perSize, seed)) {
        const frame = renderPhantom(spec);
        const keypoints = await detectStill(detector, frame);
        evals.push(evaluateFrame(keypoints, frame.truth));
      }
      out.set(size, evals);
    }
  } finally {
    detector.dispose();
  }
  return out;
}

const isMain = process.argv[1]?.endsWith('size-sweep.ts');
if (isMain) {
  const { values } = parseArgs({
    options: {
      'per-size': { type: 'string', default: '24' },
      seed: { type: 'string', default: '2024' },
      models: { type: 'string', default: 'lightning,thunder,blazepose' },
      write: { type: 'string' },
    },
  });
  const perSize = Number(values['per-size']);
  const seed = Number(values.seed);
  const models = (values.models as string).split(',') as PoseModelName[];
  const cell = (evals: FrameEvaluation[]) => {
    const p = pooledErrors(evals);
    return { found: evals.filter((e) => e.found).length, median: p.median };
  };
  const rows: string[] = [];
  const header = `| skier height | ${models.map((m) => `${m}: found, median joint error (one pass → cropped)`).join(' | ')} |`;
  rows.push(header, `|---|${models.map(() => '---').join('|')}|`);
  const runs = new Map<PoseModelName, [Map<number, FrameEvaluation[]>, Map<number, FrameEvaluation[]>]>();
  for (const model of models) {
    process.stderr.write(`${model}…\n`);
    runs.set(model, [
      await sweepModel(model, false, perSize, seed),
      await sweepModel(model, true, perSize, seed),
    ]);
  }
  for (const size of SWEEP_SIZES) {
    const cells = models.map((model) => {
      const [before, after] = runs.get(model)!;
      const b = cell(before.get(size)!);
      const a = cell(after.get(size)!);
      const f = (v: number) => (Number.isFinite(v) ? v.toFixed(3) : '–');
      return `${b.found}→${a.found}/${perSize}, ${f(b.median)} → ${f(a.median)}`;
    });
    rows.push(`| ${Math.round(size * 100)} % | ${cells.join(' | ')} |`);
  }
  const command = `npx tsx tests/pose/size-sweep.ts --per-size ${perSize} --seed ${seed} --models ${models.join(',')}${values.write ? ` --write ${values.write}` : ''}`;
  emitDocSection(
    'size-sweep',
    'Joint error against skier height',
    command,
    [
      `The same ${perSize} phantom stills (toward the camera and from the side) at each skier height, as a share of the frame height; "found" is frames with the skier found, the error is the median over every body joint of those frames in torso lengths. "One pass" runs the model once on the whole frame; "cropped" is the detector's default: a second pass on the region around the skier that the first pass found, with a margin, scaled to the model's input (\`refineColdStart\`). In a clip, frames after the first use the region tracked from the frame before and run once.`,
      '',
      ...rows,
    ],
    values.write,
  );
}
