import { describe, expect, it } from 'vitest';
import type { Finding } from '../../../../shared/schemas/findings.ts';
import { sortFindings, toDoByColumn } from '../../../../src/features/board-console/grid/findings-index.ts';

const finding = (code: string, severity: Finding['severity'], circuitId: number | null): Finding => ({
  code,
  severity,
  circuitId,
  columns: [],
  message: code,
  limit: null,
  source: null,
});

describe('sortFindings', () => {
  it('when findings about values and readings not yet recorded mix, then every finding about a value comes first, the readings to do last, each group in board order', () => {
    const sorted = sortFindings(
      [
        finding('cells-missing', 'todo', 1),
        finding('zs-over-max', 'error', 9),
        finding('zs-over-80-percent', 'warning', 2),
        finding('cells-missing', 'todo', 3),
        finding('ir-below-minimum', 'error', 5),
        finding('board-polarity-not-confirmed', 'warning', null),
      ],
      [1, 2, 3, 5, 9],
    );
    expect(sorted.map((f) => `${f.code}@${f.circuitId}`)).toEqual([
      'ir-below-minimum@5',
      'zs-over-max@9',
      'board-polarity-not-confirmed@null',
      'zs-over-80-percent@2',
      'cells-missing@1',
      'cells-missing@3',
    ]);
  });
});

describe('toDoByColumn', () => {
  const todo = (circuitId: number, columns: string[]): Finding => ({ ...finding('cells-missing', 'todo', circuitId), columns });

  it('when readings are missing on several circuits, then each column counts its circuits, in column order, pointing at the first circuit in board order', () => {
    const counts = toDoByColumn(
      [todo(9, ['zs', 'polarity']), finding('zs-over-max', 'error', 2), todo(3, ['zs']), todo(5, ['rcdTimeMs'])],
      [3, 5, 9, 2],
      ['polarity', 'zs', 'rcdTimeMs'],
    );
    expect(counts.map((c) => [c.column, c.count, c.first.circuitId])).toEqual([
      ['polarity', 1, 9],
      ['zs', 2, 3],
      ['rcdTimeMs', 1, 5],
    ]);
  });
});
