import { describe, expect, it } from 'vitest';
import { METRIC_KEYS, type MetricKey } from '@shared/metrics';
import { analyzeSeries } from '@shared/series';
import {
  AGE_GROUPS,
  bandsForAgeGroup,
  DEFAULT_BANDS,
  evaluateFrame,
  groupFlags,
  outsideMeaning,
  type ToleranceBand,
} from '@shared/tolerance';
import { clip } from '../series/synthetic-clip';

const nulls = (): Record<MetricKey, number | null> =>
  Object.fromEntries(METRIC_KEYS.map((k) => [k, null])) as Record<MetricKey, number | null>;

describe('default bands (docs/metrics.md rules of thumb, common practice)', () => {
  it('covers every age group with the same six bands, all labelled common practice', () => {
    expect(AGE_GROUPS).toEqual(['U8', 'U10', 'U12', 'U14', 'U16', 'U18', 'Masters']);
    for (const group of AGE_GROUPS) {
      const bands = bandsForAgeGroup(group);
      expect(bands.map((b) => b.metric).sort()).toEqual(
        [
          'ankleFlexionDifference',
          'kneeSeparationRatio',
          'shinTorsoMismatch',
          'shoulderTilt',
          'stanceWidthRatio',
          'transitionRise',
        ].sort(),
      );
    }
    expect(DEFAULT_BANDS.every((b) => b.source === 'common practice')).toBe(true);
  });

  it('uses the docs/metrics.md numbers', () => {
    const u16 = bandsForAgeGroup('U16');
    const get = (metric: string) => u16.find((b) => b.metric === metric)!;
    expect(get('stanceWidthRatio')).toMatchObject({ min: 0.8, max: 1.3 });
    expect(get('kneeSeparationRatio')).toMatchObject({ min: 0.8, max: 1.3 });
    expect(get('shoulderTilt')).toMatchObject({ min: -8, max: 8, target: 0 });
    expect(get('ankleFlexionDifference')).toMatchObject({ min: -5, max: 5 });
    expect(get('transitionRise')).toMatchObject({ min: null, max: 0.05 });
    // ±10° for younger groups, ±7° for older ones.
    expect(get('shinTorsoMismatch')).toMatchObject({ min: -7, max: 7 });
    expect(bandsForAgeGroup('U10').find((b) => b.metric === 'shinTorsoMismatch')).toMatchObject({
      min: -10,
      max: 10,
    });
  });
});

describe('evaluateFrame', () => {
  const bands = bandsForAgeGroup('U14');

  it('flags values outside a band with their distance from it', () => {
    const m = { ...nulls(), stanceWidthRatio: 1.5, shoulderTilt: -10, shinTorsoMismatch: 3 };
    const flags = evaluateFrame(m, bands, 12);
    expect(flags).toHaveLength(2);
    const stance = flags.find((f) => f.metric === 'stanceWidthRatio')!;
    expect(stance).toMatchObject({
      side: 'above',
      frameIndex: 12,
      turnIndex: null,
      value: 1.5,
      min: 0.8,
      max: 1.3,
      ageGroup: 'U14',
    });
    expect(stance.distance).toBeCloseTo(0.2, 12);
    const tilt = flags.find((f) => f.metric === 'shoulderTilt')!;
    expect(tilt).toMatchObject({ side: 'below', distance: 2 });
  });

  it('counts the band edges as inside and skips null metrics', () => {
    expect(evaluateFrame({ ...nulls(), stanceWidthRatio: 1.3, shoulderTilt: -8 }, bands)).toEqual([]);
    expect(evaluateFrame(nulls(), bands)).toEqual([]);
  });

  it('handles one-sided bands', () => {
    const band: ToleranceBand = {
      metric: 'legExtension',
      ageGroup: 'club',
      min: 0.7,
      max: null,
      target: null,
      source: 'club',
    };
    expect(evaluateFrame({ ...nulls(), legExtension: 0.99 }, [band])).toEqual([]);
    expect(evaluateFrame({ ...nulls(), legExtension: 0.6 }, [band])[0].distance).toBeCloseTo(0.1, 12);
  });
});

