import { describe, expect, it } from 'vitest';
import { changeTowardTarget, clipPhaseValue, describeTarget, distanceOutside, median } from '@shared/plan';
import { focusPointInputSchema, seasonInputSchema } from '@shared/schemas/plan.schema';
import type { TurnWindow } from '@shared/tolerance';

const SEASON = '7b0c5c8e-2f0a-4c55-9a53-8a0d3f1c2b11';

// Three turns of a front clip: 0–10–20, 20–30–40, 40–50–60 (start, apex, end frames).
const turns: TurnWindow[] = [0, 1, 2].map((i) => ({
  index: i,
  startFrame: i * 20,
  apexFrame: i * 20 + 10,
  endFrame: i * 20 + 20,
  transitionRise: i === 2 ? null : 0.02 * (i + 1),
  insideShoulderDrop: [4, -2, 7][i],
  apexValues: { inclination: [20, -25, 30][i], angulation: [5, -8, 6][i] },
}));
// Knee separation = frame / 100 + 0.5, so every value is known: apex frames 10, 30, 50 give 0.6, 0.8, 1.0.
const frames = Array.from({ length: 61 }, (_, f) => ({
  frameIndex: f,
  metrics: { kneeSeparationRatio: f / 100 + 0.5, shinAngleLeft: 20 + f },
}));

describe('a clip’s value of a focus point (docs/metrics.md "Season plan")', () => {
  it('at the apex: the median over the turns of the apex frames, with the spread', () => {
    const v = clipPhaseValue({ view: 'front', frames, turns }, 'kneeSeparationRatio', 'apex');
    expect(v).toMatchObject({ count: 3, over: 'turns', reason: null });
    expect(v.median).toBeCloseTo(0.8, 12);
    expect(v.min).toBeCloseTo(0.6, 12);
    expect(v.max).toBeCloseTo(1.0, 12);
  });

  it('at the transition: only where one turn hands over to the next (frames 20 and 40)', () => {
    const v = clipPhaseValue({ view: 'front', frames, turns }, 'kneeSeparationRatio', 'transition');
    expect(v.count).toBe(2);
    expect(v.median).toBeCloseTo(0.8, 12); // (0.7 + 0.9) / 2
  });

  it('over the whole turn: the median of each turn’s frames, then the median over turns', () => {
    const v = clipPhaseValue({ view: 'front', frames, turns }, 'kneeSeparationRatio', 'turn');
    // Turn frames 0..19 → median frame 9.5 → 0.595; 20..39 → 0.795; 40..59 → 0.995.
    expect(v.median).toBeCloseTo(0.795, 12);
    expect(v.min).toBeCloseTo(0.595, 12);
  });

  it('per-turn values: apex lean unsigned, the rise only where measured', () => {
    const lean = clipPhaseValue({ view: 'front', frames, turns }, 'apexInclination', 'apex');
    expect(lean.median).toBe(25);
    const rise = clipPhaseValue({ view: 'front', frames, turns }, 'transitionRise', 'transition');
    expect(rise.count).toBe(2);
    expect(rise.median).toBeCloseTo(0.03, 12);
  });

  it('says why instead of plotting a value from the wrong view', () => {
    const v = clipPhaseValue({ view: 'side', frames, turns: [] }, 'kneeSeparationRatio', 'apex');
    expect(v.median).toBeNull();
    expect(v.reason).toBe('Filmed from the side; knee separation is measured in a front view');
  });

  it('a side view has no turns: the whole clip stands in for "over the turn", apex has no value', () => {
    const whole = clipPhaseValue({ view: 'side', frames, turns: [] }, 'shinAngleLeft', 'turn');
    expect(whole).toMatchObject({ median: 50, count: 61, over: 'frames' });
    const apex = clipPhaseValue({ view: 'side', frames, turns: [] }, 'shinAngleLeft', 'apex');
    expect(apex.reason).toMatch(/no apex/);
  });

  it('median of an even count is the mean of the middle two', () => {
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([5])).toBe(5);
  });
});

