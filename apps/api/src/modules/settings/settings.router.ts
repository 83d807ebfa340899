import { Router } from 'express';
import { shopIdParamsSchema, updateShopSettingsRequestSchema } from '@tappet/contracts';
import { auditActorOf } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import type { SettingsService } from './settings.service';

/** /api/shops/:shopId/settings (behind the tenant context). Every member reads; the owner changes (the permission table). */
export function settingsRouter(deps: { settings: SettingsService }): Router {
  const router = Router({ mergeParams: true });

  router.get('/', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Settings');
    res.json(await deps.settings.get(shopOf(req).shop));
  });

  router.patch('/', validate({ params: shopIdParamsSchema, body: updateShopSettingsRequestSchema }), async (req, res) => {
    authorize(req, 'update', 'Settings');
    res.json(await deps.settings.update(shopOf(req).shop.id, bodyOf(updateShopSettingsRequestSchema, req), auditActorOf(req)));
  });

  return router;
}
