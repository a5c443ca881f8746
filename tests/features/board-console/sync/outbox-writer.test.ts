import fc from 'fast-check';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { OutboxWriter, outboxStorageKey, readOutbox, type OutboxEntry } from '../../../../src/features/board-console/sync/outbox-storage.ts';

function cellEntry(id: string, text: string, circuitId = 1): OutboxEntry {
  return {
    edit: { kind: 'cell', id, boardId: 5, circuitId, column: 'zs', text, reason: null, baseVersion: 0, how: 'typed', at: '2026-12-02T10:00:00.000Z' },
  };
}

const key = outboxStorageKey(5);

/** The outbox as a page stored it before OutboxWriter: read and parse all, keep others' entries, store everything. */
function referenceWrite(storage: Storage, entries: readonly OutboxEntry[], ownIds: ReadonlySet<string>): void {
  let raws: unknown[] = [];
  try {
    const parsed = JSON.parse(storage.getItem(key) ?? 'null') as { version?: unknown; entries?: unknown } | null;
    if (parsed && parsed.version === 1 && Array.isArray(parsed.entries)) raws = parsed.entries;
  } catch {
    raws = [];
  }
  const others = raws.filter((raw) => {
    const id = (raw as { edit?: { id?: unknown } } | null)?.edit?.id;
    return typeof id !== 'string' || !ownIds.has(id);
  });
  const all = [...others, ...entries];
  if (all.length === 0) storage.removeItem(key);
  else storage.setItem(key, JSON.stringify({ version: 1, entries: all }));
}

beforeEach(() => localStorage.clear());
afterEach(() => vi.restoreAllMocks());

describe('OutboxWriter', () => {
  it('when entries are written, then the stored text is the outbox as JSON and reads back in order', () => {
    const writer = new OutboxWriter(localStorage, 5);
    const entries = [cellEntry('a', '0.4'), { ...cellEntry('b', '0.5'), conflict: { editId: 'b', circuitId: 1, column: 'zs' as const, mine: '0.5', theirs: '0.6', theirsBy: 'Tess' } }];
    writer.write(entries, new Set(['a', 'b']));
    expect(localStorage.getItem(key)).toBe(JSON.stringify({ version: 1, entries }));
    expect(readOutbox(localStorage, 5)).toEqual(entries);
  });

  it('when the stored text is as this page left it, then it is not parsed again', () => {
    const writer = new OutboxWriter(localStorage, 5);
    const first = [cellEntry('a', '0.4')];
    writer.write(first, new Set(['a']));
    const parse = vi.spyOn(JSON, 'parse');
    writer.write([...first, cellEntry('b', '0.5')], new Set(['a', 'b']));
    expect(parse).not.toHaveBeenCalled();
    expect(readOutbox(localStorage, 5).map((e) => e.edit.id)).toEqual(['a', 'b']);
  });

  it('when another tab stored edits meanwhile, then the next write reads them and keeps them before ours', () => {
    const mine = new OutboxWriter(localStorage, 5);
    const theirs = new OutboxWriter(localStorage, 5);
    mine.write([cellEntry('m1', '0.4')], new Set(['m1']));
    theirs.write([cellEntry('t1', '0.9')], new Set(['t1']));
    mine.write([cellEntry('m1', '0.4'), cellEntry('m2', '0.5')], new Set(['m1', 'm2']));
    expect(readOutbox(localStorage, 5).map((e) => e.edit.id)).toEqual(['t1', 'm1', 'm2']);
    // Ours landed: theirs stay.
    mine.write([], new Set(['m1', 'm2']));
    expect(readOutbox(localStorage, 5).map((e) => e.edit.id)).toEqual(['t1']);
  });

  it('when storage refuses a write, then nothing throws and the next write stores everything', () => {
    const writer = new OutboxWriter(localStorage, 5);
    writer.write([cellEntry('a', '0.4')], new Set(['a']));
    const setItem = vi.spyOn(Storage.prototype, 'setItem').mockImplementationOnce(() => {
      throw new DOMException('full', 'QuotaExceededError');
    });
    expect(() => writer.write([cellEntry('a', '0.4'), cellEntry('b', '0.5')], new Set(['a', 'b']))).not.toThrow();
    setItem.mockRestore();
    writer.write([cellEntry('a', '0.4'), cellEntry('b', '0.5'), cellEntry('c', '0.6')], new Set(['a', 'b', 'c']));
    expect(readOutbox(localStorage, 5).map((e) => e.edit.id)).toEqual(['a', 'b', 'c']);
  });

  it('when every edit has landed, then the key is removed', () => {
    const writer = new OutboxWriter(localStorage, 5);
    writer.write([cellEntry('a', '0.4')], new Set(['a']));
    writer.write([], new Set(['a']));
    expect(localStorage.getItem(key)).toBeNull();
  });

  it('when two pages write in any order, then the stored text is what reading, filtering and storing everything gives', () => {
    // Each step: page 0 or 1 writes its current outbox (after adding or removing edits), or the stored text is damaged.
    const step = fc.oneof(
      fc.record({ kind: fc.constant('write' as const), page: fc.integer({ min: 0, max: 1 }), add: fc.integer({ min: 0, max: 2 }), drop: fc.integer({ min: 0, max: 2 }) }),
      fc.record({ kind: fc.constant('damage' as const) }),
    );
    fc.assert(
      fc.property(fc.array(step, { maxLength: 25 }), (steps) => {
        const run = (write: (page: number, entries: OutboxEntry[], own: Set<string>) => void, storage: Storage) => {
          storage.clear();
          const pages = [0, 1].map(() => ({ entries: [] as OutboxEntry[], own: new Set<string>() }));
          let n = 0;
          for (const s of steps) {
            if (s.kind === 'damage') {
              storage.setItem(key, '{"version":1,"entries":[{"edit":"?"}');
              continue;
            }
            const page = pages[s.page]!;
            page.entries = page.entries.slice(s.drop);
            for (let i = 0; i < s.add; i += 1) {
              const id = `p${s.page}-${(n += 1)}`;
              page.own.add(id);
              page.entries = [...page.entries, cellEntry(id, String(n))];
            }
            write(s.page, page.entries, page.own);
          }
          return storage.getItem(key);
        };
        const writers = [new OutboxWriter(localStorage, 5), new OutboxWriter(localStorage, 5)];
        const got = run((page, entries, own) => writers[page]!.write(entries, own), localStorage);
        const want = run((_page, entries, own) => referenceWrite(localStorage, entries, own), localStorage);
        expect(got).toBe(want);
      }),
      { numRuns: 300 },
    );
  });
});
