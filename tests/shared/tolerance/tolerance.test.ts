import { describe, expect, it } from 'vitest';
import { METRIC_KEYS, type MetricKey } from '@shared/metrics';
import { analyzeSeries } from '@shared/series';
import {
  AGE_GROUPS,
  bandsForAgeGroup,
  DEFAULT_BANDS,
  evaluateFrame,
  evaluateSeries,
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

describe('evaluateSeries', () => {
  it('flags a transition rise above 0.05 on the turn, and per-frame values on their frames', () => {
    // Legs 0.85 in the turns and 0.93 at each transition: a rise of 0.08, 0.03 over the band.
    const frames = clip(88, 25, (t) => ({
      inclinationDeg: 20 * Math.sin((2 * Math.PI * (t + 250)) / 2000),
      legExtension: [750, 1750, 2750].some((c) => Math.abs(t - c) <= 80) ? 0.93 : 0.85,
      shoulderTiltDeg: 0,
    }));
    const result = analyzeSeries(frames, { view: 'front', fps: 25, filter: { kind: 'none' } });
    const flags = evaluateSeries(result, bandsForAgeGroup('U12'));
    const rises = flags.filter((f) => f.metric === 'transitionRise');
    expect(rises.map((f) => f.turnIndex)).toEqual([0, 1, 2]);
    for (const f of rises) {
      expect(f.side).toBe('above');
      expect(f.distance).toBeCloseTo(0.03, 9);
    }
    expect(rises[1].frameIndex).toBe(result.turns[1].endFrame);
    // Stance is 1.5 hip widths in every frame: one frame flag each, 0.2 over.
    const stance = flags.filter((f) => f.metric === 'stanceWidthRatio');
    expect(stance).toHaveLength(88);
    expect(stance[0].distance).toBeCloseTo(0.2, 9);
  });
});
