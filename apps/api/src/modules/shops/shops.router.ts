import { Router } from 'express';
import { shopIdParamsSchema } from '@tappet/contracts';
import type { Database } from '../../db/write-lock';
import { authOf, requestInfo, requireAuth } from '../../middleware/authenticate';
import { authorize, shopOf, tenantContext } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import { updateShopRequestSchema } from '@tappet/contracts';
import { toShopDetail, type ShopsService } from './shops.service';

/** /api/shops: the caller's shops, and everything inside one shop (behind the tenant context). */
export function shopsRouter(deps: { db: Database; shops: ShopsService }): Router {
  const router = Router();
  router.use(requireAuth);

  router.get('/', async (req, res) => {
    res.json({ shops: await deps.shops.listForUser(authOf(req).user.id) });
  });

  // Everything under /:shopId sees only the caller's own shop; anything else is a 404.
  router.use('/:shopId', tenantContext(deps.db));

  router.get('/:shopId', validate({ params: shopIdParamsSchema }), (req, res) => {
    authorize(req, 'read', 'Shop');
    res.json(toShopDetail(shopOf(req).shop));
  });

  router.patch('/:shopId', validate({ params: shopIdParamsSchema, body: updateShopRequestSchema }), async (req, res) => {
    authorize(req, 'update', 'Shop');
    const { shop } = shopOf(req);
    const { ip } = requestInfo(req);
    const updated = await deps.shops.update(shop, bodyOf(updateShopRequestSchema, req), { userId: authOf(req).user.id, ip });
    res.json(toShopDetail(updated));
  });

  return router;
}
