import { createBoardChecker } from '../shared/checker/index.ts';
import type { Board, Circuit, PreviousReadings } from '../shared/schemas/boards.ts';
import { boardToCheckInput, type CheckCircuit } from '../shared/schemas/check.ts';
import type { Finding } from '../shared/schemas/findings.ts';
import type { Job, Site } from '../shared/schemas/sites.ts';
import { circuitOrder, findBoardRow, loadCircuits, loadPreviousReadings } from './db/boards.ts';
import type { DB } from './db/database.ts';
import { toBoard, toJob, toSite } from './db/mappers.ts';
import { storedValueFindings, withPosition } from './db/served-circuits.ts';
import type { BoardRow, SiteRow } from './db/types.ts';
import { userNames } from './db/users.ts';

/**
 * One board as the server last saw it, kept in memory and brought up to date from the history: a
 * write or a poll pays for what changed since, not for the whole board.
 */
export interface BoardState {
  readonly boardId: number;
  /** The newest history id this state includes. */
  cursor: number;
  board: Board;
  site: Site;
  job: Job;
  /** In board order. Each circuit object is replaced, never mutated, when it changes. */
  circuits: Circuit[];
  /** Last time's readings (fixed: they belong to an earlier job), read again when circuits are added or removed. */
  previousReadings: PreviousReadings[];
  previousById: Map<number, PreviousReadings>;
  byId: Map<number, Circuit>;
  boardRowKey: string;
  siteRowKey: string;
  /** The checker's input per circuit object (the checker caches its work per input object). */
  inputs: WeakMap<Circuit, CheckCircuit>;
  check: ReturnType<typeof createBoardChecker>;
  findingsMemo?: { cursor: number; board: Board; site: Site; circuits: Circuit[]; findings: Finding[]; noted?: boolean };
  /** Each circuit's findings as last computed (a signature), and the cursor at which they last changed. */
  findingsSignature: Map<number, string>;
  findingsChangedAt: Map<number, number>;
}

/** History actions that change which circuits a board has, or their order. */
const structuralActions = new Set(['circuit-created', 'circuit-removed', 'reordered']);

/**
 * The boards the server has in memory (least recently used dropped beyond `maxBoards`). Every
 * change to a board appends to its history (DEVELOPERS.md), so the history since a state's cursor
 * names what to reload; the board and site rows are read again on each use (one row each) so a
 * change made elsewhere without a history row still shows. Updates of one board run one at a time.
 */
export class BoardStates {
  private readonly states = new Map<number, BoardState>();
  private readonly queues = new Map<number, Promise<unknown>>();
  private readonly waiting = new Map<number, { reload: number[]; promise: Promise<BoardState | undefined> }>();

  constructor(
    private readonly db: DB,
    private readonly maxBoards = 64,
  ) {}

  /**
   * The board brought up to date, or undefined when it does not exist. Calls that arrive while an
   * update of the same board is waiting to start share it (it reads the history after all of their
   * changes were committed), so eight typists saving at once cost one update and one check.
   */
  current(boardId: number, options: { reloadCircuits?: readonly number[] } = {}): Promise<BoardState | undefined> {
    const reload = options.reloadCircuits ?? [];
    const waiting = this.waiting.get(boardId);
    if (waiting) {
      waiting.reload.push(...reload);
      return waiting.promise;
    }
    const previous = this.queues.get(boardId) ?? Promise.resolve();
    const slot: { reload: number[]; promise: Promise<BoardState | undefined> } = { reload: [...reload], promise: Promise.resolve(undefined) };
    slot.promise = previous
      .catch(() => undefined)
      .then(() => {
        // Started: later calls wait for the next update, which will see their changes.
        if (this.waiting.get(boardId) === slot) this.waiting.delete(boardId);
        return this.refresh(boardId, slot.reload);
      });
    this.waiting.set(boardId, slot);
    this.queues.set(boardId, slot.promise);
    void slot.promise
      .finally(() => {
        if (this.queues.get(boardId) === slot.promise) this.queues.delete(boardId);
      })
      .catch(() => undefined);
    return slot.promise;
  }

