import { checkBoard, checkJob, type JobCheckBoard, type JobCheckInput } from '../shared/checker/index.ts';
import { boardToCheckInput } from '../shared/schemas/check.ts';
import type { JobSectionData, JobRecord } from '../shared/schemas/job-record.ts';
import type { Finding } from '../shared/schemas/findings.ts';
import { loadBoard, loadCircuits } from './db/boards.ts';
import type { DB } from './db/database.ts';
import { loadJobRecord } from './db/job-sections.ts';
import { toSite } from './db/mappers.ts';
import type { JobRow } from './db/types.ts';

/** The record's data without the section versions, as the job rules read it. */
export function recordData(record: JobRecord): JobSectionData {
  return Object.fromEntries(Object.entries(record).map(([key, state]) => [key, state.data])) as JobSectionData;
}

/**
 * The job checker's input for a stored job: its kind, its record, and each of its boards with
 * their circuits and the board checker's own findings. Extend here when a job rule needs more
 * (e.g. the circuits of the job it started from).
 */
export async function loadJobCheckInput(db: DB, job: JobRow, record?: JobRecord): Promise<JobCheckInput> {
  const siteRow = await db.selectFrom('sites').selectAll().where('id', '=', job.site_id).executeTakeFirstOrThrow();
  const site = toSite(siteRow);
  const boardIds = await db.selectFrom('boards').select('id').where('job_id', '=', job.id).orderBy('id').execute();
  const boards: JobCheckBoard[] = [];
  for (const { id } of boardIds) {
    const board = await loadBoard(db, id);
    if (!board) continue;
    const circuits = await loadCircuits(db, id);
    const input = boardToCheckInput({ board, site, circuits });
    boards.push({
      id: board.id,
      reference: board.reference,
      zdbOhm: board.zdbOhm,
      ipfKa: board.ipfKa,
      circuits: input.circuits,
      findings: checkBoard(input),
    });
  }
  return { kind: job.kind, record: recordData(record ?? (await loadJobRecord(db, job.id))), boards };
}

/** The job's own findings (`checkJob`); board findings stay with each board. */
export async function jobFindings(db: DB, job: JobRow, record?: JobRecord): Promise<Finding[]> {
  return checkJob(await loadJobCheckInput(db, job, record));
}
