import { useId, useLayoutEffect, useRef, type KeyboardEvent as ReactKeyboardEvent, type ReactNode } from 'react';
import { createPortal } from 'react-dom';
import { availability, type CommandRegistry } from '../lib/commands/registry.ts';
import { describeShortcut, detectPlatform, formatShortcut, type KeyPlatform } from '../lib/commands/shortcut.ts';
import { useReturnFocus } from '../lib/commands/use-return-focus.ts';

/** One line of an extra overlay section: keys to press, or words to type, and what they do. */
export interface KeysSectionRow {
  /** What it does or means, in plain words. */
  label: string;
  /** Alternative shortcuts in tinykeys syntax (`Shift+Enter`, `F2`), shown as keys. */
  keys?: readonly string[];
  /** Words typed rather than keys pressed (quick-entry column words), shown as written. */
  words?: readonly string[];
}

/** A section the overlay shows beside the registry's commands: the grid's own keys, the quick-entry words. */
export interface KeysSection {
  title: string;
  /** A sentence shown under the title. */
  note?: string;
  rows: readonly KeysSectionRow[];
}

/** The keys of one shortcut as `<kbd>` elements; screen readers hear it as one phrase ("Ctrl+K"). */
export function ShortcutKeys({ shortcut, platform = detectPlatform() }: { shortcut: string; platform?: KeyPlatform }) {
  return (
    <span className="inline-flex items-center gap-1 whitespace-nowrap">
      <span className="sr-only">{describeShortcut(shortcut, platform)}</span>
      <span aria-hidden="true" className="inline-flex items-center gap-1">
        {formatShortcut(shortcut, platform).map((press, i) => (
          <span key={i} className="inline-flex items-center gap-0.5">
            {i > 0 && <span className="px-0.5 text-xs text-muted">then</span>}
            {press.map((key, j) => (
              <kbd key={j} className="min-w-5 rounded border border-line-strong bg-paper px-1 text-center font-mono text-xs text-ink">
                {key}
              </kbd>
            ))}
          </span>
        ))}
      </span>
    </span>
  );
}

export interface KeysOverlayProps<Ctx> {
  open: boolean;
  onOpenChange: (open: boolean) => void;
  /** Every command of it that has a shortcut is listed, under its group. */
  registry: CommandRegistry<Ctx>;
  /** When given, a command that cannot run now says why beside its key. */
  ctx?: Ctx;
  /** Shown after the commands, in order: the grid's own keys, the quick-entry words… */
  sections?: readonly KeysSection[];
  platform?: KeyPlatform;
}

/**
 * The keys overlay: a modal dialog listing every command that has a shortcut, grouped as in the
 * palette, then the extra sections. Esc (or the Close button) closes it and the focus goes back to
 * where it was.
 */
export function KeysOverlay<Ctx>(props: KeysOverlayProps<Ctx>) {
  if (!props.open || typeof document !== 'object') return null;
  return createPortal(<KeysDialog {...props} />, document.body);
}

