import { describe, expect, it } from 'vitest';
import {
  clampFrame,
  formatClipTime,
  frameAtMs,
  frameFromMediaTime,
  frameStartMs,
  seekTimeForFrame,
} from '@/features/clip-workspace/lib/frame-time';

// The workspace convention: frame i is shown from i/fps to (i+1)/fps, seeks aim at (i + 0.5)/fps and
// the displayed frame is floor(mediaTime * fps + 1e-3). Expected values are worked by hand.
describe('frame time', () => {
  it('maps presentation times to frames at 30 fps', () => {
    expect(frameFromMediaTime(0, 30)).toBe(0);
    // 10/30 s = 0.3333… s is the first instant of frame 10.
    expect(frameFromMediaTime(10 / 30, 30)).toBe(10);
    // A timestamp stored a hair low (0.33333 s · 30 = 9.9999) still reads as frame 10.
    expect(frameFromMediaTime(0.33333, 30)).toBe(10);
    // 0.3 s · 30 = 9 exactly; 0.32 s · 30 = 9.6, still frame 9.
    expect(frameFromMediaTime(0.32, 30)).toBe(9);
  });

  it('handles NTSC 29.97 fps', () => {
    // Frame 100 starts at 100 / 29.97 = 3.33667 s; 3.3366 s · 29.97 = 99.998 → frame 99 before the epsilon,
    // 99.998 + 0.001 = 99.999, still 99: the epsilon only absorbs rounding, not a real 0.2 ms gap.
    expect(frameFromMediaTime(100 / 29.97, 29.97)).toBe(100);
    expect(frameFromMediaTime(3.3366, 29.97)).toBe(99);
  });

  it('seeks to the middle of a frame, which reads back as the same frame', () => {
    expect(seekTimeForFrame(10, 30)).toBeCloseTo(10.5 / 30, 12);
    for (const fps of [24, 25, 29.97, 30, 50, 59.94, 60]) {
      for (const i of [0, 1, 7, 99, 1234]) {
        expect(frameFromMediaTime(seekTimeForFrame(i, fps), fps)).toBe(i);
      }
    }
  });

  it('converts between frames and milliseconds', () => {
    expect(frameStartMs(15, 30)).toBe(500);
    expect(frameAtMs(500, 30, 100)).toBe(15);
    // Past the end clamps to the last frame (index 99 of 100).
    expect(frameAtMs(60_000, 30, 100)).toBe(99);
    expect(clampFrame(-3, 100)).toBe(0);
    expect(clampFrame(4.6, 100)).toBe(5);
  });

  it('formats clip times as m:ss.mmm', () => {
    expect(formatClipTime(0)).toBe('0:00.000');
    expect(formatClipTime(4_100)).toBe('0:04.100');
    expect(formatClipTime(83_456)).toBe('1:23.456');
  });
});
