/**
 * The one command registry of the app (contract shared by the palette, the key bindings and the
 * keys overlay). Each feature exports its commands; the registry refuses an id or a key bound twice.
 */

/** A value a command asks for before it runs (the palette prompts for each in turn). */
export type CommandParam =
  | { name: string; label: string; kind: 'text'; required?: boolean; placeholder?: string; initial?: string }
  | { name: string; label: string; kind: 'number'; required?: boolean; placeholder?: string; initial?: string }
  | {
      name: string;
      label: string;
      kind: 'choice';
      required?: boolean;
      /** Options computed when the palette asks (e.g. the rings of this board). */
      options: () => ReadonlyArray<{ value: string; label: string }>;
    };

export type CommandArgs = Record<string, string>;

export interface Command<Ctx> {
  /** Stable id, e.g. `console.link-spur`. */
  id: string;
  /** What the palette shows: plain words. */
  label: string;
  /** Heading the palette and the overlay group it under. */
  group: string;
  /** Extra words the palette matches on. */
  keywords?: readonly string[];
  /** tinykeys syntax, e.g. `$mod+k`, `Shift+?`, `Alt+l`. Omitted: palette only. */
  shortcut?: string;
  /**
   * The command changes or removes data (cells, circuits, the board's state). Chosen in the palette
   * by a loose (fuzzy) match rather than by its words, it asks before it runs.
   */
  changesData?: boolean;
  /** Values asked for before `run`. */
  params?: readonly CommandParam[];
  /** true when the command can run now; otherwise the reason it cannot (shown, command disabled). */
  when?: (ctx: Ctx) => true | string;
  run: (ctx: Ctx, args: CommandArgs) => void | Promise<void>;
}
