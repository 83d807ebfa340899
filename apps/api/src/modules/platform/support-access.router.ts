import { Router } from 'express';
import { grantSupportAccessRequestSchema, shopIdParamsSchema } from '@tappet/contracts';
import { auditActorOf, authOf } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import type { SupportAccessService } from './support-access.service';

/** /api/shops/:shopId/support-access (behind the tenant context): the owner's grants. */
export function supportAccessRouter(deps: { support: SupportAccessService }): Router {
  const { support } = deps;
  const router = Router({ mergeParams: true });

  router.get('/', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'SupportAccess');
    res.json(await support.overview(shopOf(req).shop.id));
  });

  router.post('/', validate({ params: shopIdParamsSchema, body: grantSupportAccessRequestSchema }), async (req, res) => {
    authorize(req, 'create', 'SupportAccess');
    const actor = { ...auditActorOf(req), userId: authOf(req).user.id };
    res.status(201).json(await support.grant(shopOf(req).shop.id, bodyOf(grantSupportAccessRequestSchema, req), actor));
  });

  router.delete('/', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'delete', 'SupportAccess');
    await support.revoke(shopOf(req).shop.id, { ...auditActorOf(req), userId: authOf(req).user.id });
    res.json({ ok: true });
  });

  return router;
}