describe('groupFlags: one flag per habit and turn', () => {
  it('flags a transition rise above 0.05 once per turn, and a stance held outside its band once per turn', () => {
    // Standing 4.0 hip widths tall in the turns and 4.32 at each transition: a rise of 0.08, 0.03 over
    // the band.
    const frames = clip(88, 25, (t) => ({
      inclinationDeg: 20 * Math.sin((2 * Math.PI * (t + 250)) / 2000),
      legExtension: 0.85,
      standHeight: [750, 1750, 2750].some((c) => Math.abs(t - c) <= 80) ? 4.32 : 4.0,
      shoulderTiltDeg: 0,
    }));
    const result = analyzeSeries(frames, { view: 'front', fps: 25, filter: { kind: 'none' } });
    const flags = groupFlags(result.frames, result.turns, bandsForAgeGroup('U12'), { maxGapFrames: 6 });
    const rises = flags.filter((f) => f.metric === 'transitionRise');
    expect(rises.map((f) => f.turnIndex)).toEqual([0, 1, 2]);
    for (const f of rises) {
      expect(f.side).toBe('above');
      expect(f.distance).toBeCloseTo(0.03, 9);
      expect(f.frameCount).toBe(1);
    }
    expect(rises[1].worstFrame).toBe(result.turns[1].endFrame);
    // Stance is 1.5 hip widths in every frame: one flag per turn (0.2 over), and one per stretch
    // of frames outside the turns, together covering all 88 frames once.
    const stance = flags.filter((f) => f.metric === 'stanceWidthRatio');
    const inTurns = stance.filter((f) => f.turnIndex !== null);
    expect(inTurns.map((f) => f.turnIndex)).toEqual(result.turns.map((t) => t.index));
    expect(stance.reduce((n, f) => n + f.frameCount, 0)).toBe(88);
    expect(stance.every((f) => Math.abs(f.distance - 0.2) < 1e-9)).toBe(true);
    expect(new Set(stance.map((f) => f.groupKey)).size).toBe(stance.length);
  });

  it('keeps a turn’s worst value and its frame, and splits stretches outside turns at gaps', () => {
    const band = {
      metric: 'shoulderTilt',
      ageGroup: 'U14',
      min: -8,
      max: 8,
      target: 0,
      source: 'club',
    } as const;
    const tilt = (frameIndex: number, v: number) => ({ frameIndex, metrics: { shoulderTilt: v } });
    const turn = {
      index: 0,
      startFrame: 10,
      apexFrame: 15,
      endFrame: 20,
      transitionRise: null,
      insideShoulderDrop: null,
      apexValues: {},
    };
    const frames = [
      tilt(2, 9),
      tilt(3, 10),
      tilt(9, 11),
      tilt(12, 9),
      tilt(14, -12),
      tilt(16, 0),
      tilt(19, 10),
    ];
    const flags = groupFlags(frames, [turn], [band], { maxGapFrames: 3 });
    expect(
      flags.map((f) => [f.groupKey, f.firstFrame, f.lastFrame, f.frameCount, f.worstFrame, f.value]),
    ).toEqual([
      ['r2', 2, 3, 2, 3, 10],
      ['r9', 9, 9, 1, 9, 11],
      ['t0', 12, 19, 3, 14, -12],
    ]);
    expect(flags[2]).toMatchObject({ side: 'below', distance: 4 });
    // The shared transition frame counts to the turn it starts; the last turn keeps its end.
    const next = { ...turn, index: 1, startFrame: 20, apexFrame: 25, endFrame: 30 };
    const atBoundary = groupFlags([tilt(20, 9), tilt(30, 9)], [turn, next], [band], { maxGapFrames: 3 });
    expect(atBoundary.map((f) => f.groupKey)).toEqual(['t1']);
    expect(atBoundary[0].frameCount).toBe(2);
  });

  it('judges per-turn apex values unsigned and skips bands without limits', () => {
    const turn = (index: number, inclination: number) => ({
      index,
      startFrame: index * 10,
      apexFrame: index * 10 + 5,
      endFrame: index * 10 + 10,
      transitionRise: null,
      insideShoulderDrop: null,
      apexValues: { inclination },
    });
    const lean = {
      metric: 'apexInclination',
      ageGroup: 'U14',
      min: 15,
      max: null,
      target: null,
      source: 'club',
    } as const;
    const open = { ...lean, metric: 'stanceWidthRatio', min: null } as const;
    const flags = groupFlags([], [turn(0, 20), turn(1, -10), turn(2, -18)], [lean, open], {
      maxGapFrames: 3,
    });
    expect(flags.map((f) => [f.groupKey, f.worstFrame, f.value])).toEqual([['t1', 15, 10]]);
  });
});

describe('outsideMeaning (the sentence the tolerances page shows)', () => {
  it('says what outside means for a band in plain words', () => {
    expect(outsideMeaning('kneeSeparationRatio', 0.8, 1.3)).toBe(
      'Knees closer together than 0.80 of hip width, or knees wider apart than 1.30 of hip width',
    );
    expect(outsideMeaning('shoulderTilt', -8, 8)).toBe(
      'Right shoulder higher by more than 8.0°, or left shoulder higher by more than 8.0°',
    );
    expect(outsideMeaning('transitionRise', null, 0.05)).toBe('Standing tall between turns (rise over 0.05)');
    expect(outsideMeaning('stanceWidthRatio', null, null)).toBe('No band set: nothing is flagged');
  });
});
