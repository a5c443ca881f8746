import { Command as Cmdk } from 'cmdk';
import { useId, useRef, useState, type KeyboardEvent as ReactKeyboardEvent } from 'react';
import { createPortal } from 'react-dom';
import { matchCommandWords } from '../lib/commands/match-command-words.ts';
import { matchCommand, type MatchKind } from '../lib/commands/rank-commands.ts';
import { availability, runCommand, type CommandRegistry } from '../lib/commands/registry.ts';
import { describeShortcut, detectPlatform, type KeyPlatform } from '../lib/commands/shortcut.ts';
import type { Command, CommandArgs, CommandParam } from '../lib/commands/types.ts';
import { useReturnFocus } from '../lib/commands/use-return-focus.ts';
import { ShortcutKeys } from './keys-overlay.tsx';

export interface CommandPaletteProps<Ctx> {
  open: boolean;
  onOpenChange: (open: boolean) => void;
  registry: CommandRegistry<Ctx>;
  /** Read when the palette renders (availability) and when a command runs. */
  ctx: Ctx;
  /**
   * Open straight at this command's first param instead of the list: what the app does when the
   * shortcut of a command with params is pressed (`useCommandKeys`' `onNeedsArgs`). Esc on that
   * first param closes the palette.
   */
  commandId?: string;
  /** An error thrown or rejected by a command's `run`; without it the error propagates. */
  onError?: (error: unknown, command: Command<Ctx>) => void;
  platform?: KeyPlatform;
}

/**
 * The command palette: a modal dialog with a cmdk list of every command of the registry, grouped.
 *
 * - Typing filters (on the label, the group and the keywords); arrows move; Enter runs.
 * - A command that cannot run now stays in the list, greyed, with its reason; it can still be
 *   reached with the arrows (so a screen reader hears why), and Enter on it only says the reason.
 * - A command with params asks for each in turn in the same dialog: a text field, or a filtered
 *   list for a choice. Enter confirms a value (a required one cannot be empty); Esc goes back one
 *   step, and from the list closes the palette.
 * - On close the focus goes back to where it was, before the command runs, so the command starts
 *   from the tester's place (and may move the focus itself).
 */
export function CommandPalette<Ctx>(props: CommandPaletteProps<Ctx>) {
  if (!props.open || typeof document !== 'object') return null;
  return createPortal(<PaletteDialog key={props.commandId ?? ''} {...props} />, document.body);
}

type Step<Ctx> =
  | { kind: 'list' }
  /** A command that changes data, chosen by a loose match: asked before it goes on. */
  | { kind: 'confirm'; command: Command<Ctx>; typed: string }
  | {
      kind: 'param';
      command: Command<Ctx>;
      index: number;
      args: CommandArgs;
      /** Opened at this command directly (by its key): Esc on the first param closes. */
      direct: boolean;
    };

function initialStep<Ctx>(registry: CommandRegistry<Ctx>, commandId: string | undefined): Step<Ctx> {
  const command = commandId === undefined ? undefined : registry.get(commandId);
  if (command?.params?.length) return { kind: 'param', command, index: 0, args: {}, direct: true };
  return { kind: 'list' };
}

