import type { RequestHandler } from 'express';
import type { Logger } from 'pino';

/** The path as logged: no query string (reset tokens), no invitation token. */
export function accessLogPath(url: string): string {
  return (url.split('?')[0] ?? '').replace(/^\/api\/invitations\/(?!accept$)[^/]+/, '/api/invitations/[token]');
}

/**
 * The access log: one line per request when its response is done (or abandoned), with method,
 * path, status and time only: no headers (cookies), no bodies. Written here rather than with
 * pino-http, which builds a child logger and serialises the whole request for every call and
 * cost about a tenth of a lookup's time under load (docs/performance.md, http).
 */
export function requestLog(logger: Logger, skip: (path: string) => boolean = () => false): RequestHandler {
  let lastId = 0;
  return (req, res, next) => {
    const path = req.originalUrl;
    if (skip(path)) return next();
    const id = ++lastId;
    const started = performance.now();
    res.once('close', () => {
      const entry = { req: { id, method: req.method, path: accessLogPath(path) }, res: { statusCode: res.statusCode }, responseTime: Math.round(performance.now() - started) };
      if (!res.writableFinished) logger.warn(entry, 'request aborted');
      else if (res.statusCode >= 500) logger.error(entry, 'request failed');
      else logger.info(entry, 'request completed');
    });
    next();
  };
}