  /** Every finding of the board (the checker's and any stored value that did not fit). */
  findings(state: BoardState): Finding[] {
    const memo = state.findingsMemo;
    if (memo && memo.cursor === state.cursor && memo.board === state.board && memo.site === state.site && memo.circuits === state.circuits) {
      return memo.findings;
    }
    const { board, site } = boardToCheckInput({ board: state.board, site: state.site, circuits: [] });
    const inputs = state.circuits.map((circuit) => {
      let input = state.inputs.get(circuit);
      if (!input) {
        const previous = state.previousById.get(circuit.id);
        input = boardToCheckInput({ board: state.board, site: state.site, circuits: [circuit], previousReadings: previous ? [previous] : undefined }).circuits[0]!;
        state.inputs.set(circuit, input);
      }
      return input;
    });
    const unfit = storedValueFindings(state.circuits);
    const checked = state.check({ board, site, circuits: inputs });
    const findings = unfit.length > 0 ? [...unfit, ...checked] : checked;
    state.findingsMemo = { cursor: state.cursor, board: state.board, site: state.site, circuits: state.circuits, findings };
    return findings;
  }

  /**
   * What a console that has seen the board up to `after` needs of the findings: those of the
   * circuits whose findings changed since (a rule comparing circuits can change the findings of a
   * circuit nobody touched), of the circuits named, and the board-wide ones.
   */
  findingsSince(state: BoardState, after: number, circuitIds: ReadonlySet<number>): { findings: Finding[]; circuits: number[] } {
    const findings = this.findings(state);
    // Noted whenever the feed serves findings (not on every write): a change noted later than it
    // happened only reaches more consoles, and every console's cursor came with findings noted then.
    if (!state.findingsMemo!.noted) {
      noteChangedFindings(state, findings);
      state.findingsMemo!.noted = true;
    }
    const covered = new Set(circuitIds);
    for (const [id, at] of state.findingsChangedAt) if (at > after) covered.add(id);
    return {
      findings: findings.filter((f) => f.circuitId === null || covered.has(f.circuitId)),
      circuits: state.circuits.filter((c) => covered.has(c.id)).map((c) => c.id),
    };
  }

  private async refresh(boardId: number, reload: readonly number[]): Promise<BoardState | undefined> {
    const boardRow = await findBoardRow(this.db, boardId);
    if (!boardRow) {
      this.states.delete(boardId);
      return undefined;
    }
    let state = this.states.get(boardId);
    if (!state) {
      state = await this.load(boardRow);
      this.noteFirstFindings(state);
    } else {
      // Most recently used last, so the first key is the one to drop.
      this.states.delete(boardId);
      await this.update(state, boardRow, reload);
    }
    this.states.set(boardId, state);
    while (this.states.size > this.maxBoards) this.states.delete(this.states.keys().next().value!);
    return state;
  }

  /** Notes the findings as first seen, so later changes can be told apart from them. */
  private noteFirstFindings(state: BoardState): void {
    const findings = this.findings(state);
    noteChangedFindings(state, findings);
    state.findingsMemo!.noted = true;
  }

  private async load(boardRow: BoardRow): Promise<BoardState> {
    const db = this.db;
    // The cursor first: circuits read afterwards are at least as new as it.
    const cursor = await latestHistoryId(db, boardRow.id);
    const jobRow = await db.selectFrom('jobs').selectAll().where('id', '=', boardRow.job_id).executeTakeFirstOrThrow();
    const siteRow = await db.selectFrom('sites').selectAll().where('id', '=', jobRow.site_id).executeTakeFirstOrThrow();
    const circuits = await loadCircuits(db, boardRow.id);
    const previousReadings = await loadPreviousReadings(db, boardRow.id);
    return {
      boardId: boardRow.id,
      cursor,
      board: toBoard(boardRow, await userNames(db)),
      site: toSite(siteRow),
      job: toJob(jobRow),
      circuits,
      byId: new Map(circuits.map((c) => [c.id, c])),
      previousReadings,
      previousById: new Map(previousReadings.map((p) => [p.circuitId, p])),
      boardRowKey: rowKey(boardRow),
      siteRowKey: rowKey(siteRow),
      inputs: new WeakMap(),
      check: createBoardChecker(),
      findingsSignature: new Map(),
      findingsChangedAt: new Map(),
    };
  }

