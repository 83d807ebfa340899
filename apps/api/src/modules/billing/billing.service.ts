import { createHash, randomUUID } from 'node:crypto';
import type Stripe from 'stripe';
import type { EntityManager } from 'typeorm';
import type { BillingOverview, BillingStatus, CreatePlanRequest, PlanView, UpdatePlanRequest } from '@tappet/contracts';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { HttpError, badRequest, notFound } from '../../lib/http-error';
import { recordAudit, diffChanges, type AuditActor } from '../audit/audit.service';
import { ShopEntity, type BillingState, type Shop } from '../shops/shops.entity';
import { BillingEventEntity, PlanEntity, ShopBillingEntity, type Plan, type ShopBilling } from './billing.entity';
import { billingStatusOf, defaultBilling, deriveBillingState, readOnlyReasonOf } from './billing-state';
import { catalogueSize, planLimitsFor, seatsUsed, vehicleCount } from './plan-limits';
import { recordCardPayment, salesCheckoutOf } from '../sales/card-payments';

const conflict = (message: string) => new HttpError(409, 'conflict', message);
const systemActor: AuditActor = { userId: null, ip: null };
/** Stripe statuses of a subscription that is still paying, trialling or being chased. */
const liveStatuses = new Set(['active', 'trialing', 'past_due', 'unpaid', 'paused']);
/** Products of Tappet's plans share this family, so the portal offers switching between them. */
const planFamily = 'tappet-plans';

export interface BillingServiceDeps {
  db: Database;
  clock: Clock;
  stripe: Stripe;
  webhookSecret: string;
  /** Base URL of the web app, for Checkout's and the portal's return links. */
  publicUrl: string;
  onError?: (err: unknown, message: string) => void;
}

/** The public view of a plan. */
export function toPlanView(p: Plan): PlanView {
  return {
    id: p.id,
    name: p.name,
    monthlyPriceMinor: p.monthlyPriceMinor,
    currency: p.currency,
    stripeLookupKey: p.stripeLookupKey,
    seatLimit: p.seatLimit,
    catalogueLimit: p.catalogueLimit,
    vehicleLimit: p.vehicleLimit,
    isActive: p.isActive,
  };
}

/** The shop's billing record, or the implicit one of a shop that has none yet. */
/** How long a shop's billing state and record, as read by `refreshState`, are trusted. */
const refreshEveryMs = 5_000;
const recentBilling = new Map<string, { at: number; state: Shop['billingState']; record: ShopBilling }>();

export async function billingOf(manager: EntityManager, shop: Pick<Shop, 'id' | 'createdAt'>): Promise<ShopBilling> {
  return (await manager.findOne(ShopBillingEntity, { where: { shopId: shop.id } })) ?? defaultBilling(shop.id, shop.createdAt);
}

/** Saves a billing record (insert or update), inside a write. */
export async function saveBilling(manager: EntityManager, record: ShopBilling): Promise<void> {
  recentBilling.delete(record.shopId);
  const exists = await manager.exists(ShopBillingEntity, { where: { shopId: record.shopId } });
  if (exists) {
    const { shopId, ...rest } = record;
    await manager.update(ShopBillingEntity, { shopId }, rest);
  } else {
    await manager.insert(ShopBillingEntity, record);
  }
}

/**
 * Stores the state derived from `record` on the shop when it changed, with an audit event.
 * Call inside a write. Returns the state.
 */
export async function applyBillingState(manager: EntityManager, shop: Shop, record: ShopBilling, now: Date, actor: AuditActor, cause: string): Promise<BillingState> {
  const state = deriveBillingState(record, now);
  if (state !== shop.billingState) {
    recentBilling.delete(shop.id);
    await manager.update(ShopEntity, { id: shop.id }, { billingState: state });
    await recordAudit(manager, {
      shopId: shop.id,
      actor,
      action: 'billing.state_changed',
      entity: 'shop',
      entityId: shop.id,
      changes: { billingState: { before: shop.billingState, after: state }, cause: { before: null, after: cause } },
      at: now,
    });
  }
  return state;
}

/**
 * Time alone only makes things worse: a trial runs out, a grace period ends. Getting better
 * (paying, reactivation) comes from Stripe or a platform admin, inside their own writes.
 */
function timeMovesOn(stored: BillingState, derived: BillingState): boolean {
  return (stored === 'trial' && (derived === 'past_due' || derived === 'suspended')) || (stored === 'past_due' && derived === 'suspended');
}

