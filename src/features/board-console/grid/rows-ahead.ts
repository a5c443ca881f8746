/**
 * Rows of the virtualised grid built ahead of the cursor's next jump.
 *
 * Going down a column the view moves in jumps (most of a page at once), and after the last
 * circuit Enter goes to the top of the next column. Building a page of rows (several hundred
 * cells, then their style and layout) takes more than a frame, so it must not happen in the
 * keystroke that makes the jump. While the cursor nears an edge of the view, the rows that the
 * jump will show are built beforehand, a few per frame, after the keystroke's frame (see
 * BoardGrid); elsewhere only the rows in view exist, so every frame stays as light as it was.
 */

/** Rows `first`…`last` (indices, both included); empty when `last < first`. */
export interface RowSpan {
  first: number;
  last: number;
}

export interface ViewAhead {
  /** Index of the cursor's row, or -1 when there is none. */
  active: number;
  /** The rows in view. */
  visible: RowSpan;
  /** Rows on the board. */
  count: number;
  /** Rows a jump can bring into view: a page, with the virtualiser's overscan. */
  page: number;
}

/**
 * The rows the next jump may bring into view, nearest first: the page below while the cursor is
 * in the bottom quarter of the view, the page above while it is in the top quarter, and the first
 * page while the view shows the end of the board (the way back to the top of the next column).
 * Rows already in view are left out. (A jump leaves the cursor a third of the view from the edge
 * it came from, outside both quarters, so the rows it has just left are not built again.)
 */
export function rowsBeforeJump({ active, visible, count, page }: ViewAhead): number[] {
  if (active < 0 || count <= 0 || visible.last < visible.first) return [];
  const near = Math.max(1, Math.floor((visible.last - visible.first + 1) / 4));
  const wanted: number[] = [];
  const seen = new Set<number>();
  const add = (row: number) => {
    if (row < 0 || row >= count || (row >= visible.first && row <= visible.last) || seen.has(row)) return;
    seen.add(row);
    wanted.push(row);
  };
  if (active > visible.last - near) for (let row = visible.last + 1; row <= visible.last + page; row += 1) add(row);
  if (active < visible.first + near) for (let row = visible.first - 1; row >= visible.first - page; row -= 1) add(row);
  if (visible.last >= count - 1) for (let row = 0; row < page; row += 1) add(row);
  return wanted;
}

/**
 * One step from the rows built towards the rows wanted: rows no longer wanted go, and up to
 * `chunk` wanted rows not yet built are added, in the order wanted. Ascending, each once.
 */
export function buildStep(built: readonly number[], wanted: readonly number[], chunk: number): number[] {
  const isWanted = new Set(wanted);
  const kept = built.filter((row) => isWanted.has(row));
  const have = new Set(kept);
  let room = Math.max(0, chunk);
  for (const row of wanted) {
    if (room === 0) break;
    if (have.has(row)) continue;
    have.add(row);
    kept.push(row);
    room -= 1;
  }
  return kept.sort((a, b) => a - b);
}

/**
 * The rows to render: those in view and those built ahead (`built` ascending, as `buildStep`
 * gives them), ascending, each once, below `count`.
 */
export function rowsToRender(inView: RowSpan, built: readonly number[], count: number): number[] {
  const rows: number[] = [];
  const first = Math.max(0, inView.first);
  const last = Math.min(count - 1, inView.last);
  let i = 0;
  const ahead = built.filter((row) => row >= 0 && row < count && (row < first || row > last));
  for (let row = first; row <= last; row += 1) {
    while (i < ahead.length && ahead[i]! < row) rows.push(ahead[i++]!);
    rows.push(row);
  }
  while (i < ahead.length) rows.push(ahead[i++]!);
  return rows;
}
