import type { CookieOptions, Request, RequestHandler, Response } from 'express';
import type { Env } from '../config/env';
import { unauthenticated } from '../lib/http-error';
import type { AuthService } from '../modules/auth/auth.service';
import type { ApiKeyContext } from '../modules/api-keys/api-keys.service';
import type { AuditActor } from '../modules/audit/audit.service';

/** Name and attributes of the session cookie: `__Host-` prefixed and Secure when served over https. */
export function sessionCookie(env: Env): { name: string; options: CookieOptions } {
  const https = env.publicUrl.startsWith('https:');
  return {
    name: https ? '__Host-tappet_session' : 'tappet_session',
    options: { httpOnly: true, sameSite: 'lax', secure: https, path: '/', maxAge: env.session.absoluteTimeoutMs },
  };
}

/** Reads one cookie from the Cookie header (no cookie-parser dependency for one value). */
export function readCookie(req: Request, name: string): string | null {
  const header = req.headers.cookie;
  if (!header) return null;
  for (const part of header.split(';')) {
    const eq = part.indexOf('=');
    if (eq < 0 || part.slice(0, eq).trim() !== name) continue;
    const raw = part.slice(eq + 1).trim();
    try {
      return decodeURIComponent(raw);
    } catch {
      return null;
    }
  }
  return null;
}

export function clearSessionCookie(res: Response, env: Env): void {
  const { name, options } = sessionCookie(env);
  const { maxAge: _maxAge, ...rest } = options;
  res.clearCookie(name, rest);
}

/**
 * Attaches `req.auth` when the session cookie names a live session, or `req.apiKey` for an
 * `Authorization: Bearer tpk_…` key. A missing or expired session is left to `requireAuth` (and an
 * expired or unknown cookie is cleared); a presented key that is unknown or revoked is a 401 here.
 */
export function authenticate(env: Env, auth: AuthService, apiKeys?: { resolve(secret: string): Promise<ApiKeyContext | null> }): RequestHandler {
  const { name } = sessionCookie(env);
  return async (req, res, next) => {
    const secret = bearerApiKey(req);
    if (secret !== null && apiKeys) {
      // A request that presents a key is judged by the key alone: a bad one is refused outright.
      const key = await apiKeys.resolve(secret);
      if (!key) return next(unauthenticated('This API key is not valid or has been revoked.'));
      req.apiKey = key;
      return next();
    }
    const token = readCookie(req, name);
    if (token) {
      const context = await auth.resolveSession(token);
      if (context) req.auth = context;
      else clearSessionCookie(res, env);
    }
    next();
  };
}

/** The secret of an `Authorization: Bearer tpk_…` header, or null. */
export function bearerApiKey(req: Request): string | null {
  const match = /^Bearer\s+(tpk_[A-Za-z0-9_-]{1,200})\s*$/.exec(req.get('authorization') ?? '');
  return match?.[1] ?? null;
}

/**
 * 401 unless a session (or an API key) is attached. Key requests pass only into shop routes,
 * where `tenantContext` confines them to the key's shop; `authOf` refuses them everywhere else.
 */
export const requireAuth: RequestHandler = (req, _res, next) => {
  next(req.auth || req.apiKey ? undefined : unauthenticated());
};

/** Who is acting, for the audit log: the person, the API key (and the member it acts for), and the address. */
export function auditActorOf(req: Request): AuditActor & { userId: string | null; name: string | null } {
  const ip = req.ip ?? null;
  if (req.apiKey) return { userId: req.apiKey.userId, apiKeyId: req.apiKey.id, ip, name: req.apiKey.label };
  return { userId: req.auth?.user.id ?? null, apiKeyId: null, ip, name: req.auth?.user.name ?? null };
}

/** The session of a request that passed `requireAuth`. */
export function authOf(req: Request) {
  if (!req.auth) throw unauthenticated();
  return req.auth;
}

/** Client address and agent, as stored with sessions and audit events. */
export function requestInfo(req: Request) {
  return { ip: req.ip ?? null, userAgent: req.get('user-agent') ?? null };
}
