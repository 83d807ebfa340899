import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ForbiddenError } from '@casl/ability';
import { ZodError } from 'zod';
import type { ErrorBody, ErrorCode } from '@tappet/contracts';
import { HttpError, notFound } from '../lib/http-error';

/** Unknown routes under /api answer JSON 404 rather than the SPA or Express's HTML page. */
export const apiNotFound: RequestHandler = (_req, _res, next) => next(notFound('No such API route.'));

interface BodyParserError {
  type?: string;
  status?: number;
  expose?: boolean;
}

/**
 * What busboy (under multer) throws for a multipart body it cannot read. These are the sender's
 * mistakes, so they answer 400 rather than 500 (found by the hostile-input tests).
 */
const malformedFormMessages = /^(Malformed part header|Malformed urlencoded form|Malformed content type|Multipart: Boundary not found|Missing Content-Type|Unexpected end of (form|file)|Unsupported content type: .*|Request (aborted|closed))$/;

const codeByStatus: Record<number, ErrorCode> = { 400: 'bad_request', 401: 'unauthenticated', 403: 'forbidden', 404: 'not_found', 409: 'conflict', 413: 'payload_too_large', 415: 'unsupported_media_type', 429: 'rate_limited' };

function toHttpError(err: unknown): HttpError {
  if (err instanceof HttpError) return err;
  if (err instanceof ZodError) {
    const details = err.issues.map((i) => ({ path: i.path.map((p) => (typeof p === 'symbol' ? String(p) : p)), message: i.message }));
    const message = details.length === 1 && details[0] ? `${details[0].message}` : 'Some fields are not valid.';
    return new HttpError(400, 'validation_failed', message, details);
  }
  if (err instanceof ForbiddenError) return new HttpError(403, 'forbidden', err.message);
  if (err instanceof Error && err.constructor === Error && malformedFormMessages.test(err.message)) {
    return new HttpError(400, 'bad_request', `The uploaded form could not be read (${err.message.toLowerCase()}). Attach the file again.`);
  }
  const parserError = err as BodyParserError;
  switch (parserError?.type) {
    case 'entity.parse.failed':
      return new HttpError(400, 'bad_request', 'The request body is not valid JSON.');
    case 'entity.too.large':
      return new HttpError(413, 'payload_too_large', 'The request body is too large.');
    case 'encoding.unsupported':
    case 'charset.unsupported':
      return new HttpError(415, 'unsupported_media_type', 'Send the body as UTF-8 JSON.');
  }
  // Other client errors from Express's own middleware (static files, body parser): keep the status.
  const status = parserError?.status;
  if (typeof status === 'number' && status >= 400 && status < 500) {
    return new HttpError(status, codeByStatus[status] ?? 'bad_request', status === 404 ? 'Not found.' : 'The request cannot be handled.');
  }
  return new HttpError(500, 'internal', 'Something went wrong on our side. Try again.');
}

/**
 * The one error handler: every failure becomes `{ error: { code, message, details } }`.
 * Unexpected errors are logged with their stack and answered without it.
 */
export function errorHandler(log: (err: unknown, msg: string) => void): ErrorRequestHandler {
  return (err, _req, res, next) => {
    if (res.headersSent) return next(err);
    const httpError = toHttpError(err);
    if (httpError.status >= 500) log(err, 'unhandled error');
    for (const [name, value] of Object.entries(httpError.headers)) res.setHeader(name, value);
    const body: ErrorBody = { error: { code: httpError.code, message: httpError.message, ...(httpError.details === undefined ? {} : { details: httpError.details }) } };
    res.status(httpError.status).json(body);
  };
}
