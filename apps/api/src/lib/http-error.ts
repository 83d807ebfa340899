import type { ErrorCode } from '@tappet/contracts';

/** An error that the error handler turns into `{ error: { code, message, details } }`. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode,
    message: string,
    readonly details?: unknown,
    /** Extra response headers, e.g. Retry-After. */
    readonly headers: Record<string, string> = {},
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

/** 404: also the answer for records of another shop, so their existence is not revealed. */
export const notFound = (message = 'Not found.') => new HttpError(404, 'not_found', message);
export const unauthenticated = (message = 'Sign in to continue.') => new HttpError(401, 'unauthenticated', message);
export const forbidden = (message = 'You do not have permission to do this.') => new HttpError(403, 'forbidden', message);
export const badRequest = (message: string, details?: unknown) => new HttpError(400, 'bad_request', message, details);
