/**
 * Linear interpolation over short dropouts. `valid[i]` marks usable samples; a run of at most
 * `maxGap` unusable samples between two usable ones is filled. Returns the filled values and
 * which samples were filled; longer gaps and the ends stay unusable.
 */
export function fillGaps(
  values: readonly number[],
  valid: readonly boolean[],
  maxGap: number,
): { values: number[]; valid: boolean[]; filled: boolean[] } {
  const out = [...values];
  const ok = [...valid];
  const filled = values.map(() => false);
  let last = -1;
  for (let i = 0; i < values.length; i++) {
    if (!valid[i]) continue;
    const gap = i - last - 1;
    if (last >= 0 && gap > 0 && gap <= maxGap) {
      for (let j = last + 1; j < i; j++) {
        const t = (j - last) / (i - last);
        out[j] = values[last] + (values[i] - values[last]) * t;
        ok[j] = true;
        filled[j] = true;
      }
    }
    last = i;
  }
  return { values: out, valid: ok, filled };
}

/** [start, end) index ranges of consecutive usable samples. */
export function runsOf(valid: readonly boolean[]): [number, number][] {
  const runs: [number, number][] = [];
  let start = -1;
  for (let i = 0; i <= valid.length; i++) {
    if (i < valid.length && valid[i]) {
      if (start < 0) start = i;
    } else if (start >= 0) {
      runs.push([start, i]);
      start = -1;
    }
  }
  return runs;
}
