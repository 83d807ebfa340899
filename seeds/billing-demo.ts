/* eslint-disable @nx/enforce-module-boundaries -- the seed writes through the API's own data layer
   (entities, migrations, write lock); see docs/decisions/002-module-boundaries.md. */
import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { recordAudit } from '../apps/api/src/modules/audit/audit.service';
import { PlanEntity, type Plan } from '../apps/api/src/modules/billing/billing.entity';
import { defaultBilling } from '../apps/api/src/modules/billing/billing-state';
import { applyBillingState, saveBilling } from '../apps/api/src/modules/billing/billing.service';
import { ShopEntity } from '../apps/api/src/modules/shops/shops.entity';

const day = 24 * 3600_000;

/**
 * Tappet's plans, with their own names. Each maps to a Stripe price by lookup key; the local fake
 * Stripe API starts with the same prices (tools/fake-stripe/demo-catalogue.json, checked by a test).
 */
export const demoPlans: Array<Omit<Plan, 'id' | 'isActive' | 'createdAt' | 'updatedAt'>> = [
  { name: 'Workbench', monthlyPriceMinor: 1900, currency: 'gbp', stripeLookupKey: 'tappet_workbench_monthly', seatLimit: 3, catalogueLimit: 2000, vehicleLimit: 10 },
  { name: 'Restoration Bay', monthlyPriceMinor: 4900, currency: 'gbp', stripeLookupKey: 'tappet_restoration_bay_monthly', seatLimit: 10, catalogueLimit: 20000, vehicleLimit: 60 },
  { name: 'Coachworks', monthlyPriceMinor: 9900, currency: 'gbp', stripeLookupKey: 'tappet_coachworks_monthly', seatLimit: null, catalogueLimit: null, vehicleLimit: null },
];

/**
 * Billing for the demo: the plans, Harbour Works on Restoration Bay with nine trial days left, and
 * Brackenfold Garage on Workbench whose trial ended three days ago without a card, so it shows
 * the past-due banner. Runs inside the demo seed's write.
 */
export async function seedBillingDemo(manager: EntityManager, shops: { harbour: string; brackenfold: string }, at: Date): Promise<void> {
  const actor = { userId: null, ip: null };
  const ids = new Map<string, string>();
  for (const p of demoPlans) {
    const plan: Plan = { id: randomUUID(), ...p, isActive: true, createdAt: at, updatedAt: at };
    ids.set(p.name, plan.id);
    await manager.insert(PlanEntity, plan);
    await recordAudit(manager, { shopId: null, actor, action: 'plan.created', entity: 'plan', entityId: plan.id, changes: { name: { before: null, after: plan.name } }, at });
  }
  const setUp = async (shopId: string, planName: string, trialEndsAt: Date) => {
    const record = { ...defaultBilling(shopId, at), planId: ids.get(planName)!, trialEndsAt };
    await saveBilling(manager, record);
    const shop = await manager.findOneByOrFail(ShopEntity, { id: shopId });
    await applyBillingState(manager, shop, record, at, actor, 'demo');
  };
  await setUp(shops.harbour, 'Restoration Bay', new Date(at.getTime() + 9 * day));
  await setUp(shops.brackenfold, 'Workbench', new Date(at.getTime() - 3 * day));
}
