import { describe, expect, it } from 'vitest';
import { stripSlots, tileForTime } from '@/lib/thumbnail-strip';

// A sprite of 25 tiles, 5 columns, each 160×90, one tile per second (worked by hand).
const strip = { url: '/s.jpg', count: 25, tileWidth: 160, tileHeight: 90, columns: 5, intervalMs: 1000 };

describe('thumbnail strip', () => {
  it('finds the tile for a time in the sprite grid', () => {
    expect(tileForTime(0, strip)).toEqual({ index: 0, x: 0, y: 0 });
    // 7.5 s → tile 7 → column 2, row 1 → (320, 90).
    expect(tileForTime(7_500, strip)).toEqual({ index: 7, x: 320, y: 90 });
    // Past the last tile stays on tile 24 → column 4, row 4.
    expect(tileForTime(99_000, strip)).toEqual({ index: 24, x: 640, y: 360 });
  });

  it('fills the bar with tiles scaled to its height', () => {
    // Bar 600×45: tiles scale to 80×45, so ceil(600/80) = 8 slots of 75 px; slot 0 shows 1/16 of 20 s.
    const slots = stripSlots(600, 45, 20_000, strip);
    expect(slots).toHaveLength(8);
    expect(slots[0]).toEqual({ left: 0, width: 75, timeMs: 1_250 });
    expect(slots[7].left).toBe(525);
    expect(slots[7].timeMs).toBe(18_750);
    expect(stripSlots(0, 45, 20_000, strip)).toEqual([]);
  });
});
