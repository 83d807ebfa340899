import { Router, type Request } from 'express';
import { countEntrySchema, countIdParamsSchema, countListQuerySchema, countStartSchema, shopIdParamsSchema } from '@tappet/contracts';
import type { z } from 'zod';
import { auditActorOf } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import type { AuditActor } from '../audit/audit.service';
import type { CountsService } from './counts.service';

const actorOf = (req: Request): AuditActor => {
  const { userId, apiKeyId, ip } = auditActorOf(req);
  return { userId, apiKeyId, ip };
};
const shopId = (req: Request) => shopOf(req).shop.id;
const countId = (req: Request) => req.params['countId'] as string;

/**
 * /api/shops/:shopId/counts: stock counts (behind requireAuth and tenantContext). Everyone in the
 * shop reads them; owners and buyers start and abandon them; owners, buyers and mechanics enter
 * what they counted; the owner posts (libs/permissions, subject StockCount).
 */
export function countsRouter(deps: { counts: CountsService }): Router {
  const { counts } = deps;
  const router = Router({ mergeParams: true });

  router.get('/', validate({ params: shopIdParamsSchema, query: countListQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'StockCount');
    res.json(await counts.list(shopId(req), req.query as unknown as z.output<typeof countListQuerySchema>));
  });

  router.post('/', validate({ params: shopIdParamsSchema, body: countStartSchema }), async (req, res) => {
    authorize(req, 'create', 'StockCount');
    res.status(201).json(await counts.start(shopId(req), bodyOf(countStartSchema, req), actorOf(req)));
  });

  router.get('/:countId', validate({ params: countIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'StockCount');
    res.json(await counts.detail(shopId(req), countId(req)));
  });

  router.post('/:countId/entries', validate({ params: countIdParamsSchema, body: countEntrySchema }), async (req, res) => {
    authorize(req, 'count', 'StockCount');
    res.status(201).json(await counts.enter(shopId(req), countId(req), bodyOf(countEntrySchema, req), actorOf(req)));
  });

  router.get('/:countId/variances', validate({ params: countIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'StockCount');
    res.json(await counts.variances(shopId(req), countId(req)));
  });

  router.post('/:countId/post', validate({ params: countIdParamsSchema }), async (req, res) => {
    authorize(req, 'approve', 'StockCount');
    res.json(await counts.post(shopId(req), countId(req), actorOf(req)));
  });

  router.post('/:countId/abandon', validate({ params: countIdParamsSchema }), async (req, res) => {
    authorize(req, 'update', 'StockCount');
    res.json(await counts.abandon(shopId(req), countId(req), actorOf(req)));
  });

  return router;
}
