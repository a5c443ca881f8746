import { Router } from 'express';
import {
  createCircuitBodySchema,
  reorderCircuitsBodySchema,
  unlockBoardBodySchema,
  updateBoardBodySchema,
  boardHistoryQuerySchema,
  boardHistoryResponseSchema,
  updateCircuitBodySchema,
  writeCellBodySchema,
} from '../../shared/schemas/boards.ts';
import { columnByKey, isDetailKey, isReadingKey } from '../../shared/schemas/columns.ts';
import { BoardStates } from '../board-state.ts';
import { findBoardRow, loadBoard, loadCircuits, circuitOrder, setBoardLock, updateBoardDetails } from '../db/boards.ts';
import { writeCell } from '../db/cells.ts';
import { createCircuit, deleteCircuit, findCircuitRow, reorderCircuits, updateCircuit } from '../db/circuits.ts';
import type { DB } from '../db/database.ts';
import { boardHistory, cellHistory, latestCursor } from '../db/history.ts';
import { toCell, toJob } from '../db/mappers.ts';
import type { BoardRow } from '../db/types.ts';
import { userNames } from '../db/users.ts';
import { HttpError, notFound } from '../http-error.ts';
import { currentUser, requireRole } from '../middleware/auth.ts';
import type { PresenceTracker } from '../presence.ts';
import { requireBoardLockable, requireJobWritable } from '../review/guards.ts';
import { idParam } from './params.ts';

/** The board, loaded for a write: 404 when absent, 423 when its job is approved or issued. */
export async function requireBoard(db: DB, boardId: number): Promise<BoardRow> {
  const board = await findBoardRow(db, boardId);
  if (!board) throw notFound(`Board ${boardId}`);
  // Every write loads its board through here: an approved or issued job refuses them all (423).
  await requireJobWritable(db, board.job_id);
  return board;
}

/** Any write to a locked board is refused with 423 and changes nothing. */
export function requireOpen(board: BoardRow): void {
  if (board.state === 'locked') {
    throw new HttpError('locked', `Board ${board.reference} is locked; a reviewer must unlock it before anything changes.`);
  }
}

