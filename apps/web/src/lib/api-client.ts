import type { ErrorBody } from '@tappet/contracts';
import type { z } from 'zod';
import { env } from '../config/env';

/** A failed API call, in the API's own terms: HTTP status, error code, message and field errors. */
export class ApiError extends Error {
  override readonly name = 'ApiError';
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    /** Field path ("email", "lines.0.qty") → message, from a validation error's details. */
    readonly fieldErrors: Record<string, string> = {},
    readonly details?: unknown,
  ) {
    super(message);
  }
}

const fallbackMessages: Record<number, string> = {
  400: 'The request was not accepted. Check what you entered.',
  401: 'Your session has ended. Sign in again.',
  403: 'You do not have permission to do this.',
  404: 'This was not found. It may have been removed, or the link is wrong.',
  409: 'Someone changed this at the same time. Reload and try again.',
  413: 'That is too large to send.',
  429: 'Too many attempts. Wait a little and try again.',
};

/** Turns validation details (`[{ path, message }]`, path as string or array) into a field map. */
export function fieldErrorsFrom(details: unknown): Record<string, string> {
  const out: Record<string, string> = {};
  if (!Array.isArray(details)) return out;
  for (const item of details) {
    if (!item || typeof item !== 'object') continue;
    const { path, message } = item as { path?: unknown; message?: unknown };
    if (typeof message !== 'string') continue;
    const key = Array.isArray(path) ? path.map(String).join('.') : typeof path === 'string' ? path : '';
    // Keep the first message per field: it is the one to fix first.
    if (key && !(key in out)) out[key] = message;
  }
  return out;
}

/**
 * The API's error body (`errorBodySchema` in libs/contracts), checked by hand: this module is in
 * the first download and zod is not (docs/decisions/022-first-load.md).
 */
function errorBodyOf(body: unknown): ErrorBody | null {
  if (!body || typeof body !== 'object') return null;
  const error = (body as { error?: unknown }).error;
  if (!error || typeof error !== 'object') return null;
  const { code, message, details } = error as Record<string, unknown>;
  if (typeof code !== 'string' || typeof message !== 'string') return null;
  return { error: { code, message, ...(details === undefined ? {} : { details }) } };
}

/** Builds an ApiError from a failed response, whatever its body. */
export async function errorFromResponse(response: Response): Promise<ApiError> {
  let body: unknown = null;
  try {
    body = await response.json();
  } catch {
    // Not JSON (a proxy's HTML page, an empty body): fall back to the status.
  }
  const parsed = errorBodyOf(body);
  const fallback = fallbackMessages[response.status] ?? 'Something went wrong on our side. Try again in a moment.';
  if (!parsed) return new ApiError(response.status, response.status >= 500 ? 'internal' : 'unknown', fallback);
  const { code, message, details } = parsed.error;
  return new ApiError(response.status, code, message || fallback, fieldErrorsFrom(details), details);
}

export interface RequestOptions<T> {
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
  body?: unknown;
  signal?: AbortSignal;
  /**
   * Checks the response body; a mismatch is reported as an error instead of a wrong screen. A
   * function loads the schema (and zod) on demand, in parallel with the request: for the calls
   * the first screen makes (docs/decisions/022-first-load.md). A hand-written check with the
   * same `safeParse` serves where even loading zod is too late (lib/me-schema.ts).
   */
  schema?: z.ZodType<T> | ResponseCheck<T> | (() => Promise<z.ZodType<T>>);
}

/** What the client needs of a schema: zod's `safeParse` shape. */
export interface ResponseCheck<T> {
  safeParse(data: unknown): { success: true; data: T } | { success: false };
}

/**
 * Calls the API at `env.apiBaseUrl + path`. Sends the session cookie (same origin only), and on
 * every request that changes something the `X-CSRF: 1` header and (unless the body is FormData) a JSON content type the API
 * requires against cross-site request forgery. Throws ApiError on any failure.
 */
export async function apiRequest<T = unknown>(path: string, options: RequestOptions<T> = {}): Promise<T> {
  const method = options.method ?? 'GET';
  const headers: Record<string, string> = { Accept: 'application/json' };
  let body: string | FormData | undefined;
  if (method !== 'GET') {
    headers['X-CSRF'] = '1';
    if (options.body instanceof FormData) {
      // A file upload: the browser sets the multipart content type with its boundary.
      body = options.body;
    } else {
      headers['Content-Type'] = 'application/json';
      body = JSON.stringify(options.body ?? {});
    }
  }

  const schema = typeof options.schema === 'function' ? options.schema() : options.schema;
  // Awaited below; if the request fails first, its error is the one to report.
  if (schema instanceof Promise) schema.catch(() => undefined);
  let response: Response;
  try {
    response = await fetch(`${env.apiBaseUrl}${path}`, { method, headers, body, credentials: 'same-origin', signal: options.signal });
  } catch (error) {
    if (error instanceof DOMException && error.name === 'AbortError') throw error;
    throw new ApiError(0, 'network', 'Tappet cannot be reached. Check the connection and try again.');
  }

  if (!response.ok) throw await errorFromResponse(response);
  if (response.status === 204) return undefined as T;

  const text = await response.text();
  const data: unknown = text ? JSON.parse(text) : undefined;
  if (!schema) return data as T;
  const checked = (await schema).safeParse(data);
  if (!checked.success) throw new ApiError(response.status, 'unexpected_response', 'Tappet answered in a way this page does not understand. Reload the page.');
  return checked.data;
}

/** Shorthands for the HTTP methods. */
export const api = {
  get: <T>(path: string, options: Omit<RequestOptions<T>, 'method' | 'body'> = {}) => apiRequest<T>(path, { ...options, method: 'GET' }),
  post: <T>(path: string, body?: unknown, options: Omit<RequestOptions<T>, 'method' | 'body'> = {}) =>
    apiRequest<T>(path, { ...options, method: 'POST', body }),
  patch: <T>(path: string, body?: unknown, options: Omit<RequestOptions<T>, 'method' | 'body'> = {}) =>
    apiRequest<T>(path, { ...options, method: 'PATCH', body }),
  delete: <T>(path: string, options: Omit<RequestOptions<T>, 'method' | 'body'> = {}) => apiRequest<T>(path, { ...options, method: 'DELETE' }),
};

/** A message for any error a query or mutation can throw. */
export function errorMessage(error: unknown): string {
  if (error instanceof ApiError) return error.message;
  return 'Something went wrong. Try again, and reload the page if it keeps happening.';
}