function PaletteDialog<Ctx>({ onOpenChange, registry, ctx, commandId, onError, platform = detectPlatform() }: CommandPaletteProps<Ctx>) {
  const dialogRef = useRef<HTMLDivElement>(null);
  const returnFocus = useReturnFocus(dialogRef);
  const [step, setStep] = useState<Step<Ctx>>(() => initialStep(registry, commandId));
  const [announcement, setAnnouncement] = useState('');
  const [lastChosen, setLastChosen] = useState<string | undefined>(commandId);

  const close = () => {
    returnFocus();
    onOpenChange(false);
  };

  const finish = (command: Command<Ctx>, args: CommandArgs) => {
    // The board may have changed while values were asked for (locked by someone else, say).
    const verdict = availability(command, ctx);
    if (!verdict.enabled) {
      setStep({ kind: 'list' });
      setAnnouncement(`${command.label}: ${verdict.reason}`);
      return;
    }
    close();
    void runCommand(command, ctx, args, onError);
  };

  const [search, setSearch] = useState('');

  const proceed = (command: Command<Ctx>) => {
    setAnnouncement('');
    if (command.params?.length) setStep({ kind: 'param', command, index: 0, args: {}, direct: false });
    else finish(command, {});
  };

  const choose = (command: Command<Ctx>, match: MatchKind) => {
    setLastChosen(command.id);
    const verdict = availability(command, ctx);
    if (!verdict.enabled) {
      setAnnouncement(`${command.label}: ${verdict.reason}`);
      // The filter is cleared, so the next try starts from the whole list.
      setSearch('');
      return;
    }
    if (command.changesData && match === 'fuzzy') {
      setAnnouncement('');
      setStep({ kind: 'confirm', command, typed: search });
      return;
    }
    proceed(command);
  };

  const confirmParam = (value: string) => {
    if (step.kind !== 'param') return;
    const { command, index, args } = step;
    const param = command.params?.[index];
    if (!param) return;
    const next = { ...args };
    // An optional param left empty is left out, so `run` can tell "not given" from a value.
    if (value === '') delete next[param.name];
    else next[param.name] = value;
    if (index + 1 < (command.params?.length ?? 0)) setStep({ ...step, index: index + 1, args: next });
    else finish(command, next);
  };

  const back = () => {
    setAnnouncement('');
    if (step.kind === 'list' || (step.kind === 'param' && step.index === 0 && step.direct)) close();
    else if (step.kind === 'confirm' || step.index === 0) setStep({ kind: 'list' });
    else setStep({ ...step, index: step.index - 1 });
  };

  const onKeyDown = (event: ReactKeyboardEvent<HTMLDivElement>) => {
    // Keys pressed in a modal dialog are not the page's: no shortcut behind it may fire.
    event.stopPropagation();
    if (event.nativeEvent.isComposing || event.defaultPrevented) return;
    if (event.key === 'Escape') {
      event.preventDefault();
      back();
    } else if (event.key === 'Tab') {
      // Each step has one field, which already has the focus: Tab must not leave the dialog.
      event.preventDefault();
    }
  };

  const param = step.kind === 'param' ? step.command.params?.[step.index] : undefined;

  return (
    <div
      className="fixed inset-0 z-50 flex items-start justify-center bg-ink/30 p-4 pt-[12vh]"
      onMouseDown={(event) => {
        if (event.target === event.currentTarget) close();
      }}
    >
      <div
        ref={dialogRef}
        role="dialog"
        aria-modal="true"
        aria-label="Command palette"
        onKeyDown={onKeyDown}
        className="flex max-h-[70vh] w-full max-w-xl flex-col overflow-hidden rounded-md border border-line-strong bg-surface shadow-xl"
      >
        {step.kind === 'param' && param ? (
          <ParamStep
            key={`${step.command.id}:${step.index}`}
            command={step.command}
            param={param}
            index={step.index}
            initial={step.args[param.name] ?? ('initial' in param ? param.initial : undefined) ?? ''}
            onConfirm={confirmParam}
          />
        ) : step.kind === 'confirm' ? (
          <ConfirmStep label={step.command.label} typed={step.typed} onConfirm={() => proceed(step.command)} />
        ) : (
          <CommandList
            registry={registry}
            ctx={ctx}
            platform={platform}
            defaultValue={lastChosen}
            search={search}
            onSearchChange={setSearch}
            onChoose={choose}
          />
        )}
        <p role="status" aria-live="polite" className="border-t border-line px-3 py-1.5 text-sm text-danger empty:border-0 empty:p-0">
          {announcement}
        </p>
      </div>
    </div>
  );
}

/** A command that changes data, reached by a loose match: Enter goes on, Esc goes back to the list. */
function ConfirmStep({ label, typed, onConfirm }: { label: string; typed: string; onConfirm: () => void }) {
  return (
    <div className="flex flex-col gap-2 px-3 py-3">
      <p id="palette-confirm-question" className="font-medium">
        {label}?
      </p>
      <p className="text-sm text-muted">
        “{typed}” only loosely matches this command, and it changes the board. Run it?
      </p>
      <div className="flex gap-2">
        <button
          type="button"
          autoFocus
          aria-describedby="palette-confirm-question"
          onClick={onConfirm}
          className="rounded border border-accent bg-accent px-3 py-1 text-white"
        >
          Yes, go on (Enter)
        </button>
        <span className="self-center text-xs text-muted">Esc to go back</span>
      </div>
    </div>
  );
}

interface ListedCommand<Ctx> {
  command: Command<Ctx>;
  group: string;
  match: MatchKind;
  score: number;
  enabled: boolean;
  order: number;
}