function KeysDialog<Ctx>({ onOpenChange, registry, ctx, sections = [], platform = detectPlatform() }: KeysOverlayProps<Ctx>) {
  const dialogRef = useRef<HTMLDivElement>(null);
  const closeRef = useRef<HTMLButtonElement>(null);
  const returnFocus = useReturnFocus(dialogRef);
  const titleId = useId();

  // The dialog itself takes the focus: a screen reader announces its title, and arrows scroll it.
  useLayoutEffect(() => {
    dialogRef.current?.focus();
  }, []);

  const close = () => {
    returnFocus();
    onOpenChange(false);
  };

  const onKeyDown = (event: ReactKeyboardEvent<HTMLDivElement>) => {
    // Keys pressed in a modal dialog are not the page's: nothing behind it may react.
    event.stopPropagation();
    if (event.key === 'Escape' && !event.nativeEvent.isComposing) {
      event.preventDefault();
      close();
    } else if (event.key === 'Tab') {
      // The Close button is the only control: keep the focus in the dialog.
      event.preventDefault();
      closeRef.current?.focus();
    }
  };

  const commandGroups = registry.groups
    .map(({ group, commands }) => ({ group, commands: commands.filter((c) => c.shortcut !== undefined) }))
    .filter((g) => g.commands.length > 0);

  return (
    <div
      className="fixed inset-0 z-50 flex items-start justify-center bg-ink/30 p-4 pt-[8vh]"
      onMouseDown={(event) => {
        if (event.target === event.currentTarget) close();
      }}
    >
      <div
        ref={dialogRef}
        role="dialog"
        aria-modal="true"
        aria-labelledby={titleId}
        tabIndex={-1}
        onKeyDown={onKeyDown}
        className="flex max-h-[84vh] w-full max-w-3xl flex-col rounded-md border border-line-strong bg-surface shadow-xl focus:outline-none"
      >
        <div className="flex items-center justify-between border-b border-line px-4 py-2">
          <h2 id={titleId} className="font-semibold">
            Keys
          </h2>
          <button
            ref={closeRef}
            type="button"
            onClick={close}
            className="rounded border border-line-strong px-2 py-0.5 text-sm hover:bg-accent-soft"
          >
            Close <span className="text-muted">(Esc)</span>
          </button>
        </div>
        <div className="grid min-h-0 gap-x-8 gap-y-4 overflow-auto px-4 py-3 sm:grid-cols-2">
          {commandGroups.map(({ group, commands }) => (
            <OverlaySection key={`commands:${group}`} title={group}>
              {commands.map((command) => {
                const verdict = ctx === undefined ? null : availability(command, ctx);
                return (
                  <tr key={command.id} className="align-top">
                    <td className="py-0.5 pr-3">
                      <ShortcutKeys shortcut={command.shortcut ?? ''} platform={platform} />
                    </td>
                    <td className={`py-0.5 ${verdict && !verdict.enabled ? 'text-muted' : ''}`}>
                      {command.label}
                      {verdict && !verdict.enabled && <span className="block text-xs">Not now: {verdict.reason}</span>}
                    </td>
                  </tr>
                );
              })}
            </OverlaySection>
          ))}
          {sections.map((section) => (
            <OverlaySection key={`extra:${section.title}`} title={section.title} note={section.note}>
              {section.rows.map((row, i) => (
                <tr key={i} className="align-top">
                  <td className="py-0.5 pr-3">
                    <span className="inline-flex flex-wrap items-center gap-1">
                      {row.keys?.map((shortcut, j) => (
                        <span key={`k${j}`} className="inline-flex items-center gap-1">
                          {j > 0 && <span className="text-xs text-muted">or</span>}
                          <ShortcutKeys shortcut={shortcut} platform={platform} />
                        </span>
                      ))}
                      {row.words?.map((word, j) => (
                        <span key={`w${j}`} className="inline-flex items-center gap-1">
                          {(j > 0 || (row.keys?.length ?? 0) > 0) && <span className="text-xs text-muted">or</span>}
                          <code className="rounded bg-paper px-1 font-mono text-xs">{word}</code>
                        </span>
                      ))}
                    </span>
                  </td>
                  <td className="py-0.5">{row.label}</td>
                </tr>
              ))}
            </OverlaySection>
          ))}
        </div>
      </div>
    </div>
  );
}

function OverlaySection({ title, note, children }: { title: string; note?: string; children: ReactNode }) {
  const headingId = useId();
  return (
    <section aria-labelledby={headingId} className="min-w-0">
      <h3 id={headingId} className="mb-1 text-xs font-semibold tracking-wide text-muted uppercase">
        {title}
      </h3>
      {note && <p className="mb-1 text-xs text-muted">{note}</p>}
      <table className="w-full text-sm">
        <thead className="sr-only">
          <tr>
            <th scope="col">Keys</th>
            <th scope="col">What they do</th>
          </tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
    </section>
  );
}
