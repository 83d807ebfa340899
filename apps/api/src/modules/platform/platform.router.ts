import { Router, type RequestHandler } from 'express';
import {
  createPlanRequestSchema,
  onboardShopRequestSchema,
  planParamsSchema,
  platformShopListQuerySchema,
  platformShopParamsSchema,
  shopStateChangeRequestSchema,
  updatePlanRequestSchema,
  type PlatformShopListQuery,
} from '@tappet/contracts';
import { defineAbilityFor } from '@tappet/permissions';
import { auditActorOf, authOf, requireAuth } from '../../middleware/authenticate';
import { bodyOf, validate } from '../../middleware/validate';
import { forbidden } from '../../lib/http-error';
import type { BillingService } from '../billing/billing.service';
import type { PlatformService } from './platform.service';

/** 403 for anyone whose ability does not include the platform (shop users, API keys get 401 from authOf). */
const requirePlatformAdmin: RequestHandler = (req, _res, next) => {
  const { user } = authOf(req);
  const ability = defineAbilityFor({ userId: user.id, isPlatformAdmin: user.isPlatformAdmin, apiKeyId: null }, null);
  next(ability.can('manage', 'Platform') ? undefined : forbidden('Only platform admins may use the platform console.'));
};

/** /api/platform: the platform console (platform admins only). No shop data is reachable here. */
export function platformRouter(deps: { platform: PlatformService; billing: BillingService }): Router {
  const { platform, billing } = deps;
  const router = Router();
  router.use(requireAuth, requirePlatformAdmin);

  router.get('/shops', validate({ query: platformShopListQuerySchema }), async (req, res) => {
    res.json({ shops: await platform.listShops(req.query as PlatformShopListQuery), plans: await billing.listPlans() });
  });

  router.post('/shops', validate({ body: onboardShopRequestSchema }), async (req, res) => {
    res.status(201).json(await platform.onboard(bodyOf(onboardShopRequestSchema, req), auditActorOf(req)));
  });

  router.post('/shops/:shopId/suspend', validate({ params: platformShopParamsSchema, body: shopStateChangeRequestSchema }), async (req, res) => {
    const state = await billing.suspendByHand(String(req.params['shopId']), bodyOf(shopStateChangeRequestSchema, req).reason, auditActorOf(req));
    res.json({ billingState: state });
  });

  router.post('/shops/:shopId/reactivate', validate({ params: platformShopParamsSchema, body: shopStateChangeRequestSchema }), async (req, res) => {
    const state = await billing.reactivateByHand(String(req.params['shopId']), bodyOf(shopStateChangeRequestSchema, req).reason, auditActorOf(req));
    res.json({ billingState: state });
  });

  router.get('/plans', async (_req, res) => {
    res.json({ plans: await billing.listPlans() });
  });

  router.post('/plans', validate({ body: createPlanRequestSchema }), async (req, res) => {
    res.status(201).json(await billing.createPlan(bodyOf(createPlanRequestSchema, req), auditActorOf(req)));
  });

  router.patch('/plans/:planId', validate({ params: planParamsSchema, body: updatePlanRequestSchema }), async (req, res) => {
    res.json(await billing.updatePlan(String(req.params['planId']), bodyOf(updatePlanRequestSchema, req), auditActorOf(req)));
  });

  return router;
}
