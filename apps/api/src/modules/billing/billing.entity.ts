import { EntitySchema } from 'typeorm';

/** A plan: Tappet's own name, a monthly price and limits (null = no limit). */
export interface Plan {
  id: string;
  name: string;
  monthlyPriceMinor: number;
  currency: string;
  /** The Stripe price is found by this lookup key, never by a stored price id. */
  stripeLookupKey: string;
  seatLimit: number | null;
  catalogueLimit: number | null;
  vehicleLimit: number | null;
  isActive: boolean;
  createdAt: Date;
  updatedAt: Date;
}

export const PlanEntity = new EntitySchema<Plan>({
  name: 'Plan',
  tableName: 'plans',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    name: { type: 'varchar', length: 60, unique: true },
    monthlyPriceMinor: { type: 'integer', name: 'monthly_price_minor' },
    currency: { type: 'varchar', length: 3 },
    stripeLookupKey: { type: 'varchar', length: 200, name: 'stripe_lookup_key', unique: true },
    seatLimit: { type: 'integer', name: 'seat_limit', nullable: true },
    catalogueLimit: { type: 'integer', name: 'catalogue_limit', nullable: true },
    vehicleLimit: { type: 'integer', name: 'vehicle_limit', nullable: true },
    isActive: { type: 'boolean', name: 'is_active', default: true },
    createdAt: { type: 'datetime', name: 'created_at' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

/** A shop's billing record: its plan, trial, and what Stripe last said about its subscription. */
export interface ShopBilling {
  shopId: string;
  planId: string | null;
  trialEndsAt: Date;
  stripeCustomerId: string | null;
  stripeSubscriptionId: string | null;
  /** Stripe's own status, as last re-read from the API. */
  stripeStatus: string | null;
  currentPeriodEnd: Date | null;
  cancelAtPeriodEnd: boolean;
  /** When the shop first became past due in this episode; the 14-day grace counts from it. */
  pastDueSince: Date | null;
  /** Set while a platform admin has suspended the shop by hand. */
  manualSuspensionReason: string | null;
  manualSuspendedAt: Date | null;
  updatedAt: Date;
}

export const ShopBillingEntity = new EntitySchema<ShopBilling>({
  name: 'ShopBilling',
  tableName: 'shop_billing',
  columns: {
    shopId: { type: 'varchar', length: 36, name: 'shop_id', primary: true },
    planId: { type: 'varchar', length: 36, name: 'plan_id', nullable: true },
    trialEndsAt: { type: 'datetime', name: 'trial_ends_at' },
    stripeCustomerId: { type: 'varchar', length: 100, name: 'stripe_customer_id', nullable: true },
    stripeSubscriptionId: { type: 'varchar', length: 100, name: 'stripe_subscription_id', nullable: true },
    stripeStatus: { type: 'varchar', length: 30, name: 'stripe_status', nullable: true },
    currentPeriodEnd: { type: 'datetime', name: 'current_period_end', nullable: true },
    cancelAtPeriodEnd: { type: 'boolean', name: 'cancel_at_period_end', default: false },
    pastDueSince: { type: 'datetime', name: 'past_due_since', nullable: true },
    manualSuspensionReason: { type: 'varchar', length: 500, name: 'manual_suspension_reason', nullable: true },
    manualSuspendedAt: { type: 'datetime', name: 'manual_suspended_at', nullable: true },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});

/** A Stripe event already processed; its id is the primary key, so each is handled once. */
export interface BillingEvent {
  id: string;
  type: string;
  shopId: string | null;
  receivedAt: Date;
}

export const BillingEventEntity = new EntitySchema<BillingEvent>({
  name: 'BillingEvent',
  tableName: 'billing_events',
  columns: {
    id: { type: 'varchar', length: 100, primary: true },
    type: { type: 'varchar', length: 100 },
    shopId: { type: 'varchar', length: 36, name: 'shop_id', nullable: true },
    receivedAt: { type: 'datetime', name: 'received_at' },
  },
});

/** An owner's time-boxed permission for platform support to see the shop. Shop-owned. */
export interface SupportGrant {
  id: string;
  shopId: string;
  grantedByUserId: string;
  note: string | null;
  createdAt: Date;
  expiresAt: Date;
  revokedAt: Date | null;
  revokedByUserId: string | null;
}

export const SupportGrantEntity = new EntitySchema<SupportGrant>({
  name: 'SupportGrant',
  tableName: 'support_grants',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    grantedByUserId: { type: 'varchar', length: 36, name: 'granted_by_user_id' },
    note: { type: 'varchar', length: 500, nullable: true },
    createdAt: { type: 'datetime', name: 'created_at' },
    expiresAt: { type: 'datetime', name: 'expires_at' },
    revokedAt: { type: 'datetime', name: 'revoked_at', nullable: true },
    revokedByUserId: { type: 'varchar', length: 36, name: 'revoked_by_user_id', nullable: true },
  },
});

export const billingEntities = [PlanEntity, ShopBillingEntity, BillingEventEntity, SupportGrantEntity];
