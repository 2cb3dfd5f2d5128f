// Knee flexion on real photographs, the product's reading against the raw library call side by side in
// one run: each marked picture (tests/pose/photo-set.ts) read three ways by the same loaded model.
//  - library: one call of the pose-detection library on the picture (maxPoses 1, no second pass);
//  - product: the detector's default, a second pass on the region the first pass found
//    (refineColdStart), which is what the app and the CLI do on a still or a cold frame;
//  - careful: the product plus test-time flipping (flipAverage), twice the passes.
// Knee flexion is 180° minus the hip–knee–ankle angle in the image (docs/metrics.md, kneeFlexion*);
// the error is against the same angle of the hand-marked points.
//
//   npx tsx tests/pose/photo-eval.ts [--models lightning,thunder,blazepose] [--write docs/accuracy.md]

import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { interiorAngle } from '@shared/geometry';
import type { Keypoint, PoseModelName } from '@shared/keypoints';
import type { DetectOptions, PixelFrame, PoseDetector } from '@shared/pose/pose-detector';
import { decodeImageFile } from '@server/pose/image-decode';
import { createNodePoseDetector } from '@server/pose/node-detector';
import { emitDocSection, modelEvalArgs } from './doc-section';
import { quantile } from './phantom-eval';
import { PHOTO_SET, type MarkedLeg, type MarkedPhoto, type Point } from './photo-set';

export const PHOTO_METHODS = ['library', 'product', 'careful'] as const;
export type PhotoMethod = (typeof PHOTO_METHODS)[number];

export interface PhotoLegResult {
  photo: string;
  marked: number;
  /** Null when the method found no hip, knee and ankle on both sides. */
  detected: number | null;
  error: number | null;
}

export type PhotoRun = Record<PhotoMethod, PhotoLegResult[]>;

const photosDir = join(process.cwd(), 'fixtures', 'generated', 'photos', 'opencv');

/** Extracts the pictures from Debian's opencv-doc package when they are missing. */
export function ensurePhotos(): void {
  if (!PHOTO_SET.every((p) => existsSync(join(photosDir, p.file))))
    execFileSync('bash', [join('tests', 'pose', 'fetch-photo.sh')], { stdio: 'inherit' });
}

export function kneeFlexion(leg: MarkedLeg): number {
  const [h, k, a] = [leg.hip, leg.knee, leg.ankle].map(([x, y]) => ({ x, y }));
  return 180 - (interiorAngle(h, k, a) ?? NaN);
}

function cropPixels(image: PixelFrame, crop: MarkedPhoto['crop']): PixelFrame {
  if (!crop) return image;
  const [x0, y0, w, h] = crop;
  const data = new Uint8ClampedArray(w * h * 4);
  for (let y = 0; y < h; y += 1) {
    const from = ((y0 + y) * image.width + x0) * 4;
    data.set(image.data.subarray(from, from + w * 4), y * w * 4);
  }
  return { data, width: w, height: h, channels: 4 };
}

function legsOf(keypoints: Keypoint[], offset: Point): [MarkedLeg, MarkedLeg] | null {
  const at = (name: string): Point | null => {
    const k = keypoints.find((p) => p.name === name);
    return k ? [k.x + offset[0], k.y + offset[1]] : null;
  };
  const legs: MarkedLeg[] = [];
  for (const side of ['left', 'right']) {
    const [hip, knee, ankle] = [at(`${side}_hip`), at(`${side}_knee`), at(`${side}_ankle`)];
    if (!hip || !knee || !ankle) return null;
    legs.push({ hip, knee, ankle });
  }
  return legs as [MarkedLeg, MarkedLeg];
}

const gap = (a: MarkedLeg, b: MarkedLeg) =>
  (['hip', 'knee', 'ankle'] as const).reduce(
    (sum, j) => sum + Math.hypot(a[j][0] - b[j][0], a[j][1] - b[j][1]),
    0,
  );

/** The model's two legs paired with the marked two by position (sides are not marked). */
export function pairLegs(
  found: [MarkedLeg, MarkedLeg],
  marked: readonly [MarkedLeg, MarkedLeg],
): [[MarkedLeg, MarkedLeg], [MarkedLeg, MarkedLeg]] {
  const straight = gap(found[0], marked[0]) + gap(found[1], marked[1]);
  const crossed = gap(found[0], marked[1]) + gap(found[1], marked[0]);
  return crossed < straight
    ? [
        [found[0], marked[1]],
        [found[1], marked[0]],
      ]
    : [
        [found[0], marked[0]],
        [found[1], marked[1]],
      ];
}

