import { z } from 'zod';
import { jobKinds, jobStates, type JobState } from './sites.ts';

/** The declaration's people who sign: an EIC's designer, constructor and inspector; both documents' reviewer. */
export const signingRoles = ['designer', 'constructor', 'inspector', 'reviewer'] as const;
export type SigningRole = (typeof signingRoles)[number];
export const signingRoleLabels: Record<SigningRole, string> = {
  designer: 'designer',
  constructor: 'constructor',
  inspector: 'inspector (inspection and testing)',
  reviewer: 'reviewer',
};

/** Which roles sign which document. */
export const signingRolesFor = (kind: (typeof jobKinds)[number]): SigningRole[] =>
  kind === 'EIC' ? ['designer', 'constructor', 'inspector', 'reviewer'] : ['inspector', 'reviewer'];

/** Largest signature image accepted (bytes). A drawn signature is a few kilobytes. */
export const maxSignatureBytes = 512 * 1024;

/**
 * The form fields of `POST /api/jobs/:jobId/signatures` (multipart: these, and the image in the
 * field `image`, a PNG or JPEG checked by content).
 */
export const signBodySchema = z.object({
  role: z.enum(signingRoles, { error: 'Choose whom you sign as: designer, constructor, inspector or reviewer.' }),
  name: z.string().trim().min(1, 'Type your name as it should appear beside the signature.').max(120, 'At most 120 characters.'),
});
export type SignBody = z.infer<typeof signBodySchema>;

export const signatureSchema = z.object({
  id: z.number().int(),
  jobId: z.number().int(),
  role: z.enum(signingRoles),
  /** The name typed when signing. */
  name: z.string(),
  /** The image: `GET /api/files/:fileId`. */
  fileId: z.number().int(),
  signedBy: z.object({ id: z.number().int(), name: z.string() }),
  signedAt: z.string(),
  /**
   * True for the one signature of its role that counts for the revision in hand: the newest given
   * since the job was last reopened. False once the same role signed again later, and for every
   * signature given for an earlier revision (kept, listed, never used again).
   */
  current: z.boolean(),
  /** The revision this signature was given for (1 until the job is first reopened after issue). */
  revision: z.number().int().positive(),
});
export type Signature = z.infer<typeof signatureSchema>;

/** `GET /api/jobs/:jobId/signatures`: every signature, newest first, and what may be signed. */
export const jobSignaturesResponseSchema = z.object({
  signatures: z.array(signatureSchema),
  jobKind: z.enum(jobKinds),
  jobState: z.enum(jobStates),
  /** The roles this document has, in order. */
  roles: z.array(z.enum(signingRoles)),
  /** The revision being prepared, or the one issued while the job is issued. */
  revision: z.number().int().positive(),
  /**
   * The latest reopening of the issued job, or null if it never was: from then on the signatures
   * given for `revision - 1` no longer count, because the document may change before it is issued again.
   */
  reopened: z
    .object({ at: z.string(), by: z.object({ id: z.number().int(), name: z.string() }), reason: z.string().nullable(), revision: z.number().int().positive() })
    .nullable(),
});
export type JobSignatures = z.infer<typeof jobSignaturesResponseSchema>;

export const signatureResponseSchema = z.object({ signature: signatureSchema });

/** Why signing is refused: the API's error code and the reason in words. */
export interface SigningRefusal {
  code: 'bad_request' | 'forbidden' | 'conflict' | 'locked';
  message: string;
}

/**
 * Why a person may not sign as `role` on a job in `state`; null when they may. Shared so the panel
 * can say it before anyone tries; the server decides.
 *
 * - An issued job is frozen (423): a reviewer reopens it (a new revision) before anyone signs again.
 * - A role the document does not have is a mistake (400): an EICR has no designer or constructor.
 * - Only a reviewer, or an admin (who can do what a reviewer can), signs as the reviewer (403), and
 *   only once the job has been submitted for review (409).
 * - Anyone signed in may sign as the EIC's designer or constructor or as the inspector: these are
 *   the people who did the work, whatever their role in Boardwalk.
 */
export function signingRefusal(
  personRole: 'admin' | 'tester' | 'reviewer',
  role: SigningRole,
  job: { kind: (typeof jobKinds)[number]; state: JobState },
): SigningRefusal | null {
  if (job.state === 'issued') {
    return { code: 'locked', message: 'This job is issued and frozen; a reviewer must reopen it before anyone signs again.' };
  }
  const roles = signingRolesFor(job.kind);
  if (!roles.includes(role)) {
    return { code: 'bad_request', message: `An ${job.kind} is not signed by a ${role}; sign as ${roles.join(', ').replace(/, ([^,]*)$/, ' or $1')}.` };
  }
  if (role === 'reviewer') {
    if (personRole === 'tester') return { code: 'forbidden', message: 'Only a reviewer or an admin can sign as the reviewer; you are signed in as a tester.' };
    if (job.state === 'entering') {
      return { code: 'conflict', message: 'The job has not been submitted for review yet; the reviewer signs once it is ready for review.' };
    }
  }
  return null;
}
