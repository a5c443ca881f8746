import type { Finding } from './findings.ts';

/**
 * A finding's identity across re-checks: the same board, circuit, code and columns. A reviewer's
 * acceptance is stored under this key, so it still applies after unrelated edits and lapses when
 * the finding goes away or changes its code.
 */
export function findingKey(boardId: number | null, finding: Pick<Finding, 'circuitId' | 'code' | 'columns'>): string {
  return `${boardId ?? 'job'}:${finding.circuitId ?? '-'}:${finding.code}:${[...finding.columns].sort().join(',')}`;
}
