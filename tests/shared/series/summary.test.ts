// The clip summary's median, min and max (shared/series: summarizeValues, a selection rather than a
// sort) against the textbook definition computed here by sorting a copy: the middle value of an odd
// count, the mean of the two middle values of an even count.
import { describe, expect, it } from 'vitest';
import { summarizeValues } from '@shared/series';

function reference(values: number[]) {
  const s = [...values].sort((a, b) => a - b);
  const n = s.length;
  return {
    median: n % 2 === 1 ? s[(n - 1) / 2] : (s[n / 2 - 1] + s[n / 2]) / 2,
    min: s[0],
    max: s[n - 1],
    count: n,
  };
}

describe('summary of a metric over frames', () => {
  it('gives the textbook median, min and max for odd and even counts, with ties and negatives', () => {
    let seed = 7;
    const random = () => ((seed = (seed * 16807) % 2147483647) / 2147483647) * 2 - 1;
    for (const n of [1, 2, 3, 4, 5, 10, 11, 100, 101, 1000, 1001]) {
      for (const ties of [false, true]) {
        const values = Array.from({ length: n }, () => (ties ? Math.round(random() * 3) + 0 : random() * 40));
        expect(summarizeValues(Float64Array.from(values)), `${n} values${ties ? ' with ties' : ''}`).toEqual(
          reference(values),
        );
      }
    }
  });

  it('a worked example: 3, 1, 4, 1, 5, 9 has median 3.5 (between 3 and 4)', () => {
    expect(summarizeValues(Float64Array.from([3, 1, 4, 1, 5, 9]))).toEqual({
      median: 3.5,
      min: 1,
      max: 9,
      count: 6,
    });
  });

  it('no values: no median', () => {
    expect(summarizeValues(new Float64Array(0))).toEqual({ median: null, min: null, max: null, count: 0 });
  });
});
