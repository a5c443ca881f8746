import { Router } from 'express';
import Papa from 'papaparse';
import type { Circuit } from '../../shared/schemas/boards.ts';
import { columns, type ColumnDef } from '../../shared/schemas/columns.ts';
import type { JobExport } from '../../shared/schemas/issues.ts';
import { loadBoard, loadBoardWithContext, loadCircuits } from '../db/boards.ts';
import type { DB } from '../db/database.ts';
import { toJob, toSite } from '../db/mappers.ts';
import { notFound } from '../http-error.ts';
import { loadJobRecord } from '../db/job-sections.ts';
import { ringSocketsSchema } from '../../shared/schemas/ring-sockets.ts';
import { loadRingReadings } from '../db/ring-sockets.ts';
import { idParam } from './params.ts';

/** A column's heading in the CSV: the trade's label with its unit, e.g. "Zs (Ω)". */
export function csvHeading(column: Pick<ColumnDef, 'label' | 'unit'>): string {
  return column.unit ? `${column.label} (${column.unit})` : column.label;
}

function csvValue(circuit: Circuit, column: ColumnDef): string {
  if (column.storage === 'reading') return circuit.cells[column.key as keyof Circuit['cells']]?.text ?? '';
  const value = (circuit as unknown as Record<string, unknown>)[column.key];
  return value === null || value === undefined ? '' : String(value);
}

/**
 * Exports for a user's own records: a board's schedule as CSV, and the whole job as JSON in the
 * API's own shapes. Anyone signed in may export what they can read.
 */
export function exportRoutes(db: DB): Router {
  const router = Router();

  router.get('/boards/:boardId/export.csv', async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const context = await loadBoardWithContext(db, boardId);
    if (!context) throw notFound(`Board ${boardId}`);
    const { board, job, site, circuits } = context;
    const limReasons = (c: Circuit) =>
      Object.entries(c.cells)
        .filter(([, cell]) => cell?.text.trim().toUpperCase() === 'LIM')
        .map(([key, cell]) => `${columns.find((col) => col.key === key)?.label ?? key}: ${cell?.reason ?? ''}`)
        .join('; ');
    const rows: string[][] = [
      ['Schedule of test results', `${job.kind} ${job.reference}`],
      ['Client', site.client],
      ['Installation address', site.address],
      ['Job', job.reference],
      ['Document', job.kind],
      ['Visit date', job.visitEndDate ? `${job.visitDate} to ${job.visitEndDate}` : job.visitDate],
      ['Board', board.reference],
      ['Location', board.location],
      ['Supplied from', board.suppliedFrom],
      ['Phases', String(board.phases)],
      ['Zdb (Ω)', board.zdbOhm === null ? '' : String(board.zdbOhm)],
      ['Ipf (kA)', board.ipfKa === null ? '' : String(board.ipfKa)],
      ['Polarity confirmed', board.polarityConfirmed ? 'yes' : 'no'],
      ['Phase sequence confirmed', board.phaseSequenceConfirmed ? 'yes' : 'no'],
      ['Instruments', board.instruments],
      ['State', board.state === 'locked' ? `locked by ${board.lockedBy?.name ?? ''} at ${board.lockedAt ?? ''}` : 'open'],
      [],
      ['Circuit', 'Phase', ...columns.map(csvHeading), 'LIM reasons'],
      ...circuits.map((c) => [c.number, c.phase ?? '', ...columns.map((col) => csvValue(c, col)), limReasons(c)]),
    ];
    // Rings' socket-by-socket readings (steps 2 and 3 of the ring test), when any were typed.
    const ringRows = circuits.length === 0 ? [] : await db.selectFrom('ring_sockets').select(['circuit_id', 'data']).where('circuit_id', 'in', circuits.map((c) => c.id)).execute();
    const socketRows: string[][] = [];
    for (const c of circuits) {
      const stored = ringRows.find((r) => r.circuit_id === c.id);
      const sockets = stored ? ringSocketsSchema.safeParse(JSON.parse(stored.data)) : null;
      if (!sockets?.success) continue;
      sockets.data.forEach((s, i) => socketRows.push([c.number, String(i + 1), s.label, s.position === null ? '' : String(s.position), s.lineNeutral, s.lineCpc]));
    }
    if (socketRows.length > 0) rows.push([], ['Ring socket readings'], ['Circuit', 'Socket', 'Label', 'Position along the ring (0–1)', 'L-N (Ω)', 'L-cpc (Ω)'], ...socketRows);
    // A byte-order mark so spreadsheet programs read the file as UTF-8 (Ω, ✓, mm²). Cells that
    // begin like a formula are escaped so opening the file never runs one.
    const csv = '\uFEFF' + Papa.unparse(rows, { escapeFormulae: true, newline: '\r\n' });
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.attachment(`${fileName(job.reference)}-${fileName(board.reference)}.csv`);
    res.send(csv);
  });

  router.get('/jobs/:jobId/export.json', async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const jobRow = await db.selectFrom('jobs').selectAll().where('id', '=', jobId).executeTakeFirst();
    if (!jobRow) throw notFound(`Job ${jobId}`);
    const siteRow = await db.selectFrom('sites').selectAll().where('id', '=', jobRow.site_id).executeTakeFirstOrThrow();
    const boardIds = await db.selectFrom('boards').select('id').where('job_id', '=', jobId).orderBy('id').execute();
    const boards: JobExport['boards'] = [];
    for (const { id } of boardIds) {
      const board = await loadBoard(db, id);
      if (!board) continue;
      const circuits = await loadCircuits(db, id);
      boards.push({ board, circuits, ringSockets: await loadRingReadings(db, circuits) });
    }
    // Built in the schema's shape (tests parse it back with `jobExportSchema`).
    const body: JobExport = {
      format: 'boardwalk-job',
      formatVersion: 1,
      exportedAt: new Date().toISOString(),
      job: toJob(jobRow),
      site: toSite(siteRow),
      record: await loadJobRecord(db, jobId),
      boards,
    };
    res.setHeader('Content-Type', 'application/json; charset=utf-8');
    res.attachment(`${fileName(jobRow.reference)}.json`);
    res.send(JSON.stringify(body, null, 2));
  });

  return router;
}

function fileName(text: string): string {
  return text.replace(/[^A-Za-z0-9._-]+/g, '_').slice(0, 60) || 'export';
}
