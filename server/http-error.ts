import type { ErrorCode } from '../shared/schemas/common.ts';

const statusByCode: Record<ErrorCode, number> = {
  bad_request: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  locked: 423,
  too_large: 413,
  unsupported_type: 415,
  too_many_requests: 429,
  internal: 500,
};

/** The one error type routes throw; the error middleware turns it into `{ error: { code, message } }`. */
export class HttpError extends Error {
  readonly status: number;
  readonly code: ErrorCode;
  readonly details: unknown;

  constructor(code: ErrorCode, message: string, details?: unknown) {
    super(message);
    this.name = 'HttpError';
    this.code = code;
    this.status = statusByCode[code];
    this.details = details;
  }
}

export const notFound = (what: string) => new HttpError('not_found', `${what} was not found.`);