function CommandList<Ctx>({
  registry,
  ctx,
  platform,
  defaultValue,
  search,
  onSearchChange,
  onChoose,
}: {
  registry: CommandRegistry<Ctx>;
  ctx: Ctx;
  platform: KeyPlatform;
  defaultValue: string | undefined;
  search: string;
  onSearchChange: (search: string) => void;
  onChoose: (command: Command<Ctx>, match: MatchKind) => void;
}) {
  // Our own ranking (cmdk's filter off): commands that can run now above those that cannot, then
  // the label itself, then a prefix, then words inside, and loose matches last.
  const searching = search.trim() !== '';
  let order = 0;
  let listed: ListedCommand<Ctx>[] = [];
  for (const { group, commands } of registry.groups) {
    for (const command of commands) {
      order += 1;
      const match = matchCommand(command.label, [group, ...(command.keywords ?? [])], search);
      if (!match) continue;
      listed.push({ command, group, match: match.kind, score: match.score, enabled: availability(command, ctx).enabled, order });
    }
  }
  // Loose matches only when nothing matches by its words: "lock" must not offer some other command
  // that happens to hold l, o, c, k in order above the one named (even one that cannot run now).
  if (listed.some((l) => l.match !== 'fuzzy')) listed = listed.filter((l) => l.match !== 'fuzzy');
  if (searching) listed.sort((a, b) => Number(b.enabled) - Number(a.enabled) || b.score - a.score || a.order - b.order);
  const sections: Array<{ heading: string; items: ListedCommand<Ctx>[] }> = searching
    ? [{ heading: 'Best matches first', items: listed }]
    : registry.groups.map(({ group }) => ({ heading: group, items: listed.filter((l) => l.group === group) }));
  return (
    <Cmdk label="Commands" shouldFilter={false} vimBindings={false} loop defaultValue={searching ? listed[0]?.command.id : defaultValue} className="flex min-h-0 flex-col">
      <Cmdk.Input
        autoFocus
        aria-label="Command"
        placeholder="Type a command…"
        value={search}
        onValueChange={onSearchChange}
        className="w-full border-b border-line bg-surface px-3 py-2.5 text-base outline-none placeholder:text-muted"
      />
      <Cmdk.List label="Commands" className="min-h-0 overflow-auto p-1">
        <Cmdk.Empty className="px-3 py-4 text-muted">No command matches.</Cmdk.Empty>
        {sections.map(({ heading, items }) => (
          <Cmdk.Group
            key={heading}
            heading={heading}
            className="[&_[cmdk-group-heading]]:px-2 [&_[cmdk-group-heading]]:pt-2 [&_[cmdk-group-heading]]:pb-1 [&_[cmdk-group-heading]]:text-xs [&_[cmdk-group-heading]]:font-semibold [&_[cmdk-group-heading]]:text-muted"
          >
            {items.map(({ command, group, match }) => {
              const verdict = availability(command, ctx);
              const asks = (command.params?.length ?? 0) > 0;
              const name = [
                `${command.label}${asks ? '…' : ''}`,
                verdict.enabled ? '' : `not available: ${verdict.reason}`,
                command.shortcut ? describeShortcut(command.shortcut, platform) : '',
              ]
                .filter(Boolean)
                .join(', ');
              return (
                <Cmdk.Item
                  key={command.id}
                  value={command.id}
                  keywords={[command.label, group, ...(command.keywords ?? [])]}
                  onSelect={() => onChoose(command, match)}
                  data-match={match}
                  aria-label={name}
                  data-unavailable={verdict.enabled ? undefined : 'true'}
                  className="flex cursor-default items-center gap-3 rounded px-2 py-1.5 data-[selected=true]:bg-accent-soft data-[unavailable=true]:text-muted"
                >
                  <span className="min-w-0 flex-1">
                    <span className={verdict.enabled ? '' : 'line-through decoration-line-strong'}>
                      {command.label}
                      {asks ? '…' : ''}
                    </span>
                    {!verdict.enabled && <span className="block text-xs">Not available: {verdict.reason}</span>}
                  </span>
                  {command.shortcut && <ShortcutKeys shortcut={command.shortcut} platform={platform} />}
                </Cmdk.Item>
              );
            })}
          </Cmdk.Group>
        ))}
      </Cmdk.List>
    </Cmdk>
  );
}

interface ParamStepProps<Ctx> {
  command: Command<Ctx>;
  param: CommandParam;
  index: number;
  initial: string;
  onConfirm: (value: string) => void;
}

function ParamStep<Ctx>({ command, param, index, initial, onConfirm }: ParamStepProps<Ctx>) {
  const count = command.params?.length ?? 1;
  return (
    <div className="flex min-h-0 flex-col">
      <p className="border-b border-line px-3 pt-2 pb-1 text-xs text-muted">
        {command.label}
        {count > 1 && <span> · step {index + 1} of {count}</span>}
      </p>
      {param.kind === 'choice' ? (
        <ChoiceStep param={param} initial={initial} onConfirm={onConfirm} />
      ) : (
        <TextStep param={param} initial={initial} onConfirm={onConfirm} />
      )}
    </div>
  );
}

