import { EntitySchema } from 'typeorm';
import type { ShopRole } from '@tappet/contracts';

/** Billing states a shop moves through (Stripe webhooks drive them later). */
export type BillingState = 'trial' | 'active' | 'past_due' | 'suspended' | 'cancelled';

/** A tenant: one restoration shop. */
export interface Shop {
  id: string;
  name: string;
  slug: string;
  billingState: BillingState;
  createdAt: Date;
}

export const ShopEntity = new EntitySchema<Shop>({
  name: 'Shop',
  tableName: 'shops',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    name: { type: 'varchar', length: 200 },
    slug: { type: 'varchar', length: 100, unique: true },
    billingState: { type: 'varchar', length: 20, name: 'billing_state', default: 'trial' },
    createdAt: { type: 'datetime', name: 'created_at' },
  },
});

/** A person's standing in one shop. Shop-owned: carries `shopId`. */
export interface Membership {
  id: string;
  shopId: string;
  userId: string;
  role: ShopRole;
  /** Purchase orders up to this total (minor units) need no approval; null = none set. */
  spendingLimitMinor: number | null;
  isActive: boolean;
  createdAt: Date;
}

export const MembershipEntity = new EntitySchema<Membership>({
  name: 'Membership',
  tableName: 'memberships',
  columns: {
    id: { type: 'varchar', length: 36, primary: true },
    shopId: { type: 'varchar', length: 36, name: 'shop_id' },
    userId: { type: 'varchar', length: 36, name: 'user_id' },
    role: { type: 'varchar', length: 20 },
    spendingLimitMinor: { type: 'integer', name: 'spending_limit_minor', nullable: true },
    isActive: { type: 'boolean', name: 'is_active', default: true },
    createdAt: { type: 'datetime', name: 'created_at' },
  },
});

/** Billing states in which a shop is read-only (nothing is deleted for non-payment). */
export const readOnlyBillingStates: BillingState[] = ['suspended', 'cancelled'];
