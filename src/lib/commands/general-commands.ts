import type { Command } from './types.ts';

/** The palette's own key. Control+K on Windows and Linux, ⌘K on Apple devices. */
export const OPEN_PALETTE_KEY = '$mod+k';
/**
 * The keys overlay's key: "?" as typed. Written with Shift because tinykeys matches a press only
 * when exactly its modifiers are held, and "?" is a shifted key on the keyboards we know of.
 */
export const SHOW_KEYS_KEY = 'Shift+?';

/**
 * The two commands every screen with a palette has: open the palette, show the keys. They take
 * no context; the app adds them to its registry beside the features' commands.
 */
export function createGeneralCommands<Ctx>(actions: { openPalette: () => void; showKeys: () => void }): Command<Ctx>[] {
  return [
    {
      id: 'general.open-palette',
      label: 'Open the command palette',
      group: 'General',
      keywords: ['commands', 'search', 'find'],
      shortcut: OPEN_PALETTE_KEY,
      run: () => actions.openPalette(),
    },
    {
      id: 'general.show-keys',
      label: 'Show the keys',
      group: 'General',
      keywords: ['help', 'shortcuts', 'keyboard', 'aliases'],
      shortcut: SHOW_KEYS_KEY,
      run: () => actions.showKeys(),
    },
  ];
}
