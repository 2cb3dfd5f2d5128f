import { describe, expect, it } from 'vitest';
import { commandForKey, KEY_BINDINGS } from '@/features/clip-workspace/lib/keyboard-map';

const press = (
  key: string,
  mods: Partial<{ shiftKey: boolean; ctrlKey: boolean; metaKey: boolean; altKey: boolean }> = {},
) => commandForKey({ key, shiftKey: false, ctrlKey: false, metaKey: false, altKey: false, ...mods });

describe('workspace keys', () => {
  it('maps the documented keys', () => {
    expect(press(' ')).toBe('toggle-play');
    expect(press('ArrowRight')).toBe('step-forward');
    expect(press('ArrowLeft')).toBe('step-back');
    expect(press('ArrowRight', { shiftKey: true })).toBe('jump-forward');
    expect(press('?', { shiftKey: true })).toBe('help');
    expect(press('N', { shiftKey: true })).toBe('snow-line');
  });

  it('leaves browser shortcuts alone', () => {
    expect(press('ArrowLeft', { altKey: true })).toBeNull();
    expect(press('+', { ctrlKey: true })).toBeNull();
    expect(press('x')).toBeNull();
  });

  it('has one meaning per key combination', () => {
    const combos = KEY_BINDINGS.flatMap((b) => b.keys.map((k) => `${b.shift ? 'shift+' : ''}${k}`));
    expect(new Set(combos).size).toBe(combos.length);
  });
});
