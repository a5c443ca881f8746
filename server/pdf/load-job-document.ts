import type { Board, Circuit } from '../../shared/schemas/boards.ts';
import type { Company } from '../../shared/schemas/company.ts';
import { nextInspectionDate, overallAssessment, type JobRecord, type OverallAssessment } from '../../shared/schemas/job-record.ts';
import type { RingReadings } from '../../shared/schemas/ring-sockets.ts';
import type { Job, Site } from '../../shared/schemas/sites.ts';
import { loadBoard, loadCircuits } from '../db/boards.ts';
import { loadCompany } from '../db/company.ts';
import type { DB } from '../db/database.ts';
import { loadJobRecord } from '../db/job-sections.ts';
import { toJob, toSite } from '../db/mappers.ts';
import { signaturesInUse } from '../db/signature-revisions.ts';
import type { SignatureRow } from '../db/types.ts';
import { loadRingReadings } from '../db/ring-sockets.ts';
import { userNames } from '../db/users.ts';
import { readStoredFile } from './stored-files.ts';

/** An image to place in the document (PNG or JPEG bytes, which pdfkit embeds as they are). */
export interface DocumentImage {
  bytes: Buffer;
  mime: string;
}

export interface DocumentSignature {
  role: SignatureRow['role'];
  name: string;
  signedAt: string;
  signedBy: string;
  /** Null when the image cannot be read or is not PNG/JPEG (the page says so). */
  image: DocumentImage | null;
}

export interface DocumentAcceptance {
  boardReference: string | null;
  code: string;
  message: string;
  reason: string;
  acceptedBy: string;
  acceptedAt: string;
}

/** Everything an issued document shows, gathered from the database in one place. */
export interface JobDocument {
  job: Job;
  site: Site;
  record: JobRecord;
  /** Each board with its circuits and its rings' socket readings (rings that have any). */
  boards: { board: Board; circuits: Circuit[]; rings: RingReadings[] }[];
  assessment: { assessment: OverallAssessment; reason: string };
  /** The recommended date of the next inspection, or null when no interval is given. */
  nextInspection: string | null;
  signatures: DocumentSignature[];
  company: Company;
  logo: DocumentImage | null;
  acceptances: DocumentAcceptance[];
}

const embeddable = new Set(['image/png', 'image/jpeg']);

/** Loads every part of a job's document. Undefined when the job does not exist. */
export async function loadJobDocument(db: DB, jobId: number, dataDir: string): Promise<JobDocument | undefined> {
  const jobRow = await db.selectFrom('jobs').selectAll().where('id', '=', jobId).executeTakeFirst();
  if (!jobRow) return undefined;
  const siteRow = await db.selectFrom('sites').selectAll().where('id', '=', jobRow.site_id).executeTakeFirstOrThrow();
  const job = toJob(jobRow);
  const record = await loadJobRecord(db, jobId);
  const names = await userNames(db);

  const boardRows = await db.selectFrom('boards').select(['id']).where('job_id', '=', jobId).orderBy('id').execute();
  const boards: JobDocument['boards'] = [];
  for (const { id } of boardRows) {
    const board = await loadBoard(db, id);
    if (!board) continue;
    const circuits = await loadCircuits(db, id);
    boards.push({ board, circuits, rings: await loadRingReadings(db, circuits) });
  }
  const boardReference = new Map(boards.map((b) => [b.board.id, b.board.reference]));

  const image = async (fileId: number | null): Promise<DocumentImage | null> => {
    if (fileId === null) return null;
    const file = await readStoredFile(db, dataDir, fileId);
    return file && embeddable.has(file.row.mime) ? { bytes: file.bytes, mime: file.row.mime } : null;
  };

  // The latest signature of each role given since the job was last reopened counts (a person may
  // sign again after a change; signatures given for an earlier revision never count again).
  const signatures: DocumentSignature[] = [];
  for (const row of await signaturesInUse(db, jobId)) {
    signatures.push({
      role: row.role,
      name: row.name,
      signedAt: row.signed_at,
      signedBy: names.get(row.user_id) ?? 'former user',
      image: await image(row.file_id),
    });
  }

  const company = await loadCompany(db);

  const acceptanceRows = await db.selectFrom('finding_acceptances').selectAll().where('job_id', '=', jobId).orderBy('id').execute();

  return {
    job,
    site: toSite(siteRow),
    record,
    boards,
    assessment: overallAssessment(record.observations.data),
    // From the last day of the visit, as the job screen counts it.
    nextInspection: nextInspectionDate(job.visitEndDate ?? job.visitDate, record.summary.data.nextInspectionMonths),
    signatures,
    company,
    logo: await image(company.logoFileId),
    acceptances: acceptanceRows.map((row) => ({
      boardReference: row.board_id === null ? null : (boardReference.get(row.board_id) ?? null),
      code: row.code,
      message: row.message,
      reason: row.reason,
      acceptedBy: names.get(row.accepted_by) ?? 'former user',
      acceptedAt: row.accepted_at,
    })),
  };
}
