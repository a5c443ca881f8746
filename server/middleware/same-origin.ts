import type { Request, RequestHandler } from 'express';
import { HttpError } from '../http-error.ts';

/**
 * A route that takes a file upload (`multipart/form-data`) instead of JSON. Every other API request
 * that changes something must be JSON. Features that add an upload route add it here, one line each:
 * the opt-in is explicit, so a form posted from anywhere can never reach a JSON route.
 */
export interface UploadRoute {
  method: 'POST' | 'PUT';
  /** Matched against the whole path, e.g. /^\/api\/jobs\/\d+\/signatures$/. */
  path: RegExp;
}

/** The upload routes of the app (see DEVELOPERS.md, "Cross-site requests"). */
export const uploadRoutes: UploadRoute[] = [
  { method: 'POST', path: /^\/api\/company\/logo$/ },
  { method: 'POST', path: /^\/api\/jobs\/\d+\/signatures$/ },
  // A readings file read for an import (nothing stored) and a photo of the paper notes (stored).
  { method: 'POST', path: /^\/api\/boards\/\d+\/import\/read$/ },
  { method: 'POST', path: /^\/api\/boards\/\d+\/photos$/ },
];

export interface SameOriginOptions {
  /**
   * Origins allowed besides the app's own (scheme://host[:port]), for a reverse proxy that
   * rewrites the Host header or terminates HTTPS elsewhere. From BOARDWALK_ALLOWED_ORIGINS.
   */
  allowedOrigins?: readonly string[];
  /** Upload routes allowed to send multipart/form-data; defaults to `uploadRoutes`. */
  uploadRoutes?: readonly UploadRoute[];
}

const safeMethods = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Reads a comma-separated list of origins (BOARDWALK_ALLOWED_ORIGINS), normalised. */
export function parseAllowedOrigins(text: string | undefined): string[] {
  if (!text) return [];
  return text
    .split(',')
    .map((s) => s.trim())
    .filter(Boolean)
    .map((s) => {
      try {
        return new URL(s).origin;
      } catch {
        throw new Error(`BOARDWALK_ALLOWED_ORIGINS: "${s}" is not an origin such as https://boardwalk.example.com`);
      }
    });
}

function originOf(url: string): string | undefined {
  try {
    const origin = new URL(url).origin;
    return origin === 'null' ? undefined : origin;
  } catch {
    return undefined;
  }
}

/** The app's own origin as this request reached it (scheme from the proxy only on loopback). */
function ownOrigin(req: Request): string | undefined {
  const host = req.get('host');
  return host ? originOf(`${req.protocol}://${host}`) : undefined;
}

/**
 * Refuses a state-changing API request that a page of another origin could have sent with the
 * person's cookie (cross-site request forgery). Two checks, each enough against a plain form:
 * - where it came from: the `Origin` header, or the `Referer` when there is no `Origin`, must be
 *   the app's own origin or one of `allowedOrigins`. Browsers send `Origin` on every request that
 *   is not GET or HEAD (Fetch standard), so a request with neither header is refused too;
 * - what it carries: `application/json` (a cross-site form can only send form or text types
 *   without the browser first asking permission, which this app never gives), or
 *   `multipart/form-data` on an upload route that opted in.
 */
export function sameOriginOnly(options: SameOriginOptions = {}): RequestHandler {
  const allowed = new Set(options.allowedOrigins ?? []);
  const uploads = options.uploadRoutes ?? uploadRoutes;
  return (req, _res, next) => {
    if (safeMethods.has(req.method)) return next();

    const originHeader = req.get('origin');
    const refererHeader = req.get('referer');
    const from = originHeader !== undefined ? originOf(originHeader) : refererHeader !== undefined ? originOf(refererHeader) : undefined;
    const own = ownOrigin(req);
    if (!from || (from !== own && !allowed.has(from))) {
      const seen = originHeader ?? refererHeader;
      throw new HttpError(
        'forbidden',
        seen === undefined
          ? 'This request does not say which page sent it (no Origin or Referer header), so it was refused. Nothing was changed.'
          : `This request came from a page of another site (${seen}), so it was refused. Nothing was changed. If Boardwalk runs behind a proxy at that address, add it to BOARDWALK_ALLOWED_ORIGINS.`,
      );
    }

    // The header itself, not req.is(): a bodiless request (lock) must say application/json too.
    const type = (req.get('content-type') ?? '').split(';')[0]!.trim().toLowerCase();
    if (type === 'application/json') return next();
    const path = req.originalUrl.split('?')[0] ?? '';
    if (type === 'multipart/form-data' && uploads.some((u) => u.method === req.method && u.path.test(path))) return next();
    throw new HttpError(
      'forbidden',
      type
        ? `This request sends ${type}; Boardwalk takes only application/json here. Nothing was changed.`
        : 'This request has no Content-Type; Boardwalk takes only application/json here (send {} when there is nothing to say). Nothing was changed.',
    );
  };
}
