/**
 * Plans the keys a typist presses to type readings into the console, column by column, with the
 * console's own navigation (`columnMove` of the grid and the Enter rule of `enter-stops.ts`), so a
 * plan cannot assume a move the console does not make. Used by the console benchmark to count keys
 * and by the keyboard browser test to type a board.
 *
 * The typist's moves are those a person uses while entering by column: Enter (down to the next cell
 * Enter stops at; after the last, on to the next column), ↓ (one circuit down), → (one column right)
 * and Ctrl+↑ (top of the column). Between two values the plan takes the fewest keys those moves
 * allow. A value itself is typed the shortest way the console takes (see `pressesFor`).
 */
import { columns as gridColumns, type ReadingKey } from '../../shared/schemas/columns.ts';
import { enterStopsAt, type CircuitForStops } from '../../src/features/board-console/grid/enter-stops.ts';
import { columnMove, type Applies, type CellIndex, type GridShape } from '../../src/features/board-console/grid/grid-state.ts';

/** A key press as Playwright names it, and how many physical keys it takes (modifiers count). */
export interface Press {
  key: string;
  keys: number;
}

const SHIFTED = new Set(['>', '?', '"', '<', ':', '|', '{', '}', '+', '_', '(', ')', '*', '&', '^', '%', '$', '#', '@', '!', '~']);

const PASS_FAIL_COLUMNS = new Set(['polarity', 'rcdButton', 'afddButton']);

export function keyCount(presses: readonly Press[]): number {
  return presses.reduce((sum, p) => sum + p.keys, 0);
}

/**
 * The presses that type `stored` into a cell of `column` whose upper neighbour holds `above`: the
 * shortest the console allows. The console writes out its short forms: a leading point gets its
 * zero (".44" → 0.44, ">.5" → >0.5), "na" becomes N/A, "lim" LIM, v and x a tick and a cross. A value
 * ends with Enter, except a tick or cross in a ✓/✗ column (one key: saved, and the cursor moves on)
 * and the same-as-above key (Ctrl+', which moves on itself).
 */
export function pressesFor(column: string, stored: string, above: string | null): Press[] {
  if (PASS_FAIL_COLUMNS.has(column) && (stored === '✓' || stored === '✗')) return [{ key: stored === '✓' ? 'v' : 'x', keys: 1 }];
  if (stored !== '' && above === stored) return [{ key: "Control+'", keys: 2 }];
  let typed = stored;
  if (stored === 'N/A') typed = 'na';
  else if (stored === 'LIM') typed = 'lim';
  else if (/^0\.\d/.test(stored)) typed = stored.slice(1);
  else if (/^>0\.\d/.test(stored)) typed = `>${stored.slice(2)}`;
  const presses: Press[] = [...typed].map((ch) => ({ key: ch, keys: SHIFTED.has(ch) || /[A-Z]/.test(ch) ? 2 : 1 }));
  presses.push({ key: 'Enter', keys: 1 });
  return presses;
}

/**
 * Which cells Enter stops at: `skip` is the console's rule (details, readings the circuit needs,
 * any cell with a value); `every-cell` is Enter as it was before that rule, one circuit at a time.
 */
export type StopRule = 'skip' | 'every-cell';

/** What the planner needs of a circuit: what it is and its reading cells before typing starts. */
export type PlanCircuit = CircuitForStops;

export interface PlanOptions {
  circuits: readonly PlanCircuit[];
  /** The text to type at a circuit (by row) and reading column; '' for nothing. */
  script: (row: number, column: ReadingKey) => string;
  /** The reading columns to type, in any order (they are typed in grid order). */
  columns: readonly ReadingKey[];
  rule: StopRule;
  /** Where the cursor is when typing starts. */
  start: CellIndex;
  /** Stop after this many values. */
  limit?: number;
  /** How a value is typed; the shortest way by default. */
  presses?: (column: ReadingKey, stored: string, above: string | null) => Press[];
}

export interface PlannedValue {
  row: number;
  column: ReadingKey;
  stored: string;
  /** Keys that bring the cursor from where the previous value left it to this cell. */
  navigation: Press[];
  /** Keys that type the value (and move on). */
  presses: Press[];
}

export interface KeystrokePlan {
  values: PlannedValue[];
  /** Where the cursor is after the last value. */
  end: CellIndex;
  keys: number;
  characters: number;
}

