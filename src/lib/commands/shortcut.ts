/**
 * Shortcuts in tinykeys syntax: parsing, the canonical form we bind, the signature we compare to
 * find a key bound twice, and the words we show people.
 *
 * tinykeys' grammar: a shortcut is a sequence of presses separated by spaces (`g c`); a press is
 * `Mod+Mod+key`. The key is compared with `KeyboardEvent.key` case-insensitively, or with
 * `KeyboardEvent.code` exactly; `$mod` is Meta on Apple devices and Control elsewhere. A press
 * matches only when every modifier it names is held and no other one is (so `?` never fires while
 * Shift is down: write `Shift+?`).
 */

/** Which `$mod` applies: Meta (⌘) on Apple devices, Control elsewhere. */
export type KeyPlatform = 'apple' | 'other';

/** Modifier names as `KeyboardEvent.getModifierState` spells them, in the order we write them. */
const MODIFIER_ORDER = ['$mod', 'Control', 'Alt', 'AltGraph', 'Shift', 'Meta'] as const;
type ModifierName = (typeof MODIFIER_ORDER)[number];

/** Accepted spellings (lower case) of each modifier. tinykeys itself is case-sensitive here. */
const MODIFIER_SPELLINGS: Readonly<Record<string, ModifierName>> = {
  $mod: '$mod',
  control: 'Control',
  ctrl: 'Control',
  alt: 'Alt',
  altgraph: 'AltGraph',
  shift: 'Shift',
  meta: 'Meta',
};

/** One press of a shortcut: its modifiers (canonical names, `$mod` unresolved) and its key as written. */
export interface ShortcutPress {
  modifiers: readonly ModifierName[];
  key: string;
}

/** A shortcut that is not valid tinykeys syntax, or names a modifier tinykeys does not know. */
export class ShortcutError extends Error {
  override name = 'ShortcutError';
}

/** The platform of this browser, decided exactly as tinykeys decides what `$mod` means. */
export function detectPlatform(): KeyPlatform {
  const platform = typeof navigator === 'object' ? navigator.platform : '';
  return /Mac|iPod|iPhone|iPad/.test(platform) ? 'apple' : 'other';
}

/**
 * Splits a shortcut into presses. Throws a ShortcutError on an empty shortcut, an empty key or an
 * unknown modifier (tinykeys would silently never fire for `Cmd+k` or `shift+?`).
 */
export function parseShortcut(shortcut: string): ShortcutPress[] {
  const presses = shortcut.trim().split(/\s+/).filter(Boolean);
  if (presses.length === 0) throw new ShortcutError('A shortcut cannot be empty.');
  return presses.map((press) => {
    // The same split as tinykeys: a '+' after a word character separates; so `Shift++` is Shift and '+'.
    const parts = press.split(/\b\+/);
    const key = parts.pop() ?? '';
    if (key === '') throw new ShortcutError(`"${shortcut}" has no key after its modifiers.`);
    const modifiers = new Set<ModifierName>();
    for (const part of parts) {
      const name = MODIFIER_SPELLINGS[part.toLowerCase()];
      if (!name) {
        throw new ShortcutError(
          `"${shortcut}": "${part}" is not a modifier; use $mod, Control, Alt, Shift, Meta or AltGraph.`,
        );
      }
      modifiers.add(name);
    }
    const ordered = MODIFIER_ORDER.filter((m) => modifiers.has(m));
    return { modifiers: ordered, key };
  });
}

/**
 * The form we hand to tinykeys: modifiers spelled as `getModifierState` expects and in a fixed
 * order, `$mod` kept (tinykeys resolves it), the key as written (a `KeyboardEvent.code` such as
 * `KeyK` must keep its case to match).
 */
export function canonicalShortcut(shortcut: string): string {
  return parseShortcut(shortcut)
    .map((p) => [...p.modifiers, p.key].join('+'))
    .join(' ');
}

/** How tinykeys compares a key: case-insensitively with `key`; a letter or digit `code` means the same key. */
function comparableKey(key: string): string {
  const code = /^(?:Key([A-Z])|Digit([0-9]))$/.exec(key);
  if (code) return (code[1] ?? code[2] ?? '').toLowerCase();
  return key.toLowerCase();
}

/**
 * One string per press that is equal for two shortcuts exactly when they match the same keys on
 * `platform`: `$mod` resolved, modifiers deduplicated and ordered, key case folded.
 */
export function shortcutSignature(shortcut: string, platform: KeyPlatform): string[] {
  return parseShortcut(shortcut).map((p) => {
    const resolved = new Set<ModifierName>(p.modifiers.map((m) => (m === '$mod' ? (platform === 'apple' ? 'Meta' : 'Control') : m)));
    const modifiers = MODIFIER_ORDER.filter((m) => resolved.has(m));
    return [...modifiers, comparableKey(p.key)].join('+');
  });
}

/**
 * Whether some press holds a modifier that stops the key from typing text (Control, Meta, Alt or
 * `$mod`). Shift does not count (Shift+? types "?"), nor AltGraph (it types characters on many
 * keyboards). Shortcuts without one are ignored while the focus is in a text field.
 */
export function hasCommandModifier(shortcut: string): boolean {
  return parseShortcut(shortcut).some((p) =>
    p.modifiers.some((m) => m === '$mod' || m === 'Control' || m === 'Meta' || m === 'Alt'),
  );
}

const APPLE_MODIFIER_WORDS: Readonly<Record<ModifierName, string>> = {
  $mod: '⌘',
  Control: '⌃',
  Alt: '⌥',
  AltGraph: 'AltGr',
  Shift: '⇧',
  Meta: '⌘',
};

const OTHER_MODIFIER_WORDS: Readonly<Record<ModifierName, string>> = {
  $mod: 'Ctrl',
  Control: 'Ctrl',
  Alt: 'Alt',
  AltGraph: 'AltGr',
  Shift: 'Shift',
  Meta: 'Meta',
};

const KEY_WORDS: Readonly<Record<string, string>> = {
  arrowup: '↑',
  arrowdown: '↓',
  arrowleft: '←',
  arrowright: '→',
  escape: 'Esc',
  enter: 'Enter',
  backspace: 'Backspace',
  delete: 'Delete',
  tab: 'Tab',
  space: 'Space',
  pageup: 'Page Up',
  pagedown: 'Page Down',
  home: 'Home',
  end: 'End',
};

/**
 * The keys of a shortcut as people read them: one array per press, one word per key, e.g.
 * `$mod+Shift+k` → `[['Ctrl', 'Shift', 'K']]` (or `[['⌘', '⇧', 'K']]` on a Mac).
 */
export function formatShortcut(shortcut: string, platform: KeyPlatform = detectPlatform()): string[][] {
  const words = platform === 'apple' ? APPLE_MODIFIER_WORDS : OTHER_MODIFIER_WORDS;
  return parseShortcut(shortcut).map((p) => {
    const known = KEY_WORDS[p.key.toLowerCase()];
    const code = /^(?:Key([A-Z])|Digit([0-9]))$/.exec(p.key);
    const key = known ?? (code ? (code[1] ?? code[2] ?? p.key) : p.key.length === 1 ? p.key.toUpperCase() : p.key);
    return [...p.modifiers.map((m) => words[m]), key];
  });
}

/** A shortcut as one line of text for labels and screen readers, e.g. "Ctrl+K" or "G then C". */
export function describeShortcut(shortcut: string, platform: KeyPlatform = detectPlatform()): string {
  return formatShortcut(shortcut, platform)
    .map((press) => press.join(platform === 'apple' ? '' : '+'))
    .join(' then ');
}