describe('change toward a target', () => {
  const range = { min: 0.8, max: 1.3, direction: null };
  it.each([
    [0.6, 0.75, 'toward'],
    [0.75, 0.6, 'away'],
    [0.9, 1.2, 'inside'],
    [1.5, 1.5, 'unchanged'],
    [0.7, 1.4, 'unchanged'], // 0.10 under, then 0.10 over: no nearer (up to rounding)
    [0.5, 1.0, 'toward'],
  ] as const)('%s → %s is %s', (before, after, expected) => {
    expect(changeTowardTarget(before, after, range)).toBe(expected);
  });

  it('by direction', () => {
    expect(changeTowardTarget(10, 14, { min: null, max: null, direction: 'increase' })).toBe('toward');
    expect(changeTowardTarget(10, 14, { min: null, max: null, direction: 'decrease' })).toBe('away');
    expect(changeTowardTarget(10, 10, { min: null, max: null, direction: 'decrease' })).toBe('unchanged');
    expect(changeTowardTarget(10, 14, null)).toBe('no target');
  });

  it('distance outside an open-ended range and the words for a target', () => {
    expect(distanceOutside(9, { min: null, max: 5 })).toBe(4);
    expect(distanceOutside(-9, { min: null, max: 5 })).toBe(0);
    expect(describeTarget({ min: 0.8, max: 1.3, direction: null }, { unit: 'ratio' })).toBe('0.80 to 1.30');
    expect(describeTarget({ min: null, max: null, direction: 'decrease' }, { unit: 'deg' })).toBe('lower');
  });
});

describe('the focus point and season schemas refuse what a coach could mistype', () => {
  const base = { seasonId: SEASON, title: 'Knees apart' };
  const issues = (input: unknown) =>
    (focusPointInputSchema.safeParse(input).error?.issues ?? []).map(
      (i) => `${i.path.join('.')}: ${i.message}`,
    );

  it('accepts a point in words, and a measured point with a range or a direction', () => {
    expect(issues(base)).toEqual([]);
    expect(
      issues({ ...base, metric: 'kneeSeparationRatio', phase: 'apex', targetMin: 0.8, targetMax: 1.3 }),
    ).toEqual([]);
    expect(issues({ ...base, metric: 'torsoAngle', phase: 'turn', direction: 'decrease' })).toEqual([]);
  });

  it.each([
    [{ ...base, title: ' ' }, 'title: Give the focus point a short title'],
    [{ ...base, metric: 'elbowFlair' }, 'metric: Unknown metric'],
    [{ ...base, targetMin: 1 }, 'metric: A target needs a metric'],
    [
      { ...base, metric: 'kneeSeparationRatio', phase: 'apex', targetMin: 1.3, targetMax: 0.8 },
      'targetMin: The lowest value is above the highest',
    ],
    [
      { ...base, metric: 'kneeSeparationRatio', phase: 'apex', targetMin: 9 },
      'targetMin: Knee separation can only be between -5 and 5',
    ],
    [{ ...base, metric: 'kneeSeparationRatio', phase: 'apex', targetMin: Number.NaN }, 'targetMin: '],
    [
      { ...base, metric: 'kneeSeparationRatio', phase: 'apex' },
      'targetMin: Give a target range, or a direction',
    ],
    [
      { ...base, metric: 'kneeSeparationRatio', phase: 'apex', targetMin: 1, direction: 'increase' },
      'direction: Give a range or a direction, not both',
    ],
    [
      { ...base, metric: 'transitionRise', phase: 'apex', targetMax: 0.05 },
      'phase: Transition rise is measured at the transition',
    ],
    [
      { ...base, metric: 'shinAngleLeft', phase: 'apex', direction: 'increase' },
      'phase: Side views have no turns',
    ],
    [{ ...base, metric: 'kneeSeparationRatio', targetMin: 1 }, 'phase: Choose where in the turn'],
    [{ ...base, status: 'done' }, 'status: '],
    [{ ...base, seasonId: 'nope' }, 'seasonId: Choose a season'],
    [{ ...base, extra: 1 }, ': Unrecognized key'],
  ])('%j', (input, expected) => {
    expect(issues(input).some((m) => m.startsWith(expected))).toBe(true);
  });

  it('a season must end after it starts, on real days', () => {
    expect(
      seasonInputSchema.safeParse({ name: '2026-27', startsOn: '2026-07-01', endsOn: '2027-06-30' }).success,
    ).toBe(true);
    expect(
      seasonInputSchema.safeParse({ name: '2026-27', startsOn: '2027-07-01', endsOn: '2026-06-30' }).error
        ?.issues[0].message,
    ).toBe('The season ends before it starts');
    expect(
      seasonInputSchema.safeParse({ name: '2026-27', startsOn: '2026-02-30', endsOn: '2026-06-30' }).error
        ?.issues[0].message,
    ).toBe('That day does not exist');
  });
});