const NUMBER = /^[-+]?(?:\d+(?:\.\d*)?|\.\d+)$/;

function TextStep({
  param,
  initial,
  onConfirm,
}: {
  param: Extract<CommandParam, { kind: 'text' | 'number' }>;
  initial: string;
  onConfirm: (value: string) => void;
}) {
  const [value, setValue] = useState(initial);
  const [error, setError] = useState('');
  const inputId = useId();
  const errorId = useId();
  const hintId = useId();

  const confirm = () => {
    const trimmed = value.trim();
    if (trimmed === '' && param.required) {
      setError(`${param.label} is required.`);
      return;
    }
    if (trimmed !== '' && param.kind === 'number' && !NUMBER.test(trimmed)) {
      setError(`${param.label} must be a number, e.g. 2.5.`);
      return;
    }
    onConfirm(trimmed);
  };

  const onKeyDown = (event: ReactKeyboardEvent<HTMLInputElement>) => {
    if (event.key === 'Enter' && !event.nativeEvent.isComposing) {
      event.preventDefault();
      confirm();
    }
  };

  return (
    <div className="flex flex-col gap-1 px-3 py-2">
      <label htmlFor={inputId} className="font-medium">
        {param.label}
        {!param.required && <span className="font-normal text-muted"> (optional)</span>}
      </label>
      <input
        id={inputId}
        autoFocus
        type="text"
        inputMode={param.kind === 'number' ? 'decimal' : undefined}
        autoComplete="off"
        spellCheck={false}
        value={value}
        placeholder={param.placeholder}
        aria-required={param.required || undefined}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${errorId} ${hintId}` : hintId}
        onChange={(event) => {
          setValue(event.target.value);
          setError('');
        }}
        onKeyDown={onKeyDown}
        className="w-full rounded border border-line-strong px-2 py-1.5 text-base outline-none focus:border-accent aria-invalid:border-danger"
      />
      {error && (
        <p id={errorId} role="alert" className="text-sm text-danger">
          {error}
        </p>
      )}
      <p id={hintId} className="text-xs text-muted">
        Enter to confirm · Esc to go back
      </p>
    </div>
  );
}

function ChoiceStep({
  param,
  initial,
  onConfirm,
}: {
  param: Extract<CommandParam, { kind: 'choice' }>;
  initial: string;
  onConfirm: (value: string) => void;
}) {
  // Computed when the step opens (the options may depend on the board as it is now).
  const [options] = useState(() => param.options());
  const optionValue = (value: string) => `option:${value}`;
  return (
    <Cmdk
      label={param.label}
      filter={matchCommandWords}
      vimBindings={false}
      loop
      defaultValue={initial === '' ? undefined : optionValue(initial)}
      className="flex min-h-0 flex-col"
    >
      <p aria-hidden="true" className="px-3 pt-2 font-medium">
        {param.label}
        {!param.required && <span className="font-normal text-muted"> (optional)</span>}
      </p>
      <Cmdk.Input
        autoFocus
        aria-label={param.label}
        placeholder="Type to filter…"
        className="w-full border-b border-line bg-surface px-3 py-2 text-base outline-none placeholder:text-muted"
      />
      <Cmdk.List label={param.label} className="min-h-0 overflow-auto p-1">
        <Cmdk.Empty className="px-3 py-4 text-muted">{options.length === 0 ? 'Nothing to choose from.' : 'No option matches.'}</Cmdk.Empty>
        {options.map((option) => (
          <Cmdk.Item
            key={option.value}
            value={optionValue(option.value)}
            keywords={[option.label, option.value]}
            onSelect={() => onConfirm(option.value)}
            className="rounded px-2 py-1.5 data-[selected=true]:bg-accent-soft"
          >
            {option.label}
          </Cmdk.Item>
        ))}
        {!param.required && (
          <Cmdk.Item
            value="none"
            keywords={['leave empty', 'none', 'skip']}
            onSelect={() => onConfirm('')}
            className="rounded px-2 py-1.5 text-muted data-[selected=true]:bg-accent-soft"
          >
            Leave empty
          </Cmdk.Item>
        )}
      </Cmdk.List>
      <p className="border-t border-line px-3 py-1 text-xs text-muted">Enter to choose · Esc to go back</p>
    </Cmdk>
  );
}
