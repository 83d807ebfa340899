import { Router } from 'express';
import { passwordResetConfirmSchema, passwordResetRequestSchema, signInRequestSchema } from '@tappet/contracts';
import type { Env } from '../../config/env';
import { authOf, clearSessionCookie, readCookie, requestInfo, requireAuth, sessionCookie } from '../../middleware/authenticate';
import { bodyOf, validate } from '../../middleware/validate';
import type { AuthService } from './auth.service';

/** /api/auth: sign-in, sign-out and password reset. */
export function authRouter(deps: { env: Env; auth: AuthService }): Router {
  const { env, auth } = deps;
  const cookie = sessionCookie(env);
  const router = Router();

  router.post('/sign-in', validate({ body: signInRequestSchema }), async (req, res) => {
    const { email, password } = bodyOf(signInRequestSchema, req);
    const { token, me } = await auth.signIn(email, password, requestInfo(req), readCookie(req, cookie.name));
    res.cookie(cookie.name, token, cookie.options);
    res.json(me);
  });

  router.post('/sign-out', requireAuth, async (req, res) => {
    await auth.signOut(authOf(req), requestInfo(req));
    clearSessionCookie(res, env);
    res.json({ ok: true });
  });

  router.post('/password-reset/request', validate({ body: passwordResetRequestSchema }), async (req, res) => {
    await auth.requestPasswordReset(bodyOf(passwordResetRequestSchema, req).email, requestInfo(req));
    res.json({ ok: true });
  });

  router.post('/password-reset/confirm', validate({ body: passwordResetConfirmSchema }), async (req, res) => {
    const { token, password } = bodyOf(passwordResetConfirmSchema, req);
    await auth.confirmPasswordReset(token, password, requestInfo(req));
    // Every session of the user just ended, this browser's included.
    clearSessionCookie(res, env);
    res.json({ ok: true });
  });

  return router;
}
