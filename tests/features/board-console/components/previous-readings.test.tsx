import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { checkBoard } from '../../../../shared/checker/index.ts';
import type { BoardDetail } from '../../../../shared/schemas/boards.ts';
import { boardToCheckInput } from '../../../../shared/schemas/check.ts';
import { boardDetail, cellOf, circuit, renderConsole } from './console-fixture.tsx';

/**
 * A board started from an earlier job: the status line shows last time's reading of the active
 * cell, and the checker's note when a reading moved the wrong way (Zs risen by more than a fifth —
 * common practice).
 */
function startedFromEarlierJob(): BoardDetail {
  const detail = boardDetail([circuit(21, '1', { zs: '0.44' }), circuit(22, '2', { zs: '1.02', irLiveEarth: '>200' }), circuit(23, '3', { zs: '0.50' })]);
  return {
    ...detail,
    previousReadings: [
      { circuitId: 22, job: { id: 5, kind: 'EICR', reference: 'HB-2021-07', visitDate: '2021-06-14' }, cells: { zs: { text: '0.80', reason: null }, irLiveEarth: { text: '>200', reason: null } } },
      { circuitId: 23, job: { id: 5, kind: 'EICR', reference: 'HB-2021-07', visitDate: '2021-06-14' }, cells: {} },
    ],
  };
}

describe('last time’s readings in the status line', () => {
  it('when the cursor is on a reading taken last time, then the status line shows it with the earlier job, and the note on the rise', async () => {
    const detail = startedFromEarlierJob();
    // The same findings the console computes: the board checker over the board with last time's cells.
    const findings = checkBoard(boardToCheckInput(detail));
    expect(findings.filter((f) => f.code === 'zs-risen-since-last-time').map((f) => f.circuitId)).toEqual([22]);
    const { grid, user } = renderConsole(detail, { findings });
    await user.click(cellOf(grid, '2', 'Zs'));
    const footer = screen.getByRole('region', { name: 'Status line' });
    expect(footer).toHaveTextContent('Last time (HB-2021-07, 2021-06-14): 0.80');
    // 0.80 × 1.2 = 0.96 Ω (common practice: more than a fifth)
    expect(footer).toHaveTextContent('Note: Zs 1.02 Ω has risen from 0.80 Ω last time (+28 %)');
    expect(footer).toHaveTextContent('Limit ≤ 0.96 Ω');
  });

  it('when the earlier circuit had no reading in that column, then it says so; with no earlier circuit, nothing is shown', async () => {
    const { grid, user } = renderConsole(startedFromEarlierJob());
    await user.click(cellOf(grid, '3', 'Zs'));
    const footer = screen.getByRole('region', { name: 'Status line' });
    expect(footer).toHaveTextContent('Last time (HB-2021-07, 2021-06-14): not recorded');
    await user.click(cellOf(grid, '1', 'Zs'));
    expect(footer).not.toHaveTextContent('Last time');
  });
});
