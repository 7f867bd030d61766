import { describe, expect, it } from 'vitest';
import { commandForKey } from '~/components/classroom/keys';

describe('presentation keys', () => {
  it('moves on with the keys a keyboard and a clicker send', () => {
    for (const key of ['ArrowRight', 'ArrowDown', 'PageDown', ' ']) expect(commandForKey({ key })).toBe('next');
    for (const key of ['ArrowLeft', 'ArrowUp', 'PageUp', 'Backspace']) expect(commandForKey({ key })).toBe('prev');
    expect(commandForKey({ key: ' ', shiftKey: true })).toBe('prev');
  });

  it('opens the overview, the crop path, blanks, full screen and the presenter view', () => {
    expect(commandForKey({ key: 'o' })).toBe('overview');
    expect(commandForKey({ key: 'Escape' })).toBe('close');
    expect(commandForKey({ key: 'c' })).toBe('crop-path');
    expect(commandForKey({ key: '.' })).toBe('blank');
    expect(commandForKey({ key: 'F' })).toBe('fullscreen');
    expect(commandForKey({ key: 'p' })).toBe('presenter');
    expect(commandForKey({ key: 'Home' })).toBe('first');
    expect(commandForKey({ key: 'End' })).toBe('last');
  });

  it('leaves browser shortcuts and other keys alone', () => {
    expect(commandForKey({ key: 'ArrowRight', altKey: true })).toBeNull();
    expect(commandForKey({ key: 'f', ctrlKey: true })).toBeNull();
    expect(commandForKey({ key: 'r', metaKey: true })).toBeNull();
    expect(commandForKey({ key: 'x' })).toBeNull();
  });
});