/** The subscription (and customer) an event is about, by the event type's own field. */
function subscriptionRefOf(event: Stripe.Event): { subscriptionId: string | null; shopHint: string | null } {
  const object = event.data.object as unknown as Record<string, unknown>;
  const idOf = (v: unknown): string | null => (typeof v === 'string' ? v : v && typeof v === 'object' && 'id' in v && typeof v.id === 'string' ? v.id : null);
  switch (event.type) {
    case 'checkout.session.completed':
      return { subscriptionId: idOf(object['subscription']), shopHint: typeof object['client_reference_id'] === 'string' ? object['client_reference_id'] : null };
    case 'customer.subscription.created':
    case 'customer.subscription.updated':
    case 'customer.subscription.deleted':
      return { subscriptionId: idOf(object['id']), shopHint: null };
    case 'invoice.paid':
    case 'invoice.payment_failed': {
      const parent = object['parent'] as { subscription_details?: { subscription?: unknown } } | null | undefined;
      return { subscriptionId: idOf(parent?.subscription_details?.subscription), shopHint: null };
    }
    default:
      return { subscriptionId: null, shopHint: null };
  }
}

/** Subscriptions, plans and billing states: Checkout, the billing portal and Stripe's webhooks. */
export function createBillingService(deps: BillingServiceDeps) {
  const { db, clock, stripe } = deps;

  async function shopOr404(manager: EntityManager, shopId: string): Promise<Shop> {
    const shop = await manager.findOne(ShopEntity, { where: { id: shopId } });
    if (!shop) throw notFound('No such shop.');
    return shop;
  }

  /** The Stripe price of a plan, found by lookup key; created (or replaced) when missing or stale. */
  async function priceFor(plan: Plan): Promise<Stripe.Price> {
    const found = await stripe.prices.list({ lookup_keys: [plan.stripeLookupKey], active: true, limit: 1 });
    const current = found.data[0];
    if (current && current.unit_amount === plan.monthlyPriceMinor && current.currency === plan.currency && current.recurring?.interval === 'month') return current;
    const productId =
      current && typeof current.product === 'string'
        ? current.product
        : (await stripe.products.create({ name: `Tappet ${plan.name}`, metadata: { family: planFamily, planId: plan.id } })).id;
    // A new price takes the lookup key over, so existing subscribers keep their old price.
    return stripe.prices.create({
      product: productId,
      currency: plan.currency,
      unit_amount: plan.monthlyPriceMinor,
      recurring: { interval: 'month' },
      lookup_key: plan.stripeLookupKey,
      transfer_lookup_key: true,
      nickname: plan.name,
    });
  }

  /** Applies a subscription as re-read from Stripe to the shop it belongs to, inside a write. */
  async function applySubscription(manager: EntityManager, sub: Stripe.Subscription, shopHint: string | null, now: Date, cause: string): Promise<string | null> {
    const customerId = typeof sub.customer === 'string' ? sub.customer : sub.customer.id;
    const metaShop = sub.metadata?.['shopId'] ?? null;
    let record =
      (await manager.findOne(ShopBillingEntity, { where: { stripeSubscriptionId: sub.id } })) ?? (await manager.findOne(ShopBillingEntity, { where: { stripeCustomerId: customerId } }));
    const shopId = record?.shopId ?? metaShop ?? shopHint;
    if (!shopId) return null;
    const shop = await manager.findOne(ShopEntity, { where: { id: shopId } });
    if (!shop) return null;
    record ??= await billingOf(manager, shop);
    // An old subscription's late news must not overwrite the live one that replaced it.
    if (record.stripeSubscriptionId && record.stripeSubscriptionId !== sub.id && liveStatuses.has(record.stripeStatus ?? '') && !liveStatuses.has(sub.status)) return shop.id;
    const item = sub.items.data[0];
    const lookupKey = item?.price.lookup_key ?? null;
    const plan = lookupKey ? await manager.findOne(PlanEntity, { where: { stripeLookupKey: lookupKey } }) : null;
    const periodEnd = item?.current_period_end ? new Date(item.current_period_end * 1000) : null;
    const pastDue = sub.status === 'past_due' || sub.status === 'paused';
    const next: ShopBilling = {
      ...record,
      planId: plan?.id ?? record.planId,
      stripeCustomerId: customerId,
      stripeSubscriptionId: sub.id,
      stripeStatus: sub.status,
      currentPeriodEnd: periodEnd,
      cancelAtPeriodEnd: sub.cancel_at_period_end,
      // The grace period counts from the first time the shop was seen past due in this episode.
      pastDueSince: pastDue || sub.status === 'unpaid' ? (record.pastDueSince ?? now) : null,
      updatedAt: now,
    };
    const changes = diffChanges(record, { planId: next.planId, stripeStatus: next.stripeStatus, stripeSubscriptionId: next.stripeSubscriptionId, cancelAtPeriodEnd: next.cancelAtPeriodEnd });
    await saveBilling(manager, next);
    if (Object.keys(changes).length > 0) {
      await recordAudit(manager, { shopId: shop.id, actor: systemActor, action: 'billing.subscription_synced', entity: 'subscription', entityId: sub.id, changes, at: now });
    }
    await applyBillingState(manager, shop, next, now, systemActor, cause);
    return shop.id;
  }

  const service = {
    /**
     * Moves the shop's stored state on when time alone changed it (a trial ending, the grace
     * period running out). Cheap when nothing changed: one read, no write.
     */
    async refreshState(shopId: string): Promise<void> {
      const now = clock.now();
      // Every request to a shop asks, so the shop's state and billing record are kept for a few
      // seconds (per process) and the clock is applied to them afresh each time: a trial ending
      // is seen at once. Writes here forget them; a change made by another process is seen within
      // seconds, and the write below re-reads everything before it changes anything.
      let known = recentBilling.get(shopId);
      if (!known || now.getTime() - known.at < 0 || now.getTime() - known.at >= refreshEveryMs) {
        const shop = await db.reader.findOne(ShopEntity, { where: { id: shopId } });
        if (!shop) return;
        known = { at: now.getTime(), state: shop.billingState, record: await billingOf(db.reader, shop) };
        if (recentBilling.size > 10_000) recentBilling.clear();
        recentBilling.set(shopId, known);
      }
      if (!timeMovesOn(known.state, deriveBillingState(known.record, now))) return;
      recentBilling.delete(shopId);
      await db.write(async (manager) => {
        const fresh = await shopOr404(manager, shopId);
        const next = await billingOf(manager, fresh);
        if (timeMovesOn(fresh.billingState, deriveBillingState(next, now))) await applyBillingState(manager, fresh, next, now, systemActor, 'time');
      });
    },

    /** Brings every shop's stored state up to date (the platform console lists them). */
    async refreshAll(): Promise<void> {
      const shops = await db.reader.find(ShopEntity);
      for (const shop of shops) await service.refreshState(shop.id);
    },

    /** The sentence a refused write answers with while the shop is read-only, else null. */
    async readOnlyReason(shopId: string): Promise<string | null> {
      const shop = await db.reader.findOne(ShopEntity, { where: { id: shopId } });
      if (!shop) return null;
      return readOnlyReasonOf(shop.billingState, await billingOf(db.reader, shop));
    },

    /** The state every member may see, with the read-only reason. */
    async status(shop: Shop): Promise<BillingStatus> {
      const record = await billingOf(db.reader, shop);
      return billingStatusOf(shop.billingState, record, clock.now());
    },

    /** The owner's billing page: plan, state, usage, and the plans to choose from. */
    async overview(shop: Shop): Promise<BillingOverview> {
      const record = await billingOf(db.reader, shop);
      const now = clock.now();
      const plans = await db.reader.find(PlanEntity, { where: { isActive: true }, order: { monthlyPriceMinor: 'ASC' } });
      const plan = record.planId ? await db.reader.findOne(PlanEntity, { where: { id: record.planId } }) : null;
      const limits = await planLimitsFor(db.reader, shop.id);
      return {
        status: billingStatusOf(shop.billingState, record, now),
        plan: plan ? toPlanView(plan) : null,
        plans: plans.map(toPlanView),
        usage: {
          seats: { used: await seatsUsed(db.reader, shop.id, now), limit: limits?.seats ?? null },
          catalogue: { used: await catalogueSize(db.reader, shop.id), limit: limits?.catalogue ?? null },
          vehicles: { used: await vehicleCount(db.reader, shop.id), limit: limits?.vehicles ?? null },
        },
        subscription: { canOpenPortal: record.stripeCustomerId !== null, subscribed: record.stripeSubscriptionId !== null && liveStatuses.has(record.stripeStatus ?? ''), currentPeriodEnd: record.currentPeriodEnd?.toISOString() ?? null, cancelAtPeriodEnd: record.cancelAtPeriodEnd },
      };
    },

    /** A Stripe Checkout session for the plan; the shop becomes active when Stripe says it paid. */
    async startCheckout(shop: Shop, planId: string, actor: AuditActor, returnPath: string): Promise<{ url: string }> {
      const plan = await db.reader.findOne(PlanEntity, { where: { id: planId, isActive: true } });
      if (!plan) throw notFound('No such plan.');
      const record = await billingOf(db.reader, shop);
      if (record.stripeSubscriptionId && liveStatuses.has(record.stripeStatus ?? '')) {
        throw conflict('This shop already has a subscription: change the plan or card in the billing portal.');
      }
      // Network calls happen outside the write lock; only their results are stored.
      let customerId = record.stripeCustomerId;
      if (!customerId) {
        // One customer per shop: a second checkout started before the first stored its customer
        // (a double click, two owners) gets the same customer back from Stripe instead of a new
        // one. The name is in the key because Stripe refuses a key reused with other parameters.
        const idempotencyKey = `tappet-customer-${shop.id}-${createHash('sha256').update(shop.name).digest('hex').slice(0, 16)}`;
        const customer = await stripe.customers.create({ name: shop.name, metadata: { shopId: shop.id } }, { idempotencyKey });
        customerId = customer.id;
      }
      const price = await priceFor(plan);
      const back = `${deps.publicUrl}${returnPath}`;
      const session = await stripe.checkout.sessions.create({
        mode: 'subscription',
        customer: customerId,
        client_reference_id: shop.id,
        line_items: [{ price: price.id, quantity: 1 }],
        success_url: `${back}?checkout=done`,
        cancel_url: `${back}?checkout=cancelled`,
        subscription_data: { metadata: { shopId: shop.id, planId: plan.id } },
        metadata: { shopId: shop.id },
      });
      if (!session.url) throw new HttpError(502, 'internal', 'Stripe did not return a checkout page. Try again.');
      const now = clock.now();
      await db.write(async (manager) => {
        const current = await billingOf(manager, shop);
        if (current.stripeCustomerId !== customerId) await saveBilling(manager, { ...current, stripeCustomerId: customerId, updatedAt: now });
        await recordAudit(manager, { shopId: shop.id, actor, action: 'billing.checkout_started', entity: 'subscription', entityId: session.id, changes: { plan: { before: null, after: plan.name } }, at: now });
      });
      return { url: session.url };
    },

    /** A billing-portal session where the owner manages the card, the plan and cancellation. */
    async openPortal(shop: Shop, actor: AuditActor, returnPath: string): Promise<{ url: string }> {
      const record = await billingOf(db.reader, shop);
      if (!record.stripeCustomerId) throw conflict('This shop has not subscribed yet: choose a plan first.');
      const session = await stripe.billingPortal.sessions.create({ customer: record.stripeCustomerId, return_url: `${deps.publicUrl}${returnPath}` });
      await db.write((manager) => recordAudit(manager, { shopId: shop.id, actor, action: 'billing.portal_opened', entity: 'subscription', entityId: record.stripeSubscriptionId, at: clock.now() }));
      return { url: session.url };
    },

    /**
     * A Stripe webhook: verified with the SDK against the raw body (400 and nothing changed when
     * the signature is bad), processed once per event id, and applied by re-reading the
     * subscription from Stripe so events arriving out of order cannot leave a stale state.
     */
    async handleWebhook(rawBody: Buffer, signature: string | undefined): Promise<{ duplicate: boolean }> {
      if (!signature) throw badRequest('The Stripe-Signature header is missing.');
      let event: Stripe.Event;
      try {
        event = stripe.webhooks.constructEvent(rawBody, signature, deps.webhookSecret);
      } catch {
        throw badRequest('The webhook signature does not verify.');
      }
      if (await db.reader.exists(BillingEventEntity, { where: { id: event.id } })) return { duplicate: true };
      const ref = subscriptionRefOf(event);
      // Re-read outside the lock; a failure answers 5xx so Stripe retries later.
      const sub = ref.subscriptionId ? await stripe.subscriptions.retrieve(ref.subscriptionId) : null;
      const now = clock.now();
      return db.write(async (manager) => {
        if (await manager.exists(BillingEventEntity, { where: { id: event.id } })) return { duplicate: true };
        // Sales (issue 12): a one-off Checkout session paying a shop's invoice is the sales module's.
        const salesSession = salesCheckoutOf(event);
        const shopId = salesSession ? await recordCardPayment(manager, salesSession, now) : sub ? await applySubscription(manager, sub, ref.shopHint, now, event.type) : null;
        await manager.insert(BillingEventEntity, { id: event.id, type: event.type, shopId, receivedAt: now });
        return { duplicate: false };
      });
    },

    // Plans, kept by platform admins.

    async listPlans(): Promise<PlanView[]> {
      const plans = await db.reader.find(PlanEntity, { order: { monthlyPriceMinor: 'ASC', name: 'ASC' } });
      return plans.map(toPlanView);
    },

    async createPlan(input: CreatePlanRequest, actor: AuditActor): Promise<PlanView> {
      const now = clock.now();
      const plan: Plan = { id: randomUUID(), ...input, isActive: true, createdAt: now, updatedAt: now };
      await db.write(async (manager) => {
        if (await manager.exists(PlanEntity, { where: { name: input.name } })) throw conflict('A plan with this name exists already.');
        if (await manager.exists(PlanEntity, { where: { stripeLookupKey: input.stripeLookupKey } })) throw conflict('Another plan uses this Stripe lookup key.');
        await manager.insert(PlanEntity, plan);
        await recordAudit(manager, { shopId: null, actor, action: 'plan.created', entity: 'plan', entityId: plan.id, changes: diffChanges({} as Partial<Plan>, input), at: now });
      });
      return toPlanView(plan);
    },

    async updatePlan(planId: string, patch: UpdatePlanRequest, actor: AuditActor): Promise<PlanView> {
      const now = clock.now();
      return db.write(async (manager) => {
        const plan = await manager.findOne(PlanEntity, { where: { id: planId } });
        if (!plan) throw notFound('No such plan.');
        if (patch.name && patch.name !== plan.name && (await manager.exists(PlanEntity, { where: { name: patch.name } }))) throw conflict('A plan with this name exists already.');
        if (patch.stripeLookupKey && patch.stripeLookupKey !== plan.stripeLookupKey && (await manager.exists(PlanEntity, { where: { stripeLookupKey: patch.stripeLookupKey } }))) {
          throw conflict('Another plan uses this Stripe lookup key.');
        }
        const changes = diffChanges(plan, patch);
        if (Object.keys(changes).length === 0) return toPlanView(plan);
        await manager.update(PlanEntity, { id: plan.id }, { ...patch, updatedAt: now });
        await recordAudit(manager, { shopId: null, actor, action: 'plan.updated', entity: 'plan', entityId: plan.id, changes, at: now });
        return toPlanView({ ...plan, ...patch, updatedAt: now });
      });
    },

    // Hand suspension by a platform admin, with a reason; reactivation lifts it.

    async suspendByHand(shopId: string, reason: string, actor: AuditActor): Promise<BillingState> {
      const now = clock.now();
      return db.write(async (manager) => {
        const shop = await shopOr404(manager, shopId);
        const record = await billingOf(manager, shop);
        if (record.manualSuspensionReason) throw conflict('This shop is already suspended by hand.');
        const next = { ...record, manualSuspensionReason: reason, manualSuspendedAt: now, updatedAt: now };
        await saveBilling(manager, next);
        await recordAudit(manager, { shopId, actor, action: 'shop.suspended', entity: 'shop', entityId: shopId, changes: { reason: { before: null, after: reason } }, at: now });
        return applyBillingState(manager, shop, next, now, actor, 'suspended by hand');
      });
    },

    async reactivateByHand(shopId: string, reason: string, actor: AuditActor): Promise<BillingState> {
      const now = clock.now();
      return db.write(async (manager) => {
        const shop = await shopOr404(manager, shopId);
        const record = await billingOf(manager, shop);
        if (!record.manualSuspensionReason) throw conflict('This shop is not suspended by hand; its state follows its subscription.');
        const next = { ...record, manualSuspensionReason: null, manualSuspendedAt: null, updatedAt: now };
        await saveBilling(manager, next);
        await recordAudit(manager, { shopId, actor, action: 'shop.reactivated', entity: 'shop', entityId: shopId, changes: { reason: { before: record.manualSuspensionReason, after: reason } }, at: now });
        return applyBillingState(manager, shop, next, now, actor, 'reactivated by hand');
      });
    },
  };
  return service;
}

export type BillingService = ReturnType<typeof createBillingService>;
