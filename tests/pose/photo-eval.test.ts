// Knee flexion on real photographs (OpenCV's sample pictures, hips, knees and ankles marked by hand:
// tests/pose/photo-set.ts), the product's reading against the raw library call on the same pictures.
// The figures are in docs/accuracy.md, "Knee flexion on real photographs"; these checks hold the
// findings there so a change that loses them fails.
import { beforeAll, describe, expect, it } from 'vitest';
import type { PoseModelName } from '@shared/keypoints';
import { PHOTO_SET } from './photo-set';
import { ensurePhotos, kneeFlexion, pairLegs, photoRun, summarize, type PhotoRun } from './photo-eval';

const MODELS: PoseModelName[] = ['lightning', 'thunder', 'blazepose'];
const runs = new Map<PoseModelName, PhotoRun>();

beforeAll(async () => {
  ensurePhotos();
  for (const model of MODELS) runs.set(model, await photoRun(model));
}, 240_000);

describe('knee flexion on real photographs', () => {
  it('the marks give the angles they were marked for: a deep support knee and nearly straight walkers', () => {
    expect(PHOTO_SET).toHaveLength(10);
    const kick = PHOTO_SET.find((p) => p.id === 'kick')!.legs.map(kneeFlexion);
    expect(Math.max(...kick)).toBeGreaterThan(60);
    for (const p of PHOTO_SET.filter((x) => x.id.startsWith('walker')))
      for (const leg of p.legs) expect(kneeFlexion(leg), p.id).toBeLessThan(25);
  });

  it('pairs the model legs with the marked legs by position, whichever side the model names', () => {
    const [a, b] = PHOTO_SET[0].legs;
    expect(pairLegs([b, a], [a, b])).toEqual([
      [b, b],
      [a, a],
    ]);
  });

  it.each(MODELS)('%s finds both legs on every picture, every way of reading', (model) => {
    const run = runs.get(model)!;
    for (const method of ['library', 'product', 'careful'] as const)
      expect(summarize(run[method]).found, method).toBe(PHOTO_SET.length * 2);
  });

  it.each(MODELS)('%s reads the deeply bent kicking knee as deeply bent (within 15°)', (model) => {
    const kick = runs.get(model)!.product.filter((r) => r.photo === 'kick');
    const deep = kick.reduce((a, b) => (a.marked > b.marked ? a : b));
    expect(deep.error!).toBeLessThan(15);
  });

  it("Lightning: the product's careful reading has a mean knee error at least 10 % below the library's", () => {
    const run = runs.get('lightning')!;
    expect(summarize(run.careful).mean).toBeLessThan(0.9 * summarize(run.library).mean);
  });

  it.each(MODELS)(
    "%s: the product's reading is never much worse than the library's (mean within 15 %)",
    (model) => {
      const run = runs.get(model)!;
      expect(summarize(run.product).mean).toBeLessThan(1.15 * summarize(run.library).mean);
    },
  );
});
