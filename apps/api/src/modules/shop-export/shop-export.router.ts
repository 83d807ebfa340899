import { pipeline } from 'node:stream/promises';
import { Router } from 'express';
import { shopIdParamsSchema } from '@tappet/contracts';
import { auditActorOf } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { validate } from '../../middleware/validate';
import type { ShopExportService } from './shop-export.service';

/** GET /api/shops/:shopId/export.zip: the owner downloads the whole shop, also when it is read-only. */
export function shopExportRouter(deps: { shopExport: ShopExportService }): Router {
  const router = Router({ mergeParams: true });

  router.get('/', validate({ params: shopIdParamsSchema }), async (req, res) => {
    // 'export' is not a write action, so a suspended or cancelled shop may still take its data away.
    authorize(req, 'export', 'ShopExport');
    const { shop } = shopOf(req);
    const stream = await deps.shopExport.zip(shop, auditActorOf(req));
    res.setHeader('Content-Type', 'application/zip');
    res.setHeader('Content-Disposition', `attachment; filename="tappet-${shop.slug}-export.zip"`);
    await pipeline(stream, res);
  });

  return router;
}
