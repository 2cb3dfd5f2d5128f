import { describe, expect, it } from 'vitest';
import { formatBytes, formatDay, formatDuration } from '@/lib/format';

describe('format', () => {
  it('writes sizes in decimal units', () => {
    // Worked by hand: 23 456 B / 1000 = 23.456 kB -> one decimal -> 23.5 kB.
    expect(formatBytes(23_456)).toBe('23.5 kB');
    expect(formatBytes(999)).toBe('999 B');
    expect(formatBytes(0)).toBe('0 B');
    // 2 GiB = 2 147 483 648 B = 2.147 GB -> 2.1 GB.
    expect(formatBytes(2 * 1024 ** 3)).toBe('2.1 GB');
  });

  it('writes clip lengths as m:ss.t', () => {
    expect(formatDuration(3000)).toBe('0:03.0');
    // 75 250 ms = 1 min 15.25 s -> rounded to tenths 15.3 (752.5 tenths rounds to 753).
    expect(formatDuration(75_250)).toBe('1:15.3');
    expect(formatDuration(59_960)).toBe('1:00.0');
  });

  it('shows a session day without shifting it by time zone', () => {
    // 14 Dec 2026 is a Monday (checked against a 2026 calendar).
    expect(formatDay('2026-12-14')).toBe('Mon, 14 Dec 2026');
    expect(formatDay('not a date')).toBe('not a date');
  });
});