/** The grid's column keys in order, as the console shows them. */
export const gridColumnKeys = gridColumns.map((c) => c.key);

interface Edge {
  press: Press;
  to: CellIndex;
}

/** The fewest keys from `from` to `to` with the typist's moves (Dijkstra; costs are 1 or 2). */
function route(from: CellIndex, to: CellIndex, shape: GridShape, applies: Applies): Press[] {
  if (from.row === to.row && from.col === to.col) return [];
  const rowCount = shape.rows.length;
  const id = (c: CellIndex) => c.col * rowCount + c.row;
  const size = rowCount * shape.columns.length;
  const cost = new Array<number>(size).fill(Infinity);
  const back = new Array<{ prev: number; press: Press } | undefined>(size);
  const buckets: number[][] = [[id(from)]];
  cost[id(from)] = 0;
  const goal = id(to);
  const edges = (at: CellIndex): Edge[] => [
    { press: { key: 'Enter', keys: 1 }, to: columnMove(at, 'down', shape, applies).to },
    { press: { key: 'ArrowDown', keys: 1 }, to: { row: Math.min(rowCount - 1, at.row + 1), col: at.col } },
    { press: { key: 'ArrowRight', keys: 1 }, to: { row: at.row, col: Math.min(shape.columns.length - 1, at.col + 1) } },
    { press: { key: 'Control+ArrowUp', keys: 2 }, to: { row: 0, col: at.col } },
  ];
  for (let c = 0; c < buckets.length; c++) {
    for (const node of buckets[c] ?? []) {
      if (cost[node] !== c) continue;
      if (node === goal) {
        const presses: Press[] = [];
        for (let n = goal; n !== id(from); n = back[n]!.prev) presses.unshift(back[n]!.press);
        return presses;
      }
      const at = { row: node % rowCount, col: Math.floor(node / rowCount) };
      for (const edge of edges(at)) {
        const next = id(edge.to);
        const total = c + edge.press.keys;
        if (total < cost[next]!) {
          cost[next] = total;
          back[next] = { prev: node, press: edge.press };
          (buckets[total] ??= []).push(next);
        }
      }
    }
  }
  throw new Error(`No way from row ${from.row} column ${from.col} to row ${to.row} column ${to.col}`);
}

/**
 * The keys that type the script into the board, value by value in grid order (down each column,
 * columns left to right), following the console's navigation as the board changes under the typing.
 */
export function planTyping(options: PlanOptions): KeystrokePlan {
  const { circuits, rule } = options;
  const shape: GridShape = { rows: circuits.map((_, i) => i), columns: gridColumnKeys };
  // The board as the typist changes it: each circuit's reading texts.
  const current = circuits.map((c) => {
    const texts: Partial<Record<ReadingKey, { text: string }>> = {};
    for (const [key, cell] of Object.entries(c.cells) as [ReadingKey, { text: string } | undefined][]) if (cell) texts[key] = { text: cell.text };
    return { ...c, cells: texts };
  });
  const applies: Applies = rule === 'every-cell' ? () => true : (row, column) => enterStopsAt(current[row]!, column, 'zs'); // every value typed is a reading: Enter starts from a reading column
  const typeValue = options.presses ?? pressesFor;
  const wanted = new Set(options.columns);
  const values: PlannedValue[] = [];
  let cursor = options.start;
  let keys = 0;
  let characters = 0;
  outer: for (const [col, key] of gridColumnKeys.entries()) {
    if (!wanted.has(key as ReadingKey)) continue;
    const column = key as ReadingKey;
    for (let row = 0; row < circuits.length; row++) {
      const stored = options.script(row, column);
      if (stored === '') continue;
      if (options.limit !== undefined && values.length >= options.limit) break outer;
      const navigation = route(cursor, { row, col }, shape, applies);
      const above = row > 0 ? (current[row - 1]!.cells[column]?.text ?? '') : null;
      const presses = typeValue(column, stored, above);
      values.push({ row, column, stored, navigation, presses });
      keys += keyCount(navigation) + keyCount(presses);
      characters += [...stored].length;
      current[row]!.cells[column] = { text: stored };
      // Every way of finishing a value in the plan (Enter, a tick, same-as-above) goes on down the column.
      cursor = columnMove({ row, col }, 'down', shape, applies).to;
    }
  }
  return { values, end: cursor, keys, characters };
}
