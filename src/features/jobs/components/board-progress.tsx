import { optionalReadingKeys, readingKeys } from '../../../../shared/schemas/columns.ts';

const countedKeys = readingKeys.filter((key) => !optionalReadingKeys.includes(key));

/**
 * Reading cells that can be filled on a board: every reading column of every circuit. Circuits
 * where a column does not apply still take "N/A", which counts as filled. Optional tests (the RCD
 * at 5 × IΔn) are not counted.
 */
export function readingCellCount(circuitCount: number): number {
  return circuitCount * countedKeys.length;
}

/** Cells filled out of the board's reading cells, as a number and a bar. */
export function BoardProgress({ cellsFilled, circuitCount }: { cellsFilled: number; circuitCount: number }) {
  const total = readingCellCount(circuitCount);
  const share = total === 0 ? 0 : Math.min(1, cellsFilled / total);
  return (
    <span className="flex items-center gap-2">
      <span aria-hidden="true" className="h-1.5 w-20 shrink-0 overflow-hidden rounded-full bg-line">
        <span className="block h-full rounded-full bg-accent" style={{ width: `${Math.round(share * 100)}%` }} />
      </span>
      <span className="tabular-nums">
        {cellsFilled} / {total} <span className="text-muted">cells</span>
      </span>
    </span>
  );
}
