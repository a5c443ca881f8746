import { checkBoard } from '../shared/checker/index.ts';
import { boardToCheckInput } from '../shared/schemas/check.ts';
import type { Finding } from '../shared/schemas/findings.ts';
import type { BoardWithContext } from './db/boards.ts';
import { storedValueFindings } from './db/served-circuits.ts';

/**
 * The checker's findings for a stored board (with last time's readings when it has them), and any
 * stored value that did not fit its field.
 */
export function findingsFor(context: Pick<BoardWithContext, 'board' | 'site' | 'circuits'> & Partial<Pick<BoardWithContext, 'previousReadings'>>): Finding[] {
  const unfit = storedValueFindings(context.circuits);
  const findings = checkBoard(boardToCheckInput(context));
  return unfit.length > 0 ? [...unfit, ...findings] : findings;
}
