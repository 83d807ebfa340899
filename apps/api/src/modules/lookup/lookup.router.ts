import { Router } from 'express';
import { partSearchQuerySchema, shopIdParamsSchema, type PartSearchQueryParsed } from '@tappet/contracts';
import type { Database } from '../../db/write-lock';
import { requireAuth } from '../../middleware/authenticate';
import { authorize, shopOf, tenantContext } from '../../middleware/tenant-context';
import { validate } from '../../middleware/validate';
import type { LookupService } from './lookup.service';

/**
 * GET /api/shops/:shopId/parts/search: the forgiving lookup. Any member who may read parts.
 * Mounted before the catalogue router so "search" is never taken for a part id.
 */
export function lookupRouter(deps: { db: Database; lookup: LookupService }): Router {
  const router = Router({ mergeParams: true });
  router.get('/parts/search', requireAuth, tenantContext(deps.db), validate({ params: shopIdParamsSchema, query: partSearchQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'Part');
    res.json(await deps.lookup.search(shopOf(req).shop.id, req.query as unknown as PartSearchQueryParsed));
  });
  return router;
}
