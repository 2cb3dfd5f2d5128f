export interface Crossing {
  /** Index into the sample arrays of the sample nearer zero. */
  index: number;
  /** Crossing time by linear interpolation between the two samples around it. */
  timeMs: number;
}

export interface TurnSpan {
  direction: 1 | -1;
  /** Sample indices; start/end are crossings or the clip ends. */
  start: number;
  apex: number;
  end: number;
  startMs: number;
  endMs: number;
  startsAtTransition: boolean;
  endsAtTransition: boolean;
}

/**
 * Turns from a lean signal: a transition is a zero crossing, confirmed once the signal reaches
 * `threshold` on the other side (hysteresis, so jitter around zero does not split a turn). The
 * apex is the peak |value| between transitions.
 */
export function segmentTurns(
  values: readonly (number | null)[],
  timesMs: readonly number[],
  threshold: number,
): { transitions: Crossing[]; turns: TurnSpan[] } {
  const present = values.map((v, i) => ({ v, i })).filter((s): s is { v: number; i: number } => s.v !== null);
  const transitions: Crossing[] = [];
  let side: 0 | 1 | -1 = 0;
  let pending: Crossing | null = null;
  for (let k = 1; k < present.length; k++) {
    const a = present[k - 1];
    const b = present[k];
    if (a.v !== 0 && (a.v * b.v < 0 || b.v === 0)) {
      const f = a.v / (a.v - b.v);
      pending = {
        index: Math.abs(a.v) <= Math.abs(b.v) ? a.i : b.i,
        timeMs: timesMs[a.i] + (timesMs[b.i] - timesMs[a.i]) * f,
      };
    }
    for (const s of k === 1 ? [a, b] : [b]) {
      const sign = s.v > 0 ? 1 : -1;
      if (Math.abs(s.v) >= threshold && sign !== side) {
        if (side !== 0 && pending) transitions.push(pending);
        side = sign;
        pending = null;
      }
    }
  }
  if (side === 0 || present.length === 0) return { transitions, turns: [] };

  const first = present[0].i;
  const last = present[present.length - 1].i;
  const bounds = [
    { index: first, timeMs: timesMs[first], transition: false },
    ...transitions.map((t) => ({ ...t, transition: true })),
    { index: last, timeMs: timesMs[last], transition: false },
  ];
  const turns: TurnSpan[] = [];
  for (let k = 0; k + 1 < bounds.length; k++) {
    const start = bounds[k];
    const end = bounds[k + 1];
    let apex = -1;
    let peak = -1;
    for (const s of present) {
      if (s.i < start.index || s.i > end.index) continue;
      if (Math.abs(s.v) > peak) {
        peak = Math.abs(s.v);
        apex = s.i;
      }
    }
    if (apex < 0 || peak < threshold) continue;
    turns.push({
      direction: (values[apex] as number) > 0 ? 1 : -1,
      start: start.index,
      apex,
      end: end.index,
      startMs: start.timeMs,
      endMs: end.timeMs,
      startsAtTransition: start.transition,
      endsAtTransition: end.transition,
    });
  }
  return { transitions, turns };
}
