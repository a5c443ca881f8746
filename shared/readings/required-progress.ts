import { requiredColumns } from '../checker/index.ts';
import type { CircuitKind, ReadingKey } from '../schemas/columns.ts';

/** What progress needs of a circuit: what it is, and which reading columns hold text. */
export interface ProgressCircuit {
  kind: CircuitKind;
  rcdType: string | null;
  afdd: string | null;
  /** Reading columns holding a value (any text: a number, N/A, LIM, a tick). */
  filled: ReadonlySet<string>;
}

/**
 * Progress of a board as its schedule needs it: the readings each circuit needs (the checker's
 * `requiredColumns`: ring r1/rn/r2 only on rings, the RCD time and button only with an RCD…) and
 * how many of those hold a value. R1+R2 of a circuit other than a ring counts as done when R2 (by
 * long lead) is given instead, as the checker accepts. A board with every needed reading typed reads
 * `done === required`, whatever the columns that do not apply to its circuits.
 */
export function requiredProgress(circuits: Iterable<ProgressCircuit>): { required: number; done: number } {
  let required = 0;
  let done = 0;
  for (const c of circuits) {
    for (const key of requiredColumns({ kind: c.kind, rcdType: c.rcdType as Parameters<typeof requiredColumns>[0]['rcdType'], afdd: c.afdd as 'yes' | 'no' | null }) as ReadingKey[]) {
      required += 1;
      if (c.filled.has(key) || (key === 'r1PlusR2' && c.kind !== 'ring' && c.filled.has('r2'))) done += 1;
    }
  }
  return { required, done };
}
