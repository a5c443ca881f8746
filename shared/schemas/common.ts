import { z } from 'zod';

/** Database ids are positive integers; path parameters arrive as strings. */
export const idSchema = z.coerce.number().int().positive();

export const roles = ['admin', 'tester', 'reviewer'] as const;
export const roleSchema = z.enum(roles);
export type Role = z.infer<typeof roleSchema>;

/** Every error body the API sends. */
export const apiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    issues: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
    /** Extra detail for some codes (e.g. the current cell on a 409). */
    details: z.unknown().optional(),
  }),
});
export type ApiError = z.infer<typeof apiErrorSchema>;

/** The fixed list of error codes the API uses. */
export const errorCodes = [
  'bad_request',
  'unauthenticated',
  'forbidden',
  'not_found',
  'conflict',
  'locked',
  /** An uploaded file is larger than the route allows (413). */
  'too_large',
  /** An uploaded file's content is not a type the route accepts (415). */
  'unsupported_type',
  'too_many_requests',
  'internal',
] as const;
export type ErrorCode = (typeof errorCodes)[number];
