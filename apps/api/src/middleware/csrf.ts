import type { NextFunction, Request, RequestHandler } from 'express';
import type { Env } from '../config/env';
import { HttpError } from '../lib/http-error';

const safeMethods = new Set(['GET', 'HEAD', 'OPTIONS']);

const rejected = (message: string) => new HttpError(403, 'csrf_rejected', message);

/**
 * Cross-site request forgery defence for a cookie-authenticated SPA (OWASP CSRF cheat sheet):
 * every state-changing request must carry `X-CSRF: 1` (a header a cross-site form cannot set and
 * a cross-site fetch cannot send without a preflight we never allow), must not be marked
 * cross-site by `Sec-Fetch-Site`, and must not come from a foreign `Origin`. Bodies must be JSON.
 * SameSite=Lax cookies add a further layer.
 */
export function csrfProtection(env: Env): RequestHandler {
  const allowed = new Set([new URL(env.publicUrl).origin, ...env.trustedOrigins]);
  return (req, _res, next) => {
    if (safeMethods.has(req.method)) return next();
    // An API key in the Authorization header is not sent by browsers on their own, and without a
    // cookie there is no ambient credential to forge: such requests need only a JSON body.
    if (!req.headers.cookie && /^Bearer\s+tpk_/.test(req.get('authorization') ?? '')) return requireJsonBody(req, next);
    const site = req.get('sec-fetch-site');
    if (site && site !== 'same-origin' && site !== 'none') {
      return next(rejected('Requests from other sites are refused.'));
    }
    const origin = req.get('origin');
    if (origin && !allowed.has(origin)) {
      // Outside production, also accept the origin the browser actually used (127.0.0.1 vs localhost).
      const host = req.get('host');
      const sameHost = env.mode !== 'production' && host !== undefined && safeOriginHost(origin) === host;
      if (!sameHost) return next(rejected('Requests from other origins are refused.'));
    }
    if (req.get('x-csrf') !== '1') {
      return next(rejected('The X-CSRF header is missing. Send requests through the Tappet app.'));
    }
    requireJsonBody(req, next);
  };
}

/** Routes (relative to /api) that accept a multipart file upload. */
const multipartRoutes = [/^\/shops\/[^/]+\/imports$/, /^\/shops\/[^/]+\/purchasing\/listings\/import$/, /^\/shops\/[^/]+\/vehicles\/[^/]+\/files$/, /^\/shops\/[^/]+\/jobs\/[^/]+\/files$/];

function requireJsonBody(req: Request, next: NextFunction): void {
  const hasBody = (req.headers['content-length'] !== undefined && req.headers['content-length'] !== '0') || req.headers['transfer-encoding'] !== undefined;
  // File uploads are multipart, on the routes that take one; the X-CSRF check above still applies.
  const uploadRoute = multipartRoutes.some((r) => r.test(req.path)) && req.is('multipart/form-data');
  if (hasBody && !req.is('application/json') && !uploadRoute) {
    return next(new HttpError(415, 'unsupported_media_type', 'Send the request body as application/json.'));
  }
  next();
}

function safeOriginHost(origin: string): string | null {
  try {
    return new URL(origin).host;
  } catch {
    return null;
  }
}
