import { describe, expect, it } from 'vitest';
import {
  checkMetricBands,
  describeReason,
  formatBandRange,
  formatMetricValue,
} from '@/features/clip-workspace/lib/metric-format';
import type { ToleranceBand } from '@shared/tolerance';

// Bands as docs/metrics.md seeds them (common practice): stance 0.8–1.3, shoulder tilt ±8°.
const bands: ToleranceBand[] = [
  {
    metric: 'stanceWidthRatio',
    ageGroup: 'U12',
    min: 0.8,
    max: 1.3,
    target: null,
    source: 'common practice',
  },
  { metric: 'shoulderTilt', ageGroup: 'U12', min: -8, max: 8, target: 0, source: 'common practice' },
];

describe('readout formatting', () => {
  it('shows each unit its own way', () => {
    expect(formatMetricValue(23.456, 'deg')).toBe('23.5°');
    expect(formatMetricValue(-4.04, 'deg')).toBe('-4.0°');
    expect(formatMetricValue(0.915, 'ratio')).toBe('0.92');
    expect(formatMetricValue(-0.126, 'shin lengths')).toBe('-0.13 shin lengths');
  });

  it('describes band limits', () => {
    expect(formatBandRange({ min: 0.8, max: 1.3 }, 'ratio')).toBe('0.80 to 1.30');
    expect(formatBandRange({ min: null, max: 0.05 }, 'ratio')).toBe('at most 0.05');
  });

  it('marks values outside the band, bounds included as inside', () => {
    expect(checkMetricBands('stanceWidthRatio', 0.7, bands).state).toBe('outside');
    expect(checkMetricBands('stanceWidthRatio', 1.3, bands).state).toBe('inside');
    const tilt = checkMetricBands('shoulderTilt', 9.5, bands);
    expect(tilt.state).toBe('outside');
    if (tilt.state === 'outside') expect(tilt.flag.distance).toBeCloseTo(1.5, 12);
    expect(checkMetricBands('kneeFlexionLeft', 40, bands).state).toBe('none');
  });

  it('turns null reasons into words', () => {
    expect(describeReason('missing: left_knee')).toBe('left knee not found');
    expect(describeReason('low confidence: right_ankle')).toBe('right ankle too uncertain');
    expect(
      describeReason(
        'not trusted: seen three-quarters on (body 0.46 torso lengths wide, a side view needs at most 0.25)',
      ),
    ).toBe('not trusted here: the camera sees the skier three-quarters on, this needs a side view');
    expect(
      describeReason(
        'not trusted: seen from the side (body 0.2 torso lengths wide, a front view needs 0.38)',
      ),
    ).toBe('not trusted here: the camera sees the skier from the side, this needs a front view');
    expect(describeReason('wrong view')).toBe('not measured in this view');
    expect(describeReason('facing unknown')).toBe('facing unknown');
    expect(describeReason(undefined)).toBe('not computed');
  });
});
