import { z } from 'zod';

export const earthingArrangements = ['TN-S', 'TN-C-S', 'TT'] as const;
export const jobKinds = ['EIC', 'EICR'] as const;
/**
 * A job's states, in order: being entered → ready for review (a tester submits it) → approved (a
 * reviewer, once every board is locked and the record passes the gate) → issued.
 */
export const jobStates = ['entering', 'ready', 'approved', 'issued'] as const;
export type JobState = (typeof jobStates)[number];
export const jobStateLabels: Record<JobState, string> = {
  entering: 'being entered',
  ready: 'ready for review',
  approved: 'approved',
  issued: 'issued',
};

export const siteSchema = z.object({
  id: z.number().int(),
  client: z.string(),
  address: z.string(),
  description: z.string(),
  /** Occupier or contact: the person the issued document is sent to. */
  contactName: z.string(),
  contactEmail: z.string(),
  earthing: z.enum(earthingArrangements),
  /** Nominal voltage to earth U0 (V). */
  nominalVoltageV: z.number(),
  /** External earth fault loop impedance at the origin (Ω), as measured. */
  zeOhm: z.number().nullable(),
  /** Prospective fault current at the origin (kA). */
  pfcKa: z.number().nullable(),
  version: z.number().int(),
});
export type Site = z.infer<typeof siteSchema>;

export const jobSchema = z.object({
  id: z.number().int(),
  siteId: z.number().int(),
  kind: z.enum(jobKinds),
  reference: z.string(),
  /** First day of the visit (YYYY-MM-DD). */
  visitDate: z.string(),
  /** Last day of the visit when it took more than one day (YYYY-MM-DD), else null. */
  visitEndDate: z.string().nullable(),
  /** General limitations agreed with the client (older field; the record's extent section has the list). */
  limitations: z.string(),
  state: z.enum(jobStates),
  /** The earlier job this one started from, if any. */
  startedFromJobId: z.number().int().nullable(),
  createdAt: z.string(),
  version: z.number().int(),
});
export type Job = z.infer<typeof jobSchema>;

export const siteListResponseSchema = z.object({ sites: z.array(siteSchema) });
export const jobListResponseSchema = z.object({ jobs: z.array(jobSchema) });

// ---- request bodies ----

const dateText = z.iso.date({ error: 'Write the date as YYYY-MM-DD.' });
const emailOrBlank = z.union([z.literal(''), z.email({ error: 'That is not an e-mail address.' })]);

export const siteFieldsSchema = z.object({
  client: z.string({ error: 'Name the client.' }).trim().min(1, 'Name the client.').max(200, 'At most 200 characters.'),
  address: z.string({ error: 'Give the installation address.' }).trim().min(1, 'Give the installation address.').max(400, 'At most 400 characters.'),
  description: z.string().trim().max(400, 'At most 400 characters.'),
  contactName: z.string().trim().max(120, 'At most 120 characters.'),
  contactEmail: emailOrBlank,
  earthing: z.enum(earthingArrangements, { error: 'Choose TN-S, TN-C-S or TT.' }),
  nominalVoltageV: z.number({ error: 'U0 must be a number.' }).positive('U0 must be above 0 V.').max(1000, 'U0 is at most 1000 V.'),
  zeOhm: z.number({ error: 'Ze must be a number.' }).nonnegative('Ze cannot be negative.').max(2000, 'Ze is at most 2000 Ω.').nullable(),
  pfcKa: z.number({ error: 'Ipf must be a number.' }).nonnegative('Ipf cannot be negative.').max(200, 'Ipf is at most 200 kA.').nullable(),
});
export type SiteFields = z.infer<typeof siteFieldsSchema>;

/** A new site: client and address required; the rest default (TN-C-S, 230 V, blanks). */
export const createSiteBodySchema = siteFieldsSchema
  .partial()
  // Required again with their own words (`.required()` would answer a missing one in zod's words).
  .extend({ client: siteFieldsSchema.shape.client, address: siteFieldsSchema.shape.address });
export type CreateSiteBody = z.infer<typeof createSiteBodySchema>;
export const updateSiteBodySchema = z.object({
  version: z.number().int().min(0),
  changes: siteFieldsSchema.partial().refine((c) => Object.keys(c).length > 0, 'Nothing to change.'),
});
export type UpdateSiteBody = z.infer<typeof updateSiteBodySchema>;
export const siteResponseSchema = z.object({ site: siteSchema });

export const createJobBodySchema = z
  .object({
    siteId: z.number({ error: 'Choose the site.' }).int().positive(),
    kind: z.enum(jobKinds, { error: 'Choose EIC or EICR.' }),
    /** Omitted or blank: made by the app from the company's pattern. */
    reference: z.string().trim().max(60, 'At most 60 characters.').optional(),
    visitDate: dateText,
    visitEndDate: dateText.nullable().optional(),
    /** Start from an earlier job on the same site: copy its boards and circuit details. */
    startFromJobId: z.number().int().positive().nullable().optional(),
  })
  .refine((b) => !b.visitEndDate || b.visitEndDate >= b.visitDate, {
    message: 'The last day of the visit cannot be before the first.',
    path: ['visitEndDate'],
  });
export type CreateJobBody = z.infer<typeof createJobBodySchema>;

export const updateJobBodySchema = z.object({
  version: z.number().int().min(0),
  changes: z
    .object({
      reference: z.string().trim().min(1, 'A job needs a reference.').max(60, 'At most 60 characters.'),
      visitDate: dateText,
      visitEndDate: dateText.nullable(),
    })
    .partial()
    .refine((c) => Object.keys(c).length > 0, 'Nothing to change.'),
});
export type UpdateJobBody = z.infer<typeof updateJobBodySchema>;
export const jobResponseSchema = z.object({ job: jobSchema });

export const boardLayouts = ['single-phase', 'three-phase'] as const;
/**
 * A new board on a job: empty with N ways (single-phase 1…N; three-phase N ways numbered per
 * phase, 1L1 1L2 1L3 …), or a copy of another board's circuit details with the readings empty.
 */
export const createBoardBodySchema = z
  .object({
    reference: z.string({ error: 'Give the board a reference.' }).trim().min(1, 'Give the board a reference.').max(60, 'At most 60 characters.'),
    location: z.string().trim().max(120, 'At most 120 characters.').default(''),
    suppliedFrom: z.string().trim().max(120, 'At most 120 characters.').default(''),
    layout: z.enum(boardLayouts, { error: 'Choose single-phase or three-phase.' }),
    ways: z.number({ error: 'Give the number of ways.' }).int('Ways is a whole number.').min(1, 'At least one way.').max(400, 'At most 400 ways.').optional(),
    copyFromBoardId: z.number().int().positive().nullable().optional(),
  })
  .refine((b) => b.copyFromBoardId || b.ways, { message: 'Give the number of ways, or a board to copy.', path: ['ways'] });
export type CreateBoardBody = z.infer<typeof createBoardBodySchema>;
