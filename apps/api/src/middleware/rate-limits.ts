import type { RequestHandler } from 'express';
import type { Clock } from '../lib/clock';
import { HttpError } from '../lib/http-error';
import { RateLimiter, type RateLimitRule, type RateLimitStore } from '../lib/rate-limiter';

/**
 * E-mails sent on a person's behalf (orders to suppliers, approval requests, invoices, estimates,
 * onboarding invitations): at most this many requests per person and shop (or per person on the
 * platform) in an hour, so a stolen session or a loop in a script cannot turn Tappet into a spam
 * relay. Generous for a shop's day; counted per request, success or not.
 */
export const defaultMailRequestLimit: RateLimitRule = { limit: 60, windowMs: 60 * 60_000 };

/**
 * Limits the routes it is mounted on (app.ts) by the signed-in person or API key and the shop in
 * the path. Mounted after `authenticate`: a request with no identity is not counted (it is refused
 * later), so strangers cannot use up a shop's allowance.
 */
export function mailRequestLimit(deps: { clock: Clock; store: RateLimitStore; rule?: RateLimitRule }): RequestHandler {
  const limiter = new RateLimiter('mail', deps.rule ?? defaultMailRequestLimit, deps.clock, deps.store);
  return async (req, _res, next) => {
    const who = req.auth?.user.id ?? (req.apiKey ? `key:${req.apiKey.id}` : null);
    if (!who) return next();
    const key = `${String(req.params['shopId'] ?? 'platform')}:${who}`;
    const wait = await limiter.take(key);
    if (wait > 0) return next(rateLimitedError(wait, 'e-mails sent in the last hour'));
    next();
  };
}

/** The 429 every limiter answers with: how long to wait, in words and in Retry-After. */
export function rateLimitedError(retryAfterSeconds: number, what = 'attempts'): HttpError {
  const minutes = Math.ceil(retryAfterSeconds / 60);
  return new HttpError(429, 'rate_limited', `Too many ${what}. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`, { retryAfterSeconds }, { 'Retry-After': String(retryAfterSeconds) });
}

/**
 * A per-address limit for routes anyone may call without an account (the customer's estimate
 * approval and invoice pay links): every request counts, under `name` and the client address.
 */
export function addressRateLimit(deps: { name: string; rule: RateLimitRule; clock: Clock; store: RateLimitStore }): RequestHandler {
  const limiter = new RateLimiter(deps.name, deps.rule, deps.clock, deps.store);
  return async (req, _res, next) => {
    const wait = await limiter.take(req.ip ?? 'unknown');
    if (wait > 0) return next(rateLimitedError(wait));
    next();
  };
}
