// Data for tests that call every route as every persona: a plan, spare shops to suspend and to
// reactivate, a suspended shop with its owner, and support grants switched on and off.
import { randomUUID } from 'node:crypto';
import { IsNull } from 'typeorm';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { PlanEntity, ShopBillingEntity, SupportGrantEntity } from '../billing/billing.entity';
import { defaultBilling } from '../billing/billing-state';
import { MembershipEntity, ShopEntity } from '../shops/shops.entity';
import { insertShop } from '../shops/shops.service';
import { createShopWithUsers } from '../test-support/test-support.service';

export interface PlatformFixture {
  planId: string;
  /** A shop not yet suspended, one per call. */
  nextShopToSuspend(): string;
  /** A shop suspended by hand, one per call. */
  nextSuspendedShopId(): string;
  /** A suspended shop (read-only) and its owner's sign-in. */
  readOnlyShop: { shopId: string; owner: { email: string; password: string } };
  /** Lets platform support into `shopId` until revoked, granted by the shop's first owner. */
  grantSupport(shopId: string): Promise<void>;
  /** Ends every support grant (so platform admins are outsiders again). */
  revokeAllGrants(): Promise<void>;
}

/** Seeds the platform fixture; `spare` shops each to suspend and to reactivate. */
export async function seedPlatformFixture(db: Database, clock: Clock, spare = 12): Promise<PlatformFixture> {
  const at = clock.now();
  const actor = { userId: null, ip: null };
  const planId = randomUUID();
  const readOnly = await createShopWithUsers(db, clock, { roles: ['owner'], namePrefix: 'Read-only Shop' });
  const { toSuspend, suspended } = await db.write(async (manager) => {
    await manager.insert(PlanEntity, { id: planId, name: `Matrix plan ${planId.slice(0, 8)}`, monthlyPriceMinor: 1900, currency: 'gbp', stripeLookupKey: `matrix_${planId.slice(0, 8)}`, seatLimit: null, catalogueLimit: null, vehicleLimit: null, isActive: true, createdAt: at, updatedAt: at });
    const make = async (label: string) => (await insertShop(manager, { name: `Matrix ${label} ${randomUUID().slice(0, 8)}`, at, actor })).id;
    const toSuspend: string[] = [];
    const suspended: string[] = [];
    for (let i = 0; i < spare; i++) toSuspend.push(await make('to suspend'));
    for (let i = 0; i < spare; i++) suspended.push(await make('suspended'));
    for (const shopId of [...suspended, readOnly.shop.id]) {
      await manager.insert(ShopBillingEntity, { ...defaultBilling(shopId, at), manualSuspensionReason: 'Matrix suspension', manualSuspendedAt: at });
      await manager.update(ShopEntity, { id: shopId }, { billingState: 'suspended' });
    }
    return { toSuspend, suspended };
  });
  const take = (ids: string[], what: string) => () => {
    const id = ids.shift();
    if (!id) throw new Error(`The platform fixture ran out of ${what}.`);
    return id;
  };
  return {
    planId,
    nextShopToSuspend: take(toSuspend, 'shops to suspend'),
    nextSuspendedShopId: take(suspended, 'suspended shops'),
    readOnlyShop: { shopId: readOnly.shop.id, owner: { email: readOnly.users[0]!.email, password: readOnly.password } },
    async grantSupport(shopId) {
      const now = clock.now();
      const owner = await db.reader.findOneOrFail(MembershipEntity, { where: { shopId, role: 'owner' }, order: { createdAt: 'ASC' } });
      const grantedByUserId = owner.userId;
      await db.write((m) => m.insert(SupportGrantEntity, { id: randomUUID(), shopId, grantedByUserId, note: null, createdAt: now, expiresAt: new Date(now.getTime() + 3600_000), revokedAt: null, revokedByUserId: null }));
    },
    async revokeAllGrants() {
      await db.write((m) => m.update(SupportGrantEntity, { revokedAt: IsNull() }, { revokedAt: clock.now() }));
    },
  };
}
