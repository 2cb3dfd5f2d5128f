// Test-time flipping (docs/accuracy.md, "Test-time flipping against the library"): the mirror image's
// read, swapped back and averaged in, is never worse than the library's read on a phantom sample, and
// the averaging itself weights each point by its score.
import { describe, expect, it } from 'vitest';
import { averageKeypoints } from '@shared/pose/pose-detector';
import { pooledErrors } from './phantom-eval';
import { flipRun } from './flip-eval';

describe('test-time flipping', () => {
  it('averages two reads of a point by score, keeping a point only one read has', () => {
    const a = [
      { name: 'left_knee' as const, x: 10, y: 20, score: 0.9 },
      { name: 'nose' as const, x: 5, y: 5, score: 0.5 },
    ];
    const b = [{ name: 'left_knee' as const, x: 20, y: 40, score: 0.3 }];
    expect(averageKeypoints(a, b)).toEqual([
      { name: 'left_knee', x: (10 * 0.9 + 20 * 0.3) / 1.2, y: (20 * 0.9 + 40 * 0.3) / 1.2, score: 0.6 },
      { name: 'nose', x: 5, y: 5, score: 0.5 },
    ]);
  });

  it('is at least as good as the library on a phantom sample (Lightning)', async () => {
    const run = await flipRun('lightning', 96, 2024); // the report's sample
    const raw = pooledErrors(run.raw);
    const flipped = pooledErrors(run.flipped);
    // The report over 96 stills: 0.066 → 0.063 median, 0.175 → 0.170 p90.
    expect(flipped.found).toBe(raw.found);
    expect(flipped.median).toBeLessThanOrEqual(raw.median * 1.02);
    expect(flipped.p90).toBeLessThanOrEqual(raw.p90 * 1.02);
  }, 180_000);
});