export function boardRoutes(db: DB, presence: PresenceTracker): Router {
  const router = Router();

  // Boards kept in memory and brought up to date from their history (server/board-state.ts): a
  // write re-reads and re-checks the circuits that changed, an idle poll reads three small rows.
  const states = new BoardStates(db);

  /** Findings of the board (rules compare circuits with each other), or of one circuit. */
  async function boardFindings(boardId: number, circuitId?: number, reloadCircuits?: number[]) {
    const state = await states.current(boardId, { reloadCircuits });
    if (!state) return [];
    const findings = states.findings(state);
    return circuitId === undefined ? findings : findings.filter((f) => f.circuitId === circuitId);
  }

  router.get('/:boardId', async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const state = await states.current(boardId);
    if (!state) throw notFound(`Board ${boardId}`);
    // The job is not part of the board's history (its state and reference change elsewhere).
    const job = await db.selectFrom('jobs').selectAll().where('id', '=', state.job.id).executeTakeFirst();
    await presence.touch(boardId, currentUser(req));
    res.json({
      board: state.board,
      site: state.site,
      job: job ? toJob(job) : state.job,
      circuits: state.circuits,
      previousReadings: state.previousReadings,
      findings: states.findings(state),
      cursor: state.cursor,
    });
  });

  /**
   * The live feed: what changed after `after` (a cursor from an earlier answer): the circuits
   * changed, the findings of every circuit whose findings changed and the board-wide ones
   * (`findingsScope: 'circuits'`), the order and the board. When nothing changed it costs three
   * one-row reads.
   */
  router.get('/:boardId/changes', async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const after = Number(req.query.after ?? 0);
    if (!Number.isSafeInteger(after) || after < 0) throw new HttpError('bad_request', 'after must be a cursor from an earlier answer (a whole number).');
    const user = currentUser(req);
    await presence.touch(boardId, user);
    const state = await states.current(boardId);
    if (!state) throw notFound(`Board ${boardId}`);
    const present = await presence.others(boardId, user.id);
    const order = state.circuits.map((c) => c.id);
    if (state.cursor <= after) {
      res.json({ cursor: after, board: state.board, circuits: [], order, findings: [], findingsScope: 'circuits', findingsCircuits: [], present });
      return;
    }
    const changes = await db
      .selectFrom('history')
      .select('circuit_id')
      .where('board_id', '=', boardId)
      .where('id', '>', after)
      .where('id', '<=', state.cursor)
      .execute();
    const changedIds = new Set(changes.map((c) => c.circuit_id).filter((id): id is number => id !== null));
    const changedFindings = states.findingsSince(state, after, changedIds);
    res.json({
      cursor: state.cursor,
      board: state.board,
      circuits: state.circuits.filter((c) => changedIds.has(c.id)),
      order,
      findings: changedFindings.findings,
      findingsScope: 'circuits',
      findingsCircuits: changedFindings.circuits,
      present,
    });
  });

  router.patch('/:boardId', async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const body = updateBoardBodySchema.parse(req.body);
    const user = currentUser(req);
    await db.transaction().execute(async (trx) => {
      const board = await requireBoard(trx, boardId);
      requireOpen(board);
      if (board.version !== body.version) {
        throw new HttpError('conflict', 'Someone changed this board’s details meanwhile; look again and retry.', {
          current: await loadBoard(trx, boardId),
        });
      }
      await updateBoardDetails(trx, board, body.changes, user.id);
    });
    res.json({ board: await loadBoard(db, boardId), findings: await boardFindings(boardId), cursor: await latestCursor(db, boardId) });
  });

  router.post('/:boardId/lock', requireRole('reviewer', 'admin'), async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const user = currentUser(req);
    await db.transaction().execute(async (trx) => {
      const board = await requireBoard(trx, boardId);
      if (board.state === 'locked') throw new HttpError('locked', `Board ${board.reference} is already locked.`);
      await requireBoardLockable(trx, boardId);
      await setBoardLock(trx, board, { locked: true, userId: user.id });
    });
    res.json({ board: await loadBoard(db, boardId) });
  });

  router.post('/:boardId/unlock', requireRole('reviewer', 'admin'), async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const { reason } = unlockBoardBodySchema.parse(req.body);
    const user = currentUser(req);
    await db.transaction().execute(async (trx) => {
      const board = await requireBoard(trx, boardId);
      if (board.state !== 'locked') throw new HttpError('conflict', `Board ${board.reference} is not locked.`);
      await setBoardLock(trx, board, { locked: false, userId: user.id, reason });
    });
    res.json({ board: await loadBoard(db, boardId) });
  });

  router.post('/:boardId/circuits', async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const body = createCircuitBodySchema.parse(req.body);
    const user = currentUser(req);
    const id = await db.transaction().execute(async (trx) => {
      requireOpen(await requireBoard(trx, boardId));
      if (body.afterCircuitId && !(await findCircuitRow(trx, boardId, body.afterCircuitId))) {
        throw new HttpError('bad_request', `Circuit ${body.afterCircuitId} is not on this board.`);
      }
      if (body.spurRingId && !(await findCircuitRow(trx, boardId, body.spurRingId))) {
        throw new HttpError('bad_request', 'A spur must hang from a ring on the same board.');
      }
      return createCircuit(trx, boardId, body, user.id);
    });
    const [circuit] = await loadCircuits(db, boardId, [id]);
    res.status(201).json({ circuit, findings: await boardFindings(boardId, id), cursor: await latestCursor(db, boardId) });
  });

  router.put('/:boardId/circuits/order', async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const { circuitIds } = reorderCircuitsBodySchema.parse(req.body);
    const user = currentUser(req);
    await db.transaction().execute(async (trx) => {
      requireOpen(await requireBoard(trx, boardId));
      const current = await circuitOrder(trx, boardId);
      const same = current.length === circuitIds.length && new Set(circuitIds).size === circuitIds.length && circuitIds.every((id) => current.includes(id));
      if (!same) throw new HttpError('bad_request', 'Give every circuit of the board exactly once, in the new order.');
      await reorderCircuits(trx, boardId, circuitIds, user.id);
    });
    res.json({ order: await circuitOrder(db, boardId), cursor: await latestCursor(db, boardId) });
  });

  router.patch('/:boardId/circuits/:circuitId', async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const circuitId = idParam(req, 'circuitId');
    const body = updateCircuitBodySchema.parse(req.body);
    const user = currentUser(req);
    await db.transaction().execute(async (trx) => {
      requireOpen(await requireBoard(trx, boardId));
      const circuit = await findCircuitRow(trx, boardId, circuitId);
      if (!circuit) throw notFound(`Circuit ${circuitId} on board ${boardId}`);
      if (body.changes.spurRingId) {
        if (body.changes.spurRingId === circuitId) throw new HttpError('bad_request', 'A circuit cannot be a spur of itself.');
        if (!(await findCircuitRow(trx, boardId, body.changes.spurRingId))) {
          throw new HttpError('bad_request', 'A spur must hang from a ring on the same board.');
        }
      }
      const result = await updateCircuit(trx, circuit, body.version, body.changes, user.id, body.how ?? 'typed');
      if (!result.ok) {
        const [current] = await loadCircuits(trx, boardId, [circuitId]);
        const fields = result.conflictingFields.map((f) => (isDetailKey(f) ? columnByKey[f].label : f)).join(', ');
        throw new HttpError('conflict', `Someone else changed ${fields} of circuit ${circuit.number} meanwhile.`, {
          current,
          fields: result.conflictingFields,
        });
      }
    });
    const [circuit] = await loadCircuits(db, boardId, [circuitId]);
    // A change that left every value as it was bumps the version without a history row: reload it.
    res.json({ circuit, findings: await boardFindings(boardId, circuitId, [circuitId]), cursor: await latestCursor(db, boardId) });
  });

  router.delete('/:boardId/circuits/:circuitId', async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const circuitId = idParam(req, 'circuitId');
    const user = currentUser(req);
    await db.transaction().execute(async (trx) => {
      requireOpen(await requireBoard(trx, boardId));
      const circuit = await findCircuitRow(trx, boardId, circuitId);
      if (!circuit) throw notFound(`Circuit ${circuitId} on board ${boardId}`);
      await deleteCircuit(trx, circuit, user.id);
    });
    res.json({ order: await circuitOrder(db, boardId), cursor: await latestCursor(db, boardId) });
  });

  router.put('/:boardId/circuits/:circuitId/cells/:column', async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const circuitId = idParam(req, 'circuitId');
    const column = req.params.column;
    if (!isReadingKey(column)) {
      const hint = isDetailKey(column) ? ` "${column}" is a circuit detail: change it with PATCH on the circuit.` : '';
      throw new HttpError('bad_request', `There is no reading column "${column}".${hint}`);
    }
    const body = writeCellBodySchema.parse(req.body);
    const user = currentUser(req);
    const text = body.text.trim();
    const reason = body.reason ? body.reason : null;
    const result = await db.transaction().execute(async (trx) => {
      requireOpen(await requireBoard(trx, boardId));
      if (!(await findCircuitRow(trx, boardId, circuitId))) throw notFound(`Circuit ${circuitId} on board ${boardId}`);
      const written = await writeCell(trx, {
        boardId, circuitId, column, text, reason, baseVersion: body.version, userId: user.id, how: body.how ?? 'typed',
      });
      if (!written.ok) {
        const names = await userNames(trx);
        const current = written.current ? toCell(written.current, names) : null;
        const who = current?.updatedBy?.name ?? 'Someone';
        throw new HttpError(
          'conflict',
          `${who} changed this ${columnByKey[column].label} to "${current?.text ?? ''}" meanwhile; keep theirs or write yours again.`,
          { current },
        );
      }
      return written;
    });
    const names = await userNames(db);
    res.json({
      cell: toCell(result.cell, names),
      findings: await boardFindings(boardId, circuitId),
      cursor: result.cursor || (await latestCursor(db, boardId)),
    });
  });

  router.get('/:boardId/history', async (req, res) => {
    const boardId = idParam(req, 'boardId');
    if (!(await findBoardRow(db, boardId))) throw notFound(`Board ${boardId}`);
    const query = boardHistoryQuerySchema.parse(req.query);
    const names = await userNames(db);
    const rows = await boardHistory(db, boardId, { userId: query.person, column: query.column, limit: 500 });
    const everyone = await db.selectFrom('history').select('user_id').distinct().where('board_id', '=', boardId).where('user_id', 'is not', null).execute();
    res.json(
      boardHistoryResponseSchema.parse({
        history: rows.map((r) => ({
          id: r.id,
          circuitId: r.circuit_id,
          circuitNumber: r.circuit_number ?? null,
          column: r.column_key,
          action: r.action,
          oldText: r.old_text,
          newText: r.new_text,
          by: r.user_id ? { id: r.user_id, name: names.get(r.user_id) ?? 'former user' } : null,
          at: r.at,
          how: r.how,
        })),
        people: everyone.map((p) => ({ id: p.user_id!, name: names.get(p.user_id!) ?? 'former user' })),
      }),
    );
  });

  router.get('/:boardId/circuits/:circuitId/cells/:column/history', async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const circuitId = idParam(req, 'circuitId');
    if (!(await findCircuitRow(db, boardId, circuitId))) throw notFound(`Circuit ${circuitId} on board ${boardId}`);
    const names = await userNames(db);
    const rows = await cellHistory(db, circuitId, req.params.column ?? '');
    res.json({
      history: rows.map((r) => ({
        id: r.id,
        oldText: r.old_text,
        newText: r.new_text,
        by: r.user_id ? { id: r.user_id, name: names.get(r.user_id) ?? 'former user' } : null,
        at: r.at,
        how: r.how,
      })),
    });
  });

  return router;
}
