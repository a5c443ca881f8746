import { useEffect, useLayoutEffect, useRef } from 'react';
import { tinykeys, type KeyBindingMap } from 'tinykeys';
import { availability, runCommand, type CommandRegistry } from './registry.ts';
import type { Command } from './types.ts';

export interface CommandKeysOptions<Ctx> {
  /** Where to listen (default `window`). `null` binds nothing, e.g. while a ref is not attached yet. */
  target?: Window | HTMLElement | null;
  /** false unbinds every key, e.g. while a modal dialog of another kind is open. Default true. */
  enabled?: boolean;
  /**
   * A command with params was triggered by its key: open the palette at its first param. Required
   * when any bound command has params (the hook cannot ask for values itself).
   */
  onNeedsArgs?: (command: Command<Ctx>) => void;
  /** A disabled command's key was pressed: nothing runs; this may show the reason (status line). */
  onUnavailable?: (command: Command<Ctx>, reason: string) => void;
  /** An error thrown (or rejected) by a command's `run`; without it the error propagates. */
  onError?: (error: unknown, command: Command<Ctx>) => void;
}

/** True while an input method is composing: the key belongs to the composition, not to us. */
function isComposing(event: KeyboardEvent): boolean {
  // Safari reports the keydown that ends a composition with keyCode 229 and isComposing false.
  return event.isComposing || event.keyCode === 229;
}

const NON_TEXT_INPUT_TYPES = new Set(['button', 'checkbox', 'color', 'file', 'hidden', 'image', 'radio', 'range', 'reset', 'submit']);

/** Whether keys pressed in `target` type text: a text input, a textarea, a select, or editable content. */
export function isTextEntryTarget(target: EventTarget | null): boolean {
  if (!(target instanceof Element)) return false;
  if (target instanceof HTMLInputElement) return !NON_TEXT_INPUT_TYPES.has(target.type);
  if (target instanceof HTMLTextAreaElement || target instanceof HTMLSelectElement) return true;
  // jsdom has no isContentEditable; the attribute is what makes an element editable anyway.
  return target.closest('[contenteditable]:not([contenteditable="false"]), [role="textbox"], [role="searchbox"]') !== null;
}

/**
 * Binds the shortcut of every command in `registry` with tinykeys on `target` (default `window`).
 *
 * A key is ignored when its event was already handled (`defaultPrevented`: the grid or a dialog
 * took it), while an input method is composing, and — for shortcuts without Control, Meta, Alt or
 * `$mod` — while the focus is in a text field (so `?` types a question mark in the quick-entry
 * line). Otherwise the key is ours: its default is prevented, and the command runs if it is
 * available with the current `ctx`; a disabled command's key does nothing but report the reason.
 *
 * `ctx` is read when the key is pressed, so passing a new object every render does not rebind.
 */
export function useCommandKeys<Ctx>(registry: CommandRegistry<Ctx>, ctx: Ctx, options: CommandKeysOptions<Ctx> = {}): void {
  const { target, enabled = true } = options;
  const latest = useRef({ ctx, options });
  useLayoutEffect(() => {
    latest.current = { ctx, options };
  });

  const needsArgsHandler = options.onNeedsArgs !== undefined;
  useEffect(() => {
    if (!enabled) return;
    const element = target === undefined ? window : target;
    if (element === null) return;
    const map: KeyBindingMap = {};
    for (const { command, keys, firesInTextFields } of registry.bindings) {
      if (command.params?.length && !needsArgsHandler) {
        throw new Error(`Command "${command.id}" has params and a shortcut: pass onNeedsArgs to useCommandKeys so its key can ask for them.`);
      }
      map[keys] = (event) => {
        if (event.defaultPrevented || isComposing(event)) return;
        if (!firesInTextFields && isTextEntryTarget(event.composedPath?.()[0] ?? event.target)) return;
        event.preventDefault();
        const { ctx: currentCtx, options: currentOptions } = latest.current;
        const verdict = availability(command, currentCtx);
        if (!verdict.enabled) {
          currentOptions.onUnavailable?.(command, verdict.reason);
          return;
        }
        if (command.params?.length) {
          currentOptions.onNeedsArgs?.(command);
          return;
        }
        void runCommand(command, currentCtx, {}, currentOptions.onError);
      };
    }
    return tinykeys(element, map);
  }, [registry, target, enabled, needsArgsHandler]);
}
