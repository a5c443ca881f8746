import { describe, expect, it } from 'vitest';
import type { OutboxEntry } from '../../../../src/features/board-console/sync/outbox-storage.ts';
import { pendingMarks } from '../../../../src/features/board-console/sync/targets.ts';

const at = '2026-12-02T10:00:00.000Z';
const cell = (id: string, circuitId: number, column: 'zs' | 'r1PlusR2'): OutboxEntry => ({
  edit: { kind: 'cell', id, boardId: 5, circuitId, column, text: '0.4', reason: null, baseVersion: 0, how: 'typed', at },
});
const field = (id: string, circuitId: number): OutboxEntry => ({
  edit: { kind: 'field', id, boardId: 5, circuitId, field: 'description', value: 'Cooker', baseVersion: 0, how: 'typed', at },
});

describe('pendingMarks', () => {
  it('when nothing waits, then no circuit is marked', () => {
    expect(pendingMarks([])).toEqual(new Map());
  });

  it('when readings and details wait, then each circuit lists their keys once, in the order first written', () => {
    const marks = pendingMarks([cell('a', 1, 'zs'), field('b', 1), cell('c', 2, 'r1PlusR2'), cell('d', 1, 'zs')]);
    expect(marks).toEqual(
      new Map([
        [1, ' zs description '],
        [2, ' r1PlusR2 '],
      ]),
    );
  });

  it('when an edit is held by a conflict, then its cell is not marked as waiting', () => {
    const held: OutboxEntry = { ...cell('a', 1, 'zs'), conflict: { editId: 'a', circuitId: 1, column: 'zs', mine: '0.4', theirs: '0.5', theirsBy: null } };
    expect(pendingMarks([held, cell('b', 2, 'zs')])).toEqual(new Map([[2, ' zs ']]));
  });
});
