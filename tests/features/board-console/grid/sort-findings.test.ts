import { describe, expect, it } from 'vitest';
import type { Finding } from '../../../../shared/schemas/findings.ts';
import { sortFindings } from '../../../../src/features/board-console/grid/findings-index.ts';

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
  it('when errors about typed values and readings not yet recorded mix, then the typed-value errors come first, each group in board order', () => {
    const sorted = sortFindings(
      [
        finding('cells-missing', 'error', 1),
        finding('zs-over-max', 'error', 9),
        finding('zs-over-80-percent', 'warning', 2),
        finding('cells-missing', 'error', 3),
        finding('ir-below-minimum', 'error', 5),
        finding('board-polarity-not-confirmed', 'warning', null),
      ],
      [1, 2, 3, 5, 9],
    );
    expect(sorted.map((f) => `${f.code}@${f.circuitId}`)).toEqual([
      'ir-below-minimum@5',
      'zs-over-max@9',
      'cells-missing@1',
      'cells-missing@3',
      'board-polarity-not-confirmed@null',
      'zs-over-80-percent@2',
    ]);
  });
});
