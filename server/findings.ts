import { checkBoard } from '../shared/checker/index.ts';
import { boardToCheckInput } from '../shared/schemas/check.ts';
import type { Finding } from '../shared/schemas/findings.ts';
import type { BoardWithContext } from './db/boards.ts';

/** The checker's findings for a stored board (with last time's readings when it has them). */
export function findingsFor(context: Pick<BoardWithContext, 'board' | 'site' | 'circuits'> & Partial<Pick<BoardWithContext, 'previousReadings'>>): Finding[] {
  return checkBoard(boardToCheckInput(context));
}
