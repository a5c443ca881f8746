import { describe, expect, it } from 'vitest';
import {
  canonicalShortcut,
  describeShortcut,
  formatShortcut,
  hasCommandModifier,
  parseShortcut,
  shortcutSignature,
} from '../../../src/lib/commands/shortcut.ts';

describe('shortcuts', () => {
  it.each([
    ['$mod+k', '$mod+k'],
    ['shift+$MOD+p', '$mod+Shift+p'],
    ['ctrl+alt+Delete', 'Control+Alt+Delete'],
    ['Shift++', 'Shift++'],
    ['g  c', 'g c'],
    ['$mod+KeyK', '$mod+KeyK'],
  ])('%s binds as %s', (written, canonical) => {
    expect(canonicalShortcut(written)).toBe(canonical);
  });

  it('resolves $mod per platform in the signature', () => {
    expect(shortcutSignature('$mod+Shift+K', 'other')).toEqual(['Control+Shift+k']);
    expect(shortcutSignature('$mod+Shift+K', 'apple')).toEqual(['Shift+Meta+k']);
    expect(shortcutSignature('$mod+Control+k', 'other')).toEqual(['Control+k']);
  });

  it.each([['', /empty/], ['$mod+', /no key/], ['Hyper+k', /"Hyper" is not a modifier/]])('refuses %j', (written, message) => {
    expect(() => parseShortcut(written)).toThrow(message);
  });

  it('tells shortcuts that type text from those that do not', () => {
    expect(hasCommandModifier('Shift+?')).toBe(false);
    expect(hasCommandModifier('g c')).toBe(false);
    expect(hasCommandModifier('AltGraph+q')).toBe(false);
    expect(hasCommandModifier('Alt+l')).toBe(true);
    expect(hasCommandModifier('$mod+k')).toBe(true);
  });

  it('shows keys in words for each platform', () => {
    expect(formatShortcut('$mod+Shift+k', 'other')).toEqual([['Ctrl', 'Shift', 'K']]);
    expect(formatShortcut('$mod+Shift+k', 'apple')).toEqual([['⌘', '⇧', 'K']]);
    expect(formatShortcut('g ArrowDown', 'other')).toEqual([['G'], ['↓']]);
    expect(describeShortcut('$mod+k', 'other')).toBe('Ctrl+K');
    expect(describeShortcut('g c', 'other')).toBe('G then C');
  });
});