async function readLegs(
  detector: PoseDetector,
  photo: MarkedPhoto,
  image: PixelFrame,
  options: DetectOptions,
): Promise<PhotoLegResult[]> {
  detector.reset();
  const { keypoints } = await detector.detect(image, options);
  const found = legsOf(keypoints, photo.crop ? [photo.crop[0], photo.crop[1]] : [0, 0]);
  if (!found)
    return photo.legs.map((leg) => ({
      photo: photo.id,
      marked: kneeFlexion(leg),
      detected: null,
      error: null,
    }));
  return pairLegs(found, photo.legs).map(([got, want]) => ({
    photo: photo.id,
    marked: kneeFlexion(want),
    detected: kneeFlexion(got),
    error: Math.abs(kneeFlexion(got) - kneeFlexion(want)),
  }));
}

/** Every marked picture read by one model three ways: the library's one call, the product, careful. */
export async function photoRun(model: PoseModelName): Promise<PhotoRun> {
  ensurePhotos();
  const library = await createNodePoseDetector(model, { refineColdStart: false });
  const product = await createNodePoseDetector(model);
  const run: PhotoRun = { library: [], product: [], careful: [] };
  try {
    for (const photo of PHOTO_SET) {
      const image = cropPixels(await decodeImageFile(join(photosDir, photo.file)), photo.crop);
      run.library.push(...(await readLegs(library, photo, image, {})));
      run.product.push(...(await readLegs(product, photo, image, {})));
      run.careful.push(...(await readLegs(product, photo, image, { flipAverage: true })));
    }
  } finally {
    library.dispose();
    product.dispose();
  }
  return run;
}

export interface PhotoSummary {
  legs: number;
  found: number;
  mean: number;
  median: number;
  p90: number;
}

/** A leg the method did not find counts as a 90° error in the mean, so missing is never a gain. */
export const MISSED_LEG_ERROR = 90;

export function summarize(results: PhotoLegResult[]): PhotoSummary {
  const errors = results.map((r) => r.error ?? MISSED_LEG_ERROR);
  return {
    legs: results.length,
    found: results.filter((r) => r.error !== null).length,
    mean: errors.reduce((a, b) => a + b, 0) / errors.length,
    median: quantile(errors, 0.5),
    p90: quantile(errors, 0.9),
  };
}

const isMain = process.argv[1]?.endsWith('photo-eval.ts');
if (isMain) {
  const { models, write } = modelEvalArgs();
  const f1 = (v: number) => v.toFixed(1);
  const change = (from: number, to: number) =>
    `${to <= from ? '−' : '+'}${f1(Math.abs((to / from - 1) * 100))} %`;
  const rows = [
    '| model | legs found: library / product / careful | mean error: library → product → careful | median error: library → product → careful | p90 error: library → product → careful | mean, careful against library |',
    '|---|---|---|---|---|---|',
  ];
  const perLeg: string[] = [];
  for (const model of models) {
    process.stderr.write(`${model}…\n`);
    const run = await photoRun(model);
    const [l, p, c] = PHOTO_METHODS.map((m) => summarize(run[m]));
    rows.push(
      `| ${model} | ${l.found} / ${p.found} / ${c.found} of ${l.legs} | ${f1(l.mean)}° → ${f1(p.mean)}° → ${f1(c.mean)}° | ${f1(l.median)}° → ${f1(p.median)}° → ${f1(c.median)}° | ${f1(l.p90)}° → ${f1(p.p90)}° → ${f1(c.p90)}° | ${change(l.mean, c.mean)} |`,
    );
    perLeg.push(
      `| ${model} | ${run.library
        .map((r, i) => {
          const cell = (x: PhotoLegResult) => (x.detected === null ? '–' : f1(x.detected));
          return `${r.photo} ${f1(r.marked)}°: ${cell(r)} / ${cell(run.product[i])} / ${cell(run.careful[i])}`;
        })
        .join('<br>')} |`,
    );
  }
  const command = `npx tsx tests/pose/photo-eval.ts --models ${models.join(',')}${write ? ` --write ${write}` : ''}`;
  emitDocSection(
    'photo-eval',
    'Knee flexion on real photographs',
    command,
    [
      `${PHOTO_SET.length} pictures from OpenCV's sample data as Debian's opencv-doc package carries it (a footballer kicking, a man catching a ball, eight pedestrians 80–115 px tall seen from above; \`tests/pose/photo-set.ts\`), ${PHOTO_SET.length * 2} legs with hip, knee and ankle marked by hand before any model ran (±3–5 px, about ±5–10° of knee angle on the walkers). Knee flexion is 180° minus the hip–knee–ankle angle in the picture; the error is against the marked points' angle, legs paired by position. "Library" is one call of the pose-detection library; "product" is the detector's default, a second pass on the region the first found; "careful" adds test-time flipping (\`flipAverage\`, twice the passes). A leg not found counts ${MISSED_LEG_ERROR}° in the mean.`,
      '',
      ...rows,
      '',
      'Per leg, marked angle: library / product / careful (degrees):',
      '',
      '| model | legs |',
      '|---|---|',
      ...perLeg,
    ],
    write,
  );
}
