import { Router } from 'express';
import type { AuthService } from '../auth/auth.service';
import { authOf, requestInfo, requireAuth } from '../../middleware/authenticate';
import { bodyOf, validate } from '../../middleware/validate';
import { setActiveShopRequestSchema } from '@tappet/contracts';

/** /api/me: who is signed in, their memberships and the active shop. */
export function meRouter(deps: { auth: AuthService }): Router {
  const router = Router();
  router.use(requireAuth);

  router.get('/', async (req, res) => {
    const { user, session } = authOf(req);
    res.json(await deps.auth.buildMe(user, session.activeShopId));
  });

  router.post('/active-shop', validate({ body: setActiveShopRequestSchema }), async (req, res) => {
    res.json(await deps.auth.setActiveShop(authOf(req), bodyOf(setActiveShopRequestSchema, req).shopId, requestInfo(req)));
  });

  return router;
}
