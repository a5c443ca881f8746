/**
 * The command registry: the one list the palette, the key bindings and the keys overlay are built
 * from. Creating it checks the list once, so a key bound twice is found when the app starts rather
 * than when a tester presses it.
 */

import type { Command, CommandArgs } from './types.ts';
import { canonicalShortcut, hasCommandModifier, shortcutSignature, ShortcutError, type KeyPlatform } from './shortcut.ts';

/** A command whose shortcut is bound: the canonical tinykeys form and whether it may fire in a text field. */
export interface CommandBinding<Ctx> {
  command: Command<Ctx>;
  /** The shortcut as handed to tinykeys (see `canonicalShortcut`). */
  keys: string;
  /** false for shortcuts that type text (no Control, Meta, Alt or `$mod`): ignored in text fields. */
  firesInTextFields: boolean;
}

/** A key some other handler owns (the grid's Enter, Tab, F2…): a command may not take it. */
export interface ReservedKey {
  shortcut: string;
  /** Who owns it, for the error message: e.g. "the grid: commit and move down". */
  owner: string;
}

export interface RegistryOptions {
  /** Keys handled outside the registry; a command bound to one of them is refused like a duplicate. */
  reserved?: readonly ReservedKey[];
}

export interface CommandRegistry<Ctx> {
  /** Every command, in the order given. */
  readonly commands: readonly Command<Ctx>[];
  /** Commands with a shortcut, in the order given. */
  readonly bindings: readonly CommandBinding<Ctx>[];
  /** Commands by `group`, groups in the order they first appear. */
  readonly groups: ReadonlyArray<{ group: string; commands: readonly Command<Ctx>[] }>;
  get(id: string): Command<Ctx> | undefined;
}

/** Whether a command can run now; when it cannot, the reason in words. */
export type Availability = { enabled: true } | { enabled: false; reason: string };

const PLATFORMS: ReadonlyArray<{ platform: KeyPlatform; name: string }> = [
  { platform: 'other', name: 'Windows and Linux' },
  { platform: 'apple', name: 'Apple devices' },
];

/** One owner's shortcut, with its signature on each platform (indexed like PLATFORMS). */
interface Claim {
  owner: string;
  shortcut: string;
  signatures: string[][];
}

function isPrefix(shorter: readonly string[], longer: readonly string[]): boolean {
  return shorter.length <= longer.length && shorter.every((press, i) => press === longer[i]);
}

/**
 * Refuses two claims that fire on the same keys on either platform: equal shortcuts, and a
 * shortcut that is the start of a longer sequence (`g` would run before `g c` could finish).
 * Both platforms are checked everywhere, so a clash that only Mac users would meet is found on a
 * Linux desk too.
 */
function findClash(claims: readonly Claim[]): string | null {
  for (let i = 0; i < claims.length; i++) {
    for (let j = i + 1; j < claims.length; j++) {
      const a = claims[i] as Claim;
      const b = claims[j] as Claim;
      const clashesOn = PLATFORMS.filter((_, p) => {
        const sa = a.signatures[p] ?? [];
        const sb = b.signatures[p] ?? [];
        return sa.length <= sb.length ? isPrefix(sa, sb) : isPrefix(sb, sa);
      });
      if (clashesOn.length === 0) continue;
      const [short, long] = (a.signatures[0] ?? []).length <= (b.signatures[0] ?? []).length ? [a, b] : [b, a];
      const how =
        (short.signatures[0] ?? []).length === (long.signatures[0] ?? []).length
          ? 'the same keys'
          : `"${short.shortcut}" runs before "${long.shortcut}" can be finished`;
      const where = clashesOn.length === PLATFORMS.length ? '' : ` on ${clashesOn.map((c) => c.name).join(' and ')}`;
      return `Shortcut "${long.shortcut}" of ${long.owner} clashes with "${short.shortcut}" of ${short.owner}${where} (${how}).`;
    }
  }
  return null;
}

/**
 * Checks and indexes the app's commands. Throws an Error naming the culprits when an id is used
 * twice, a shortcut is not valid tinykeys syntax, two commands (or a command and a reserved key)
 * would fire on the same keys, or a command asks for the same param twice.
 */
export function createRegistry<Ctx>(commands: readonly Command<Ctx>[], options: RegistryOptions = {}): CommandRegistry<Ctx> {
  const byId = new Map<string, Command<Ctx>>();
  for (const command of commands) {
    if (command.id.trim() === '') throw new Error(`A command needs an id (label "${command.label}").`);
    if (byId.has(command.id)) throw new Error(`Two commands have the id "${command.id}".`);
    byId.set(command.id, command);
    const names = new Set<string>();
    for (const param of command.params ?? []) {
      if (names.has(param.name)) throw new Error(`Command "${command.id}" asks for "${param.name}" twice.`);
      names.add(param.name);
    }
  }

  const bindings: CommandBinding<Ctx>[] = [];
  const claims: Claim[] = [];
  const claim = (shortcut: string, owner: string): string => {
    try {
      claims.push({ owner, shortcut, signatures: PLATFORMS.map(({ platform }) => shortcutSignature(shortcut, platform)) });
      return canonicalShortcut(shortcut);
    } catch (error) {
      if (error instanceof ShortcutError) throw new Error(`${owner}: ${error.message}`, { cause: error });
      throw error;
    }
  };
  for (const reserved of options.reserved ?? []) claim(reserved.shortcut, reserved.owner);
  for (const command of commands) {
    if (command.shortcut === undefined) continue;
    const keys = claim(command.shortcut, `command "${command.id}"`);
    bindings.push({ command, keys, firesInTextFields: hasCommandModifier(command.shortcut) });
  }
  const clash = findClash(claims);
  if (clash) throw new Error(clash);

  const groups: Array<{ group: string; commands: Command<Ctx>[] }> = [];
  for (const command of commands) {
    let group = groups.find((g) => g.group === command.group);
    if (!group) {
      group = { group: command.group, commands: [] };
      groups.push(group);
    }
    group.commands.push(command);
  }

  return { commands: [...commands], bindings, groups, get: (id) => byId.get(id) };
}

/** Whether `command` can run with `ctx`; a command without `when` always can. */
export function availability<Ctx>(command: Command<Ctx>, ctx: Ctx): Availability {
  const verdict = command.when ? command.when(ctx) : true;
  if (verdict === true) return { enabled: true };
  // A `when` that answers an empty string still disables the command; say so plainly.
  return { enabled: false, reason: verdict.trim() || 'Not available right now.' };
}

/**
 * Runs a command that is available now. A rejected promise or a throw goes to `onError` when
 * given; otherwise it propagates (a thrown error to the caller, a rejection to the returned promise).
 */
export function runCommand<Ctx>(
  command: Command<Ctx>,
  ctx: Ctx,
  args: CommandArgs,
  onError?: (error: unknown, command: Command<Ctx>) => void,
): void | Promise<void> {
  if (!onError) return command.run(ctx, args);
  try {
    const result = command.run(ctx, args);
    if (result instanceof Promise) return result.catch((error: unknown) => onError(error, command));
  } catch (error) {
    onError(error, command);
  }
}
