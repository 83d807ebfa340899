import express, { Router } from 'express';
import { checkoutRequestSchema, shopIdParamsSchema } from '@tappet/contracts';
import { auditActorOf } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import type { BillingService } from './billing.service';

/** Where Checkout and the portal send the browser back to (the web app's billing page). */
export const billingPagePath = (shopId: string) => `/shops/${shopId}/billing`;

/** /api/shops/:shopId/billing (behind the tenant context). */
export function billingRouter(deps: { billing: BillingService }): Router {
  const { billing } = deps;
  const router = Router({ mergeParams: true });

  // Every member sees the state, so the past-due banner and the read-only notice can show.
  router.get('/status', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Shop');
    res.json(await billing.status(shopOf(req).shop));
  });

  router.get('/', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Billing');
    res.json(await billing.overview(shopOf(req).shop));
  });

  router.post('/checkout', validate({ params: shopIdParamsSchema, body: checkoutRequestSchema }), async (req, res) => {
    authorize(req, 'update', 'Billing');
    const { shop } = shopOf(req);
    res.json(await billing.startCheckout(shop, bodyOf(checkoutRequestSchema, req).planId, auditActorOf(req), billingPagePath(shop.id)));
  });

  router.post('/portal', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'update', 'Billing');
    const { shop } = shopOf(req);
    res.json(await billing.openPortal(shop, auditActorOf(req), billingPagePath(shop.id)));
  });

  return router;
}

/**
 * POST /api/billing/webhook: Stripe's events. Mounted before the CSRF check and the JSON parser,
 * because the signature is over the exact bytes Stripe sent.
 */
export function billingWebhookRouter(deps: { billing: BillingService }): Router {
  const router = Router();
  router.post('/', express.raw({ type: 'application/json', limit: '1mb' }), async (req, res) => {
    const body = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
    const outcome = await deps.billing.handleWebhook(body, req.get('stripe-signature'));
    res.json({ received: true, duplicate: outcome.duplicate });
  });
  return router;
}
