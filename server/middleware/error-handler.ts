import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { HttpError } from '../http-error.ts';

function describeIssue(issue: ZodError['issues'][number]): { path: string; message: string } {
  // A schema without its own words for a missing field: say so plainly rather than in zod's terms.
  const missing = issue.code === 'invalid_type' && /received undefined$/.test(issue.message);
  return { path: issue.path.map(String).join('.'), message: missing ? 'This is required.' : issue.message };
}

/** Answers 404 for an /api path no route took. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new HttpError('not_found', `There is no ${req.method} ${req.originalUrl.split('?')[0]} in this API.`));
};

/**
 * The last middleware. HttpError keeps its status; a ZodError is a person's mistake (400, with
 * every issue); a body that is not JSON is 400; anything else is logged and answered 500.
 */
export const errorHandler: ErrorRequestHandler = (err, _req, res, _next) => {
  if (err instanceof HttpError) {
    res.status(err.status).json({
      error: { code: err.code, message: err.message, ...(err.details === undefined ? {} : { details: err.details }) },
    });
    return;
  }
  if (err instanceof ZodError) {
    const issues = err.issues.map(describeIssue);
    const first = issues[0];
    const where = first?.path ? ` (${first.path})` : '';
    res.status(400).json({
      error: { code: 'bad_request', message: `${first?.message ?? 'The request is not valid.'}${where}`, issues },
    });
    return;
  }
  const status = typeof err?.status === 'number' ? err.status : 500;
  if (status >= 400 && status < 500) {
    // body-parser's errors: malformed JSON, body too large, wrong charset.
    const message =
      err.type === 'entity.parse.failed'
        ? 'The request body is not valid JSON.'
        : err.type === 'entity.too.large'
          ? 'The request body is too large.'
          : String(err.message ?? 'The request is not valid.');
    res.status(status).json({ error: { code: 'bad_request', message } });
    return;
  }
  console.error(err);
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server. Nothing was changed.' } });
};
