/**
 * What the completeness gate and the review screen need, read from the database: each board's
 * findings with the reviewer's acceptances, the job's own findings and its record, and the gate's
 * reasons (shared/review/gate.ts, the same functions the client shows).
 */
import { checkJob } from '../../shared/checker/index.ts';
import { acceptability, boardLockReasons, gateFindingKey, isMissingReading, jobApprovalReasons, missingReadingCounts } from '../../shared/review/gate.ts';
import { boardToCheckInput } from '../../shared/schemas/check.ts';
import type { Finding } from '../../shared/schemas/findings.ts';
import type { JobSectionData } from '../../shared/schemas/job-record.ts';
import type { BoardGate, JobGate, ReviewCounts, ReviewFinding, FindingAcceptance } from '../../shared/schemas/review.ts';
import { loadBoardWithContext, type BoardWithContext } from '../db/boards.ts';
import type { DB } from '../db/database.ts';
import { loadJobRecord } from '../db/job-sections.ts';
import { listAcceptanceRows, toAcceptance } from '../db/review.ts';
import type { FindingAcceptanceRow, JobRow } from '../db/types.ts';
import { userNames } from '../db/users.ts';
import { findingsFor } from '../findings.ts';
import { recordData } from '../job-findings.ts';

export interface BoardReview {
  context: BoardWithContext;
  findings: Finding[];
  acceptances: FindingAcceptanceRow[];
  gate: BoardGate;
}

function acceptedKeysOf(rows: readonly FindingAcceptanceRow[]): Set<string> {
  return new Set(rows.map((r) => r.finding_key));
}

function boardGateOf(context: BoardWithContext, findings: readonly Finding[], acceptances: readonly FindingAcceptanceRow[]): BoardGate {
  const reasons = boardLockReasons({
    board: context.board,
    circuits: context.circuits,
    findings,
    acceptedKeys: acceptedKeysOf(acceptances),
  });
  return { boardId: context.board.id, reference: context.board.reference, state: context.board.state, canLock: reasons.length === 0, reasons };
}

/** A board's findings, its accepted findings and its gate; undefined when there is no such board. */
export async function reviewBoard(db: DB, boardId: number): Promise<BoardReview | undefined> {
  const context = await loadBoardWithContext(db, boardId);
  if (!context) return undefined;
  const findings = findingsFor(context);
  const acceptances = await listAcceptanceRows(db, context.board.jobId, boardId);
  return { context, findings, acceptances, gate: boardGateOf(context, findings, acceptances) };
}

export interface JobReview {
  job: JobRow;
  record: JobSectionData;
  boards: BoardReview[];
  jobFindings: Finding[];
  /** Acceptances of the job's own findings (board null). */
  jobAcceptances: FindingAcceptanceRow[];
  gate: JobGate;
}

/** Every board of a job with its gate, the job's findings and record, and the job's gate. */
export async function reviewJob(db: DB, job: JobRow): Promise<JobReview> {
  const boardIds = await db.selectFrom('boards').select('id').where('job_id', '=', job.id).orderBy('reference').orderBy('id').execute();
  const boards: BoardReview[] = [];
  for (const { id } of boardIds) {
    const review = await reviewBoard(db, id);
    if (review) boards.push(review);
  }
  const record = recordData(await loadJobRecord(db, job.id));
  const jobFindings = checkJob({
    kind: job.kind,
    record,
    boards: boards.map((b) => ({
      id: b.context.board.id,
      reference: b.context.board.reference,
      zdbOhm: b.context.board.zdbOhm,
      ipfKa: b.context.board.ipfKa,
      circuits: boardToCheckInput(b.context).circuits,
      findings: b.findings,
    })),
  });
  const jobAcceptances = (await listAcceptanceRows(db, job.id)).filter((a) => a.board_id === null);
  const reasons = jobApprovalReasons({
    kind: job.kind,
    record,
    boards: boards.map((b) => ({ id: b.context.board.id, reference: b.context.board.reference, state: b.context.board.state })),
    jobFindings,
    acceptedKeys: acceptedKeysOf(jobAcceptances),
  });
  return {
    job,
    record,
    boards,
    jobFindings,
    jobAcceptances,
    gate: { jobId: job.id, state: job.state, canApprove: reasons.length === 0, reasons, boards: boards.map((b) => b.gate) },
  };
}

/** Error findings still open (neither accepted nor a missing reading), accepted ones, warnings and missing readings. */
export function reviewCounts(findings: readonly Finding[], acceptedKeys: ReadonlySet<string>, keyOf: (f: Finding) => string): ReviewCounts {
  let errors = 0;
  let accepted = 0;
  let warnings = 0;
  for (const f of findings) {
    if (isMissingReading(f)) continue;
    if (f.severity === 'error') {
      if (acceptedKeys.has(keyOf(f))) accepted++;
      else errors++;
    } else if (f.severity === 'warning') warnings++;
  }
  return { errors, accepted, warnings, missingReadings: missingReadingCounts(findings).total };
}

/** The review screen's shape of one finding: its key, whether it can be accepted, its acceptance. */
export function toReviewFindings(
  boardId: number | null,
  findings: readonly Finding[],
  acceptances: readonly FindingAcceptance[],
  circuitNumbers: ReadonlyMap<number, string>,
): ReviewFinding[] {
  const byKey = new Map(acceptances.map((a) => [a.findingKey, a]));
  return findings.map((f) => {
    const key = gateFindingKey(boardId, f);
    return {
      ...f,
      key,
      circuitNumber: f.circuitId === null ? null : (circuitNumbers.get(f.circuitId) ?? null),
      acceptable: acceptability(f),
      acceptance: byKey.get(key) ?? null,
    };
  });
}

export async function acceptancesOf(db: DB, rows: readonly FindingAcceptanceRow[]): Promise<FindingAcceptance[]> {
  const names = await userNames(db);
  return rows.map((r) => toAcceptance(r, names));
}
