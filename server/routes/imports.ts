import { Router } from 'express';
import { importBatchBodySchema, saveMappingBodySchema, type ImportReadResponse } from '../../shared/schemas/import.ts';
import { columnByKey } from '../../shared/schemas/columns.ts';
import { proposeMapping } from '../../shared/import/map-columns.ts';
import { readTable } from '../../shared/import/read-table.ts';
import { loadBoardWithContext } from '../db/boards.ts';
import { writeCell } from '../db/cells.ts';
import type { DB } from '../db/database.ts';
import { appendHistory, latestCursor } from '../db/history.ts';
import { deleteMapping, findMapping, listMappings, saveMapping } from '../db/import-mappings.ts';
import { userNames } from '../db/users.ts';
import { singleUpload, type UploadedFile } from '../files.ts';
import { findingsFor } from '../findings.ts';
import { HttpError, notFound } from '../http-error.ts';
import { currentUser } from '../middleware/auth.ts';
import { requireBoard, requireOpen } from './boards.ts';
import { idParam } from './params.ts';

/** Largest readings file taken: a 300-way board's file is about 40 kB. */
export const maxImportBytes = 2 * 1024 * 1024;

/**
 * Importing an instrument's readings file into a board:
 * - `POST /api/boards/:boardId/import/read` (multipart, field `file`): reads the file (nothing is
 *   stored or written) and answers the table with a proposed mapping, or a refusal in words;
 * - `POST /api/boards/:boardId/import`: the confirmed writes (or the undoing of an import) in one
 *   transaction, every cell through the versioned cell write with how = imported; any cell changed
 *   by someone since the preview refuses the whole import (409) and nothing is written;
 * - `/api/import-mappings`: mappings saved under a name, the person's own or the company's.
 */
export function importRoutes(db: DB): Router {
  const router = Router();

  router.post(
    '/boards/:boardId/import/read',
    async (req, _res, next) => {
      // Refuse a board that cannot take the readings before reading the upload.
      const board = await requireBoard(db, idParam(req, 'boardId'));
      requireOpen(board);
      next();
    },
    ...singleUpload({ field: 'file', maxBytes: maxImportBytes, types: null, what: 'the readings file' }),
    async (_req, res) => {
      const upload = res.locals.upload as UploadedFile;
      const result = readTable(upload.bytes, upload.originalName || 'readings file');
      if (!result.ok) throw new HttpError(result.refusal.code === 'unknown-encoding' ? 'unsupported_type' : 'bad_request', result.refusal.message, { reason: result.refusal.code });
      const proposal = proposeMapping(result.table);
      if (!proposal.some((p) => p.target !== 'circuit' && p.target !== 'ignore')) {
        throw new HttpError(
          'bad_request',
          `No column of this file could be a reading: its columns are ${result.table.headers.map((h) => `"${h}"`).join(', ')}, and none is named like a reading or holds values shaped like one.`,
          { reason: 'no-readings' },
        );
      }
      const answer: ImportReadResponse = { table: result.table, proposal };
      res.json(answer);
    },
  );

  router.post('/boards/:boardId/import', async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const body = importBatchBodySchema.parse(req.body);
    const user = currentUser(req);
    const seen = new Set<string>();
    for (const w of body.writes) {
      const key = `${w.circuitId}:${w.column}`;
      if (seen.has(key)) throw new HttpError('bad_request', `The import writes circuit ${w.circuitId}'s ${columnByKey[w.column].label} twice; send each cell once.`);
      seen.add(key);
    }
    const written = await db.transaction().execute(async (trx) => {
      const board = await requireBoard(trx, boardId);
      requireOpen(board);
      const circuits = await trx.selectFrom('circuits').select(['id', 'number']).where('board_id', '=', boardId).execute();
      const numberById = new Map(circuits.map((c) => [c.id, c.number]));
      const stray = body.writes.find((w) => !numberById.has(w.circuitId));
      if (stray) throw new HttpError('bad_request', `Circuit ${stray.circuitId} is not on board ${board.reference}; nothing was imported.`);
      const conflicts: Array<{ circuitId: number; circuit: string; column: string; current: string }> = [];
      let count = 0;
      // The board's cells in one query, inside the transaction (SQLite's write lock is held from the
      // first write on, and this read sees the same state the writes will).
      const existing = await trx
        .selectFrom('cells')
        .innerJoin('circuits', 'circuits.id', 'cells.circuit_id')
        .selectAll('cells')
        .where('circuits.board_id', '=', boardId)
        .execute();
      const cellsByKey = new Map(existing.map((c) => [`${c.circuit_id}:${c.column_key}`, c]));
      for (const w of body.writes) {
        const result = await writeCell(trx, {
          boardId, circuitId: w.circuitId, column: w.column, text: w.text.trim(), reason: w.reason ?? null, baseVersion: w.version, userId: user.id, how: 'imported',
          current: cellsByKey.get(`${w.circuitId}:${w.column}`) ?? null,
        });
        if (!result.ok) conflicts.push({ circuitId: w.circuitId, circuit: numberById.get(w.circuitId)!, column: w.column, current: result.current?.text ?? '' });
        else if (result.cursor) count += 1;
      }
      if (conflicts.length > 0) {
        const first = conflicts[0]!;
        throw new HttpError(
          'conflict',
          `${conflicts.length} cell${conflicts.length === 1 ? '' : 's'} changed since the preview (first: circuit ${first.circuit} ${columnByKey[first.column as keyof typeof columnByKey].label} is now "${first.current}"); nothing was imported. Look at the preview again.`,
          { conflicts },
        );
      }
      // One entry for the whole import beside its cells' own: the board's history shows it as one step.
      await appendHistory(trx, {
        board_id: boardId, circuit_id: null, column_key: null, action: body.action === 'undo' ? 'import-undone' : 'import',
        old_text: null, new_text: `${count} reading${count === 1 ? '' : 's'} ${body.action === 'undo' ? 'put back as before the import of' : 'imported from'} ${body.fileName}`,
        user_id: user.id, how: 'imported', version: null,
      });
      return count;
    });
    const context = await loadBoardWithContext(db, boardId);
    if (!context) throw notFound(`Board ${boardId}`);
    const changed = new Set(body.writes.map((w) => w.circuitId));
    res.json({
      written,
      cursor: await latestCursor(db, boardId),
      board: context.board,
      circuits: context.circuits.filter((c) => changed.has(c.id)),
      order: context.circuits.map((c) => c.id),
      findings: findingsFor(context),
      present: [],
    });
  });

  router.get('/import-mappings', async (req, res) => {
    const user = currentUser(req);
    res.json({ mappings: await listMappings(db, user.id, await userNames(db)) });
  });

  router.post('/import-mappings', async (req, res) => {
    const user = currentUser(req);
    const body = saveMappingBodySchema.parse(req.body);
    const id = await saveMapping(db, user.id, body);
    const mappings = await listMappings(db, user.id, await userNames(db));
    res.status(201).json({ mapping: mappings.find((m) => m.id === id), mappings });
  });

  router.delete('/import-mappings/:mappingId', async (req, res) => {
    const user = currentUser(req);
    const row = await findMapping(db, idParam(req, 'mappingId'));
    if (!row || (row.owner_id !== null && row.owner_id !== user.id)) throw notFound('That mapping');
    if (row.owner_id === null && row.created_by !== user.id && user.role !== 'admin') {
      throw new HttpError('forbidden', 'Only the person who saved a company mapping, or an admin, may remove it.');
    }
    await deleteMapping(db, row.id);
    res.json({ mappings: await listMappings(db, user.id, await userNames(db)) });
  });

  return router;
}
