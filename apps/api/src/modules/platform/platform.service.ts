import type { OnboardShopRequest, PlatformShop, PlatformShopListQuery } from '@tappet/contracts';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { notFound } from '../../lib/http-error';
import type { AuditActor } from '../audit/audit.service';
import { AuditEventEntity } from '../audit/audit.entity';
import { PlanEntity, ShopBillingEntity, SupportGrantEntity } from '../billing/billing.entity';
import { defaultBilling } from '../billing/billing-state';
import type { BillingService } from '../billing/billing.service';
import { saveBilling } from '../billing/billing.service';
import { ShopEntity } from '../shops/shops.entity';
import { insertShop } from '../shops/shops.service';
import type { StaffService } from '../staff/staff.service';
import { catalogueSize, seatsUsed } from '../billing/plan-limits';
import { IsNull, MoreThan } from 'typeorm';

/** The platform console: every shop with its plan, state and usage; onboarding. */
export function createPlatformService(deps: { db: Database; clock: Clock; billing: BillingService; staff: StaffService }) {
  const { db, clock, billing, staff } = deps;

  return {
    /** Shops with plan, billing state, seats used, catalogue size and last activity; searched and filtered. */
    async listShops(query: PlatformShopListQuery): Promise<PlatformShop[]> {
      await billing.refreshAll();
      const now = clock.now();
      const shops = await db.reader.find(ShopEntity, { order: { name: 'ASC' } });
      const plans = new Map((await db.reader.find(PlanEntity)).map((p) => [p.id, p]));
      const records = new Map((await db.reader.find(ShopBillingEntity)).map((b) => [b.shopId, b]));
      const grants = await db.reader.find(SupportGrantEntity, { where: { revokedAt: IsNull(), expiresAt: MoreThan(now) } });
      const lastActivity = new Map(
        (
          await db.reader
            .createQueryBuilder()
            .select(['a.shop_id AS shopId', 'MAX(a.created_at) AS at'])
            .from(AuditEventEntity, 'a')
            .where('a.shop_id IS NOT NULL')
            .groupBy('a.shop_id')
            .getRawMany<{ shopId: string; at: string }>()
        ).map((r) => [r.shopId, r.at]),
      );
      const q = query.q?.toLowerCase();
      const rows: PlatformShop[] = [];
      for (const shop of shops) {
        if (q && !shop.name.toLowerCase().includes(q) && !shop.slug.includes(q)) continue;
        if (query.state && shop.billingState !== query.state) continue;
        const record = records.get(shop.id) ?? defaultBilling(shop.id, shop.createdAt);
        if (query.planId && record.planId !== query.planId) continue;
        const plan = record.planId ? plans.get(record.planId) : undefined;
        const last = lastActivity.get(shop.id);
        const grant = grants.filter((g) => g.shopId === shop.id).sort((a, b) => b.expiresAt.getTime() - a.expiresAt.getTime())[0];
        rows.push({
          id: shop.id,
          name: shop.name,
          slug: shop.slug,
          plan: plan ? { id: plan.id, name: plan.name } : null,
          billingState: shop.billingState,
          manualSuspensionReason: record.manualSuspensionReason,
          seatsUsed: await seatsUsed(db.reader, shop.id, now),
          seatLimit: plan?.seatLimit ?? null,
          catalogueSize: await catalogueSize(db.reader, shop.id),
          catalogueLimit: plan?.catalogueLimit ?? null,
          lastActivityAt: last ? new Date(last.includes('T') || last.endsWith('Z') ? last : `${last.replace(' ', 'T')}Z`).toISOString() : null,
          trialEndsAt: shop.billingState === 'trial' ? record.trialEndsAt.toISOString() : null,
          supportAccessUntil: grant?.expiresAt.toISOString() ?? null,
          createdAt: shop.createdAt.toISOString(),
        });
      }
      return rows;
    },

    /**
     * Onboards a shop: creates it on the chosen plan with a fresh trial and its owner's
     * invitation in one write, so a shop never exists without the way in for its owner (a failed
     * invitation used to leave an ownerless shop, and trying again made a second one). The
     * e-mail goes after the commit, like every invitation. A new shop has sent nothing yet, so its
     * invitation allowance is not checked.
     */
    async onboard(input: OnboardShopRequest, actor: AuditActor & { userId: string | null; name: string | null }): Promise<PlatformShop> {
      const now = clock.now();
      const { shop, invitation } = await db.write(async (manager) => {
        const plan = await manager.findOne(PlanEntity, { where: { id: input.planId, isActive: true } });
        if (!plan) throw notFound('No such plan.');
        const created = await insertShop(manager, { name: input.name, at: now, actor });
        await saveBilling(manager, { ...defaultBilling(created.id, now), planId: plan.id });
        return { shop: created, invitation: await staff.inviteWithin(manager, created, { email: input.ownerEmail, role: 'owner' }, actor, now) };
      });
      invitation.send();
      const [row] = await this.listShops({ q: shop.slug });
      if (!row) throw notFound('No such shop.');
      return row;
    },
  };
}

export type PlatformService = ReturnType<typeof createPlatformService>;
