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

/** Whole per cent of the needed readings typed; 100 only when every one is there. */
export function progressPercent(done: number, required: number): number {
  if (required === 0) return 0;
  const share = Math.floor((done / required) * 100);
  return done >= required ? 100 : Math.min(99, share);
}

/**
 * Progress of a board: the readings its circuits need (the checker's required columns, so ring
 * readings of radials and RCD times of circuits without an RCD are not counted) and how many are
 * typed, as a bar, a count and a percentage. A finished board reads 100 %.
 */
export function BoardProgress({ readingsDone, readingsRequired }: { readingsDone: number; readingsRequired: number }) {
  const percent = progressPercent(readingsDone, readingsRequired);
  return (
    <span className="flex items-center gap-2">
      <span aria-hidden="true" className="h-1.5 w-20 shrink-0 overflow-hidden rounded-full bg-line">
        <span className="block h-full rounded-full bg-accent" style={{ width: `${percent}%` }} />
      </span>
      <span className="tabular-nums">
        {percent} % <span className="text-muted">· {readingsDone} / {readingsRequired} readings</span>
      </span>
    </span>
  );
}
