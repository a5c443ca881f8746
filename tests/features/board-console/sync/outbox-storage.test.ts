import { beforeEach, describe, expect, it } from 'vitest';
import { outboxStorageKey, readOutbox, writeOutbox, type OutboxEntry } from '../../../../src/features/board-console/sync/outbox-storage.ts';

function cellEntry(id: string, text: string): OutboxEntry {
  return {
    edit: { kind: 'cell', id, boardId: 5, circuitId: 1, column: 'zs', text, reason: null, baseVersion: 0, how: 'typed', at: '2026-12-02T10:00:00.000Z' },
  };
}

beforeEach(() => localStorage.clear());

describe('outbox storage', () => {
  it('when entries are written, then they are read back in order', () => {
    const entries = [cellEntry('a', '0.4'), cellEntry('b', '0.5')];
    writeOutbox(localStorage, 5, entries, new Set(['a', 'b']));
    expect(readOutbox(localStorage, 5)).toEqual(entries);
  });

  it('when another tab stored edits of the same board, then writing ours keeps theirs', () => {
    writeOutbox(localStorage, 5, [cellEntry('theirs', '0.9')], new Set(['theirs']));
    writeOutbox(localStorage, 5, [cellEntry('mine', '0.4')], new Set(['mine']));
    expect(readOutbox(localStorage, 5).map((e) => e.edit.id)).toEqual(['theirs', 'mine']);
  });

  it('when every edit has landed, then the key is removed', () => {
    writeOutbox(localStorage, 5, [cellEntry('a', '0.4')], new Set(['a']));
    writeOutbox(localStorage, 5, [], new Set(['a']));
    expect(localStorage.getItem(outboxStorageKey(5))).toBeNull();
  });

  it('when the stored text is damaged, then nothing is read and nothing throws', () => {
    localStorage.setItem(outboxStorageKey(5), '{not json');
    expect(readOutbox(localStorage, 5)).toEqual([]);
    localStorage.setItem(outboxStorageKey(5), JSON.stringify({ version: 1, entries: [{ edit: { kind: 'cell', id: 'x' } }, cellEntry('ok', '1')] }));
    expect(readOutbox(localStorage, 5).map((e) => e.edit.id)).toEqual(['ok']);
  });

  it('when there is no storage, then the outbox lives in memory only', () => {
    expect(() => writeOutbox(null, 5, [cellEntry('a', '0.4')], new Set(['a']))).not.toThrow();
    expect(readOutbox(null, 5)).toEqual([]);
  });

  it('when two people typed on the same board in this browser, then each reads only their own edits', () => {
    writeOutbox(localStorage, 5, [cellEntry('alice', '0.4')], new Set(['alice']), 11);
    writeOutbox(localStorage, 5, [cellEntry('bob', '0.7')], new Set(['bob']), 12);
    expect(readOutbox(localStorage, 5, 11).map((e) => e.edit.id)).toEqual(['alice']);
    expect(readOutbox(localStorage, 5, 12).map((e) => e.edit.id)).toEqual(['bob']);
    expect(outboxStorageKey(5, 11)).not.toBe(outboxStorageKey(5, 12));
  });
});
