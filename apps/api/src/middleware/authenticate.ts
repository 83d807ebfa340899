import type { CookieOptions, Request, RequestHandler, Response } from 'express';
import type { Env } from '../config/env';
import { unauthenticated } from '../lib/http-error';
import type { AuthService } from '../modules/auth/auth.service';

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
 * Attaches `req.auth` when the session cookie names a live session. Never rejects by itself:
 * `requireAuth` does. An expired or unknown cookie is cleared.
 */
export function authenticate(env: Env, auth: AuthService): RequestHandler {
  const { name } = sessionCookie(env);
  return async (req, res, next) => {
    const token = readCookie(req, name);
    if (token) {
      const context = await auth.resolveSession(token);
      if (context) req.auth = context;
      else clearSessionCookie(res, env);
    }
    next();
  };
}

/** 401 unless a session is attached. */
export const requireAuth: RequestHandler = (req, _res, next) => {
  next(req.auth ? undefined : unauthenticated());
};

/** The session of a request that passed `requireAuth`. */
export function authOf(req: Request) {
  if (!req.auth) throw unauthenticated();
  return req.auth;
}

/** Client address and agent, as stored with sessions and audit events. */
export function requestInfo(req: Request) {
  return { ip: req.ip ?? null, userAgent: req.get('user-agent') ?? null };
}
