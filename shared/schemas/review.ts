import { z } from 'zod';
import { boardSchema } from './boards.ts';
import { findingSchema, type Finding } from './findings.ts';
import { ringReadingsSchema } from './ring-sockets.ts';
import { jobSchema, siteSchema } from './sites.ts';

/**
 * A finding's identity across re-checks: the same board, circuit, code and columns. A reviewer's
 * acceptance is stored under this key, so it still applies after unrelated edits and lapses when
 * the finding goes away or changes its code.
 */
export function findingKey(boardId: number | null, finding: Pick<Finding, 'circuitId' | 'code' | 'columns'>): string {
  return `${boardId ?? 'job'}:${finding.circuitId ?? '-'}:${finding.code}:${[...finding.columns].sort().join(',')}`;
}

// ---- review: job states, the completeness gate, accepted findings, the queue ----
// (request and response shapes of server/routes/review.ts)


const personRef = z.object({ id: z.number().int(), name: z.string() });

/** `POST /api/jobs/:jobId/submit`: a note for the reviewer (may be empty). */
export const submitJobBodySchema = z.object({
  note: z.string().trim().max(1000, 'At most 1000 characters.').default(''),
});
/** `POST /api/jobs/:jobId/approve`: an optional note kept in the history. */
export const approveJobBodySchema = z.object({
  note: z.string().trim().max(1000, 'At most 1000 characters.').default(''),
});
/** `POST /api/jobs/:jobId/send-back`: why the job goes back to being entered. */
export const sendBackJobBodySchema = z.object({
  reason: z
    .string({ error: 'Say why the job is sent back.' })
    .trim()
    .min(5, 'Say why the job is sent back (at least 5 characters).')
    .max(1000, 'At most 1000 characters.'),
});
export const jobStateResponseSchema = z.object({ job: jobSchema });

/** One board's gate: whether it can be locked now, and every reason it cannot. */
export const boardGateSchema = z.object({
  boardId: z.number().int(),
  reference: z.string(),
  state: z.enum(['open', 'locked']),
  canLock: z.boolean(),
  reasons: z.array(z.string()),
});
export type BoardGate = z.infer<typeof boardGateSchema>;

/** A finding a reviewer accepted with a written reason. */
export const findingAcceptanceSchema = z.object({
  id: z.number().int(),
  /** Null for a finding about the job record as a whole. */
  boardId: z.number().int().nullable(),
  findingKey: z.string(),
  code: z.string(),
  /** The finding's message when it was accepted. */
  message: z.string(),
  reason: z.string(),
  acceptedBy: personRef,
  acceptedAt: z.string(),
});
export type FindingAcceptance = z.infer<typeof findingAcceptanceSchema>;
export const acceptanceListResponseSchema = z.object({ acceptances: z.array(findingAcceptanceSchema) });

/** `GET /api/boards/:boardId/gate`: the board's gate and the board's accepted findings. */
export const boardGateResponseSchema = z.object({
  gate: boardGateSchema,
  acceptances: z.array(findingAcceptanceSchema),
});

/** `GET /api/jobs/:jobId/gate`: why the job cannot be approved yet, and each board's gate. */
export const jobGateResponseSchema = z.object({
  jobId: z.number().int(),
  state: z.enum(['entering', 'ready', 'approved', 'issued']),
  canApprove: z.boolean(),
  reasons: z.array(z.string()),
  boards: z.array(boardGateSchema),
  /** The newest change of state, with who, when and the note or reason (GET /gate only). */
  lastChange: z
    .object({ from: z.string(), to: z.string(), by: personRef.nullable(), at: z.string(), reason: z.string().nullable() })
    .nullable()
    .optional(),
});
export type JobGate = z.infer<typeof jobGateResponseSchema>;

export const acceptanceReasonSchema = z
  .string({ error: 'Say why the finding is accepted.' })
  .trim()
  .min(10, 'Say why in words (at least 10 characters), e.g. "recorded as observation 4, C2".')
  .max(500, 'At most 500 characters.');

/** `POST /api/jobs/:jobId/acceptances`: accept one error finding (reviewers and admins). */
export const acceptFindingBodySchema = z.object({
  boardId: z.number({ error: 'Give the board (or null for a finding about the job record).' }).int().positive().nullable(),
  findingKey: z.string({ error: 'Name the finding (its key).' }).min(1).max(400),
  reason: acceptanceReasonSchema,
});
export type AcceptFindingBody = z.infer<typeof acceptFindingBodySchema>;
export const acceptanceResponseSchema = z.object({ acceptance: findingAcceptanceSchema });

/** A finding as the review screen shows it: its key, whether it may be accepted, and its acceptance. */
export const reviewFindingSchema = findingSchema.extend({
  key: z.string(),
  /** The circuit's number, when the finding is about a circuit. */
  circuitNumber: z.string().nullable(),
  /** True, or why it cannot be accepted. */
  acceptable: z.union([z.literal(true), z.string()]),
  acceptance: findingAcceptanceSchema.nullable(),
});
export type ReviewFinding = z.infer<typeof reviewFindingSchema>;

/** Counts a reviewer sees first: error findings still open, warnings, readings not yet recorded. */
export const reviewCountsSchema = z.object({
  errors: z.number().int(),
  accepted: z.number().int(),
  warnings: z.number().int(),
  missingReadings: z.number().int(),
});
export type ReviewCounts = z.infer<typeof reviewCountsSchema>;

/** Who submitted the job for review, when, and their note. */
export const submissionSchema = z.object({ by: personRef.nullable(), at: z.string(), note: z.string() });

/** `GET /api/review/queue`: jobs ready for review, oldest submission first. */
export const reviewQueueResponseSchema = z.object({
  jobs: z.array(
    z.object({
      job: jobSchema,
      site: z.object({ id: z.number().int(), client: z.string(), address: z.string() }),
      submitted: submissionSchema.nullable(),
      boardCount: z.number().int(),
      lockedBoards: z.number().int(),
      counts: reviewCountsSchema,
    }),
  ),
});
export type ReviewQueue = z.infer<typeof reviewQueueResponseSchema>;

/**
 * `GET /api/review/jobs/:jobId`: everything the review screen shows of one job: its boards with
 * every finding (accepted ones marked), the job's own findings, the record, and the gate.
 */
export const reviewJobResponseSchema = z.object({
  job: jobSchema,
  site: siteSchema,
  submitted: submissionSchema.nullable(),
  boards: z.array(
    z.object({
      board: boardSchema,
      circuitCount: z.number().int(),
      findings: z.array(reviewFindingSchema),
      counts: reviewCountsSchema,
      missingByColumn: z.record(z.string(), z.number().int()),
      gate: boardGateSchema,
      /** The board's rings with socket-by-socket readings, and the checker's diagnosis (optional: older servers). */
      rings: z.array(ringReadingsSchema).optional(),
    }),
  ),
  jobFindings: z.array(reviewFindingSchema),
  /** The job record's sections (shared/schemas/job-record.ts), as stored. */
  record: z.record(z.string(), z.unknown()),
  gate: jobGateResponseSchema,
});
export type ReviewJob = z.infer<typeof reviewJobResponseSchema>;
