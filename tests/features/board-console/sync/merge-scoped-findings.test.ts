import { describe, expect, it } from 'vitest';
import type { Finding } from '../../../../shared/schemas/findings.ts';
import { mergeScopedFindings } from '../../../../src/features/board-console/sync/merge.ts';

const f = (circuitId: number | null, code: string): Finding => ({ code, severity: 'warning', circuitId, columns: [], message: code, limit: null, source: null });

describe('mergeScopedFindings (the feed sends only the findings that changed)', () => {
  it('when the feed covers some circuits, then their findings and the board-wide ones are replaced, others kept, removed circuits dropped', () => {
    const known = [f(null, 'board-old'), f(1, 'keep'), f(2, 'duplicate'), f(3, 'duplicate'), f(4, 'gone')];
    const merged = mergeScopedFindings(known, {
      circuits: [],
      order: [1, 2, 3],
      findings: [f(null, 'board-new'), f(3, 'zs-high')],
      // Circuit 2 is covered with no findings left: its duplicate warning goes.
      findingsCircuits: [2, 3],
    });
    expect(merged.map((x) => `${x.circuitId}:${x.code}`).sort()).toEqual(['1:keep', '3:zs-high', 'null:board-new']);
  });

  it('when an older server sends no list of covered circuits, then the circuits sent and those with findings count as covered', () => {
    const merged = mergeScopedFindings([f(1, 'a'), f(2, 'b')], { circuits: [], order: [1, 2], findings: [f(2, 'c')] });
    expect(merged.map((x) => `${x.circuitId}:${x.code}`).sort()).toEqual(['1:a', '2:c']);
  });
});
