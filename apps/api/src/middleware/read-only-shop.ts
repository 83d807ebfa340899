import type { Request, RequestHandler } from 'express';
import { idSchema } from '@tappet/contracts';
import { HttpError } from '../lib/http-error';
import { readOnlyBillingStates, type Shop } from '../modules/shops/shops.entity';

const safeMethods = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Shop routes that still take writes while the shop is read-only: paying again (billing) and
 * asking support for help (support access). Everything else under /api/shops/:id refuses writes.
 */
const openWhenReadOnly = /^\/(billing|support-access)(\/|$)/;

/** What the preflight learned about the shop in this request. */
interface ReadOnlyNote {
  reason: string | null;
}
const notes = new WeakMap<Request, ReadOnlyNote>();

/**
 * Mounted once before every /api/shops/:shopId router (app.ts): brings the shop's billing state up
 * to date with the clock (a trial ending, a grace period running out) and notes the sentence a
 * refused write will answer with. It answers nothing itself, so it reveals nothing to non-members.
 */
export function readOnlyPreflight(billing: { refreshState(shopId: string): Promise<void>; readOnlyReason(shopId: string): Promise<string | null> }): RequestHandler {
  return async (req, _res, next) => {
    const parsed = idSchema.safeParse(req.params['shopId']);
    if (!parsed.success || (!req.auth && !req.apiKey)) return next();
    await billing.refreshState(parsed.data);
    if (!safeMethods.has(req.method)) notes.set(req, { reason: await billing.readOnlyReason(parsed.data) });
    next();
  };
}

/**
 * The one read-only rule: in a suspended or cancelled shop every write answers 403 with the
 * reason (details `{ reason: 'shop_read_only', billingState }`); reads, the export, billing and
 * support access keep working. Called by `tenantContext` once the caller is known to be allowed
 * in the shop, so outsiders still get 404.
 */
export function refuseWritesWhenReadOnly(req: Request, shop: Shop): void {
  if (safeMethods.has(req.method) || !readOnlyBillingStates.includes(shop.billingState)) return;
  const rest = req.originalUrl.split('?')[0]!.replace(/^\/api\/shops\/[^/]+/, '');
  if (openWhenReadOnly.test(rest)) return;
  const reason = notes.get(req)?.reason ?? `This shop is read-only while its subscription is ${shop.billingState}. Nothing has been deleted.`;
  throw new HttpError(403, 'forbidden', reason, { reason: 'shop_read_only', billingState: shop.billingState });
}
