import type { z } from 'zod';
import { apiErrorSchema } from '../../shared/schemas/common.ts';

/** An answer from the API that was not 2xx, with the server's code and message. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly issues: { path: string; message: string }[];
  readonly details: unknown;

  constructor(status: number, code: string, message: string, issues: { path: string; message: string }[] = [], details?: unknown) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.issues = issues;
    this.details = details;
  }
}

/** The server could not be reached at all (offline, server down): the edit may be queued. */
export class NetworkError extends Error {
  constructor(cause: unknown) {
    super('The server cannot be reached.');
    this.name = 'NetworkError';
    this.cause = cause;
  }
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

/** Headers of a request: every change says it is JSON (the server refuses any other type). */
function headersFor(method: Method, body: unknown): Record<string, string> {
  if (method === 'GET') return { accept: 'application/json' };
  // A FormData upload gets its multipart type (with its boundary) from the browser.
  if (body instanceof FormData) return { accept: 'application/json' };
  return { 'content-type': 'application/json', accept: 'application/json' };
}

/**
 * Calls the JSON API and parses the answer with its zod schema. Throws ApiError for an error
 * answer and NetworkError when no answer came. A change without a body sends `{}` as JSON: the
 * server takes only JSON (or an upload's FormData) on anything but GET.
 */
export async function apiRequest<T extends z.ZodType>(
  method: Method,
  url: string,
  schema: T,
  body?: unknown,
  init: { signal?: AbortSignal } = {},
): Promise<z.infer<T>> {
  let response: Response;
  try {
    response = await fetch(url, {
      method,
      credentials: 'same-origin',
      headers: headersFor(method, body),
      body: method === 'GET' ? undefined : body instanceof FormData ? body : JSON.stringify(body ?? {}),
      signal: init.signal,
    });
  } catch (error) {
    if (error instanceof DOMException && error.name === 'AbortError') throw error;
    throw new NetworkError(error);
  }
  if (response.status === 204) return schema.parse(undefined);
  const json: unknown = await response.json().catch(() => undefined);
  if (!response.ok) {
    const parsed = apiErrorSchema.safeParse(json);
    if (parsed.success) {
      const { code, message, issues, details } = parsed.data.error;
      throw new ApiError(response.status, code, message, issues ?? [], details);
    }
    if (response.status >= 502 && response.status <= 504) throw new NetworkError(new Error(`HTTP ${response.status}`));
    throw new ApiError(response.status, 'unknown', `The server answered ${response.status}.`);
  }
  return schema.parse(json);
}

/**
 * Sends a multipart form (a file upload with its fields) and parses the answer like `apiRequest`.
 * The browser sets the content type with the form's boundary.
 */
export async function apiUpload<T extends z.ZodType>(method: 'POST' | 'PUT', url: string, schema: T, form: FormData): Promise<z.infer<T>> {
  let response: Response;
  try {
    response = await fetch(url, { method, credentials: 'same-origin', headers: { accept: 'application/json' }, body: form });
  } catch (error) {
    throw new NetworkError(error);
  }
  const json: unknown = await response.json().catch(() => undefined);
  if (!response.ok) {
    const parsed = apiErrorSchema.safeParse(json);
    if (parsed.success) {
      const { code, message, issues, details } = parsed.data.error;
      throw new ApiError(response.status, code, message, issues ?? [], details);
    }
    if (response.status === 413) throw new ApiError(413, 'too_large', 'The file is too large.');
    throw new ApiError(response.status, 'unknown', `The server answered ${response.status}.`);
  }
  return schema.parse(json);
}

export const apiGet = <T extends z.ZodType>(url: string, schema: T, init?: { signal?: AbortSignal }) =>
  apiRequest('GET', url, schema, undefined, init);
