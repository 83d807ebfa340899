import { Router } from 'express';
import { apiKeyParamsSchema, createApiKeyRequestSchema, shopIdParamsSchema } from '@tappet/contracts';
import { auditActorOf } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import { HttpError } from '../../lib/http-error';
import type { ApiKeysService } from './api-keys.service';

/** /api/shops/:shopId/api-keys (behind the tenant context): owners create, list and revoke keys. */
export function apiKeysRouter(deps: { apiKeys: ApiKeysService }): Router {
  const { apiKeys } = deps;
  const router = Router({ mergeParams: true });

  router.get('/', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'ApiKey');
    res.json({ keys: await apiKeys.list(shopOf(req).shop.id) });
  });

  router.post('/', validate({ params: shopIdParamsSchema, body: createApiKeyRequestSchema }), async (req, res) => {
    authorize(req, 'create', 'ApiKey');
    const actor = auditActorOf(req);
    // Keys are refused ApiKey above, so a person is always behind this request.
    if (!actor.userId) throw new HttpError(403, 'forbidden', 'Only a signed-in owner can create API keys.');
    res.status(201).json(await apiKeys.create(shopOf(req).shop.id, bodyOf(createApiKeyRequestSchema, req), { ...actor, userId: actor.userId }));
  });

  router.post('/:apiKeyId/revoke', validate({ params: apiKeyParamsSchema }), async (req, res) => {
    authorize(req, 'delete', 'ApiKey');
    res.json(await apiKeys.revoke(shopOf(req).shop.id, String(req.params['apiKeyId']), auditActorOf(req)));
  });

  return router;
}
