import { describe, expect, it, vi } from 'vitest';
import { availability, createRegistry, runCommand } from '../../../src/lib/commands/registry.ts';
import type { Command } from '../../../src/lib/commands/types.ts';

interface Ctx {
  role: 'tester' | 'reviewer';
}

function command(id: string, shortcut?: string, extra: Partial<Command<Ctx>> = {}): Command<Ctx> {
  return { id, label: id, group: 'Board', shortcut, run: () => {}, ...extra };
}

describe('createRegistry', () => {
  it('when two commands share an id, then it refuses with the id in the message', () => {
    expect(() => createRegistry([command('board.lock'), command('board.lock')])).toThrow(/Two commands have the id "board.lock"/);
  });

  it.each([
    ['the same spelling', '$mod+k', '$mod+k'],
    ['$mod and Control on Windows and Linux', '$mod+k', 'Control+k'],
    ['$mod and Meta on Apple devices', '$mod+k', 'Meta+k'],
    ['modifier case', 'Shift+?', 'shift+?'],
    ['key case', 'Alt+L', 'alt+l'],
    ['modifier order', '$mod+Shift+p', 'Shift+$mod+p'],
    ['Ctrl spelled out', 'Ctrl+Enter', 'Control+Enter'],
    ['a letter written as its code', '$mod+KeyK', '$mod+k'],
    ['a digit written as its code', 'Alt+Digit1', 'Alt+1'],
    ['a key that starts a longer sequence', 'g', 'g c'],
  ])('when two commands are bound with %s (%s, %s), then it refuses', (_, first, second) => {
    expect(() => createRegistry([command('a', first), command('b', second)])).toThrow(/clashes/);
  });

  it('names both commands and the platform where only one platform clashes', () => {
    expect(() => createRegistry([command('palette.open', '$mod+k'), command('grid.kill', 'Control+k')])).toThrow(
      'Shortcut "Control+k" of command "grid.kill" clashes with "$mod+k" of command "palette.open" on Windows and Linux (the same keys).',
    );
  });

  it.each([
    ['Shift held and not held', 'Shift+?', '?'],
    ['different keys', '$mod+k', '$mod+j'],
    ['Meta and Control', 'Meta+k', 'Control+k'],
    ['sequences that part', 'g c', 'g r'],
  ])('when shortcuts differ by %s (%s, %s), then it accepts both', (_, first, second) => {
    const registry = createRegistry([command('a', first), command('b', second)]);
    expect(registry.bindings.map((b) => b.command.id)).toEqual(['a', 'b']);
  });

  it('refuses a command bound to a key reserved by another handler', () => {
    expect(() =>
      createRegistry([command('board.fill', 'F2')], { reserved: [{ shortcut: 'F2', owner: 'the grid (edit in place)' }] }),
    ).toThrow(/the grid \(edit in place\)/);
  });

  it('refuses a modifier tinykeys does not know, naming the command', () => {
    expect(() => createRegistry([command('a', 'Cmd+k')])).toThrow(/command "a": .*"Cmd" is not a modifier/);
  });

  it('refuses a command that asks for the same param twice', () => {
    const twice = command('a', undefined, {
      params: [
        { name: 'reason', label: 'Reason', kind: 'text' },
        { name: 'reason', label: 'Reason again', kind: 'text' },
      ],
    });
    expect(() => createRegistry([twice])).toThrow(/asks for "reason" twice/);
  });

  it('binds canonical shortcuts, tells which type text, and groups in order of first appearance', () => {
    const registry = createRegistry([
      command('palette', 'shift+$mod+p', { group: 'General' }),
      command('keys', 'Shift+?', { group: 'Help' }),
      command('lock', undefined, { group: 'General' }),
    ]);
    expect(registry.bindings.map((b) => [b.keys, b.firesInTextFields])).toEqual([
      ['$mod+Shift+p', true],
      ['Shift+?', false],
    ]);
    expect(registry.groups.map((g) => [g.group, g.commands.map((c) => c.id)])).toEqual([
      ['General', ['palette', 'lock']],
      ['Help', ['keys']],
    ]);
    expect(registry.get('lock')?.id).toBe('lock');
    expect(registry.get('nope')).toBeUndefined();
  });
});

describe('availability', () => {
  const lock = command('board.lock', undefined, {
    when: (ctx) => (ctx.role === 'reviewer' ? true : 'Only a reviewer can lock a board.'),
  });

  it('is enabled without `when`, and follows `when` otherwise', () => {
    expect(availability(command('x'), { role: 'tester' })).toEqual({ enabled: true });
    expect(availability(lock, { role: 'reviewer' })).toEqual({ enabled: true });
    expect(availability(lock, { role: 'tester' })).toEqual({ enabled: false, reason: 'Only a reviewer can lock a board.' });
  });

  it('still disables a command whose `when` gives an empty reason, and says so', () => {
    const silent = command('x', undefined, { when: () => '' });
    expect(availability(silent, { role: 'tester' })).toEqual({ enabled: false, reason: 'Not available right now.' });
  });
});

describe('runCommand', () => {
  it('passes errors to onError, thrown or rejected', async () => {
    const onError = vi.fn();
    runCommand(command('t', undefined, { run: () => { throw new Error('sync'); } }), { role: 'tester' }, {}, onError);
    await runCommand(command('r', undefined, { run: () => Promise.reject(new Error('async')) }), { role: 'tester' }, {}, onError);
    expect(onError.mock.calls.map(([error, cmd]) => [(error as Error).message, (cmd as Command<Ctx>).id])).toEqual([
      ['sync', 't'],
      ['async', 'r'],
    ]);
  });
});
