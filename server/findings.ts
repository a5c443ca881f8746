import { checkBoard } from '../shared/checker/index.ts';
import type { Finding } from '../shared/schemas/findings.ts';
import type { CheckInput } from '../shared/schemas/check.ts';
import type { BoardWithContext } from './db/boards.ts';

/** Shapes a stored board as the checker's input. */
export function toCheckInput({ board, site, circuits }: Pick<BoardWithContext, 'board' | 'site' | 'circuits'>): CheckInput {
  return {
    board: {
      phases: board.phases,
      zdbOhm: board.zdbOhm,
      ipfKa: board.ipfKa,
      polarityConfirmed: board.polarityConfirmed,
    },
    site: { earthing: site.earthing, nominalVoltageV: site.nominalVoltageV },
    circuits: circuits.map(({ cells, ...fields }) => ({
      ...fields,
      cells: Object.fromEntries(Object.entries(cells).map(([key, cell]) => [key, { text: cell!.text, reason: cell!.reason }])),
    })),
  };
}

export function findingsFor(context: Pick<BoardWithContext, 'board' | 'site' | 'circuits'>): Finding[] {
  return checkBoard(toCheckInput(context));
}
