/**
 * A ring's socket-by-socket readings: `GET` and `PUT /api/boards/:boardId/circuits/:circuitId/ring-sockets`.
 * Only for a ring final circuit; a write carries the version it saw (409 with the current list
 * otherwise), is refused on a locked board (423), and appends a `ring-sockets` history row.
 */
import { Router } from 'express';
import { ringSocketsSchema, writeRingSocketsBodySchema } from '../../shared/schemas/ring-sockets.ts';
import { findCircuitRow } from '../db/circuits.ts';
import type { DB } from '../db/database.ts';
import { appendHistory } from '../db/history.ts';
import { HttpError, notFound } from '../http-error.ts';
import { currentUser } from '../middleware/auth.ts';
import { requireBoard, requireOpen } from './boards.ts';
import { idParam } from './params.ts';

async function load(db: DB, circuitId: number) {
  const row = await db.selectFrom('ring_sockets').selectAll().where('circuit_id', '=', circuitId).executeTakeFirst();
  if (!row) return { sockets: [], version: 0 };
  const parsed = ringSocketsSchema.safeParse(JSON.parse(row.data));
  return { sockets: parsed.success ? parsed.data : [], version: row.version };
}

export function ringSocketRoutes(db: DB): Router {
  const router = Router();

  router.get('/boards/:boardId/circuits/:circuitId/ring-sockets', async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const circuitId = idParam(req, 'circuitId');
    if (!(await findCircuitRow(db, boardId, circuitId))) throw notFound(`Circuit ${circuitId} on board ${boardId}`);
    res.json(await load(db, circuitId));
  });

  router.put('/boards/:boardId/circuits/:circuitId/ring-sockets', async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const circuitId = idParam(req, 'circuitId');
    const body = writeRingSocketsBodySchema.parse(req.body);
    const user = currentUser(req);
    const answer = await db.transaction().execute(async (trx) => {
      const board = await requireBoard(trx, boardId);
      requireOpen(board);
      const circuit = await findCircuitRow(trx, boardId, circuitId);
      if (!circuit) throw notFound(`Circuit ${circuitId} on board ${boardId}`);
      if (circuit.kind !== 'ring') throw new HttpError('bad_request', `Circuit ${circuit.number} is not a ring final circuit: socket-by-socket readings are for rings.`);
      const current = await load(trx, circuitId);
      const text = JSON.stringify(body.sockets);
      if (JSON.stringify(current.sockets) === text) return current;
      if (current.version !== body.version) {
        throw new HttpError('conflict', `Someone changed the socket readings of circuit ${circuit.number} meanwhile; look again and retry.`, { current });
      }
      const version = current.version + 1;
      const now = new Date().toISOString();
      if (current.version === 0) {
        await trx.insertInto('ring_sockets').values({ circuit_id: circuitId, data: text, version, updated_by: user.id, updated_at: now }).execute();
      } else {
        await trx.updateTable('ring_sockets').set({ data: text, version, updated_by: user.id, updated_at: now }).where('circuit_id', '=', circuitId).execute();
      }
      await appendHistory(trx, {
        board_id: boardId,
        circuit_id: circuitId,
        column_key: null,
        action: 'ring-sockets',
        old_text: JSON.stringify(current.sockets),
        new_text: text,
        user_id: user.id,
        how: 'typed',
        version,
        at: now,
      });
      return { sockets: body.sockets, version };
    });
    res.json(answer);
  });

  return router;
}
