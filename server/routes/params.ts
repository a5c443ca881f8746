import type { Request } from 'express';
import { HttpError } from '../http-error.ts';

/** Reads a numeric id from the path; anything else is the person's mistake (400). */
export function idParam(req: Request, name: string): number {
  const raw = req.params[name];
  const value = Number(raw);
  if (typeof raw !== 'string' || !/^\d+$/.test(raw) || !Number.isSafeInteger(value) || value <= 0) {
    throw new HttpError('bad_request', `${name} must be a positive whole number; got "${String(raw)}".`);
  }
  return value;
}
