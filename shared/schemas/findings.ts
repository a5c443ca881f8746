import { z } from 'zod';

/**
 * How much a finding matters. `error`, `warning` and `note` are findings about values that were
 * typed (or board details); `todo` is a reading the schedule still needs and nobody has recorded
 * yet. A `todo` blocks locking as an error does, but an unfinished board is mostly todo, so it is
 * counted per column rather than listed among the faults.
 */
export const severities = ['error', 'warning', 'note', 'todo'] as const;
export const severitySchema = z.enum(severities);
export type Severity = z.infer<typeof severitySchema>;

/** One finding of the checker. */
export const findingSchema = z.object({
  /** Stable code, e.g. `zs-over-max`. */
  code: z.string(),
  severity: severitySchema,
  /** The circuit it concerns; null for a finding about the board as a whole. */
  circuitId: z.number().int().nullable(),
  /** Column keys (see columns.ts) the finding points at; may be empty. */
  columns: z.array(z.string()),
  /** One line in the tester's words. */
  message: z.string(),
  /** The limit compared against, as text with its unit (e.g. "≤ 1.37 Ω"); null when none. */
  limit: z.string().nullable(),
  /** Where the limit comes from: a standard's table, a formula, or "common practice". */
  source: z.string().nullable(),
  /** Job findings only: the board it concerns (null or absent for the job record as a whole). */
  boardId: z.number().int().nullable().optional(),
  /** Job findings only: the section of the job record (see job-record.ts) and the field in it. */
  section: z.string().optional(),
  field: z.string().optional(),
});
export type Finding = z.infer<typeof findingSchema>;