  private async update(state: BoardState, boardRow: BoardRow, reload: readonly number[]): Promise<void> {
    const db = this.db;
    const key = rowKey(boardRow);
    if (key !== state.boardRowKey) {
      state.board = toBoard(boardRow, await userNames(db));
      state.boardRowKey = key;
    }
    const siteRow: SiteRow | undefined = await db.selectFrom('sites').selectAll().where('id', '=', state.site.id).executeTakeFirst();
    if (siteRow && rowKey(siteRow) !== state.siteRowKey) {
      state.site = toSite(siteRow);
      state.siteRowKey = rowKey(siteRow);
    }
    const changes = await db
      .selectFrom('history')
      .select(['id', 'circuit_id', 'action'])
      .where('board_id', '=', state.boardId)
      .where('id', '>', state.cursor)
      .orderBy('id')
      .execute();
    if (changes.length === 0 && reload.length === 0) return;
    const changed = new Set<number>(reload);
    let structural = false;
    for (const change of changes) {
      if (change.circuit_id !== null) changed.add(change.circuit_id);
      if (structuralActions.has(change.action)) structural = true;
    }
    if (!structural) {
      // Same circuits in the same order: replace the changed ones in place of a copy.
      const fresh = await loadCircuits(db, state.boardId, [...changed].filter((id) => state.byId.has(id)));
      const freshById = new Map(fresh.map((c) => [c.id, c]));
      const circuits = state.circuits.map((c) => {
        const next = freshById.get(c.id);
        if (!next) return c;
        const placed = next.position === c.position ? next : withPosition(next, c.position);
        state.byId.set(c.id, placed);
        return placed;
      });
      state.circuits = circuits;
      if (changes.length > 0) state.cursor = changes[changes.length - 1]!.id;
      return;
    }
    const order = await circuitOrder(db, state.boardId);
    state.previousReadings = await loadPreviousReadings(db, state.boardId);
    state.previousById = new Map(state.previousReadings.map((p) => [p.circuitId, p]));
    state.inputs = new WeakMap();
    const present = new Set(order);
    const fresh = await loadCircuits(db, state.boardId, [...changed].filter((id) => present.has(id)));
    for (const circuit of fresh) state.byId.set(circuit.id, circuit);
    for (const id of state.byId.keys()) if (!present.has(id)) state.byId.delete(id);
    const circuits: Circuit[] = [];
    for (const [index, id] of order.entries()) {
      let circuit = state.byId.get(id);
      if (!circuit) {
        // Not known and not named by the history: read it (cannot happen when every change is recorded).
        [circuit] = await loadCircuits(db, state.boardId, [id]);
        if (!circuit) continue;
        state.byId.set(id, circuit);
      }
      if (circuit.position !== index + 1) {
        circuit = withPosition(circuit, index + 1);
        state.byId.set(id, circuit);
      }
      circuits.push(circuit);
    }
    state.circuits = circuits;
    if (changes.length > 0) state.cursor = changes[changes.length - 1]!.id;
  }
}

/** Records, per circuit, the cursor at which its findings last changed (first sight counts as a change). */
function noteChangedFindings(state: BoardState, findings: readonly Finding[]): void {
  const byCircuit = new Map<number, string[]>();
  for (const f of findings) {
    if (f.circuitId === null) continue;
    const list = byCircuit.get(f.circuitId);
    const text = JSON.stringify(f);
    if (list) list.push(text);
    else byCircuit.set(f.circuitId, [text]);
  }
  const seen = new Set<number>();
  for (const circuit of state.circuits) {
    seen.add(circuit.id);
    const signature = (byCircuit.get(circuit.id) ?? []).sort().join('\n');
    if (state.findingsSignature.get(circuit.id) !== signature) {
      state.findingsSignature.set(circuit.id, signature);
      state.findingsChangedAt.set(circuit.id, state.cursor);
    }
  }
  for (const id of state.findingsSignature.keys()) {
    if (!seen.has(id)) {
      state.findingsSignature.delete(id);
      state.findingsChangedAt.delete(id);
    }
  }
}

async function latestHistoryId(db: DB, boardId: number): Promise<number> {
  const row = await db
    .selectFrom('history')
    .select((eb) => eb.fn.max<number | null>('id').as('id'))
    .where('board_id', '=', boardId)
    .executeTakeFirst();
  return row?.id ?? 0;
}

function rowKey(row: object): string {
  return JSON.stringify(row);
}
