import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { ShopDetail, ShopRole, ShopSummary } from '@tappet/contracts';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { recordAudit, diffChanges, type AuditActor } from '../audit/audit.service';
import { MembershipEntity, ShopEntity, type Shop } from './shops.entity';

/** The public view of a shop. */
export function toShopDetail(shop: Shop): ShopDetail {
  return { id: shop.id, name: shop.name, slug: shop.slug, createdAt: shop.createdAt.toISOString() };
}

/** A URL-safe slug from a name ("Harbour Works" → "harbour-works"). */
export function slugify(name: string): string {
  const slug = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 80);
  return slug || 'shop';
}

/** Creates a shop inside a write; its slug is made unique by a suffix when needed. */
export async function insertShop(manager: EntityManager, input: { name: string; slug?: string; at: Date; actor: AuditActor }): Promise<Shop> {
  const base = input.slug ?? slugify(input.name);
  let slug = base;
  for (let n = 2; await manager.exists(ShopEntity, { where: { slug } }); n++) slug = `${base}-${n}`;
  const shop: Shop = { id: randomUUID(), name: input.name, slug, billingState: 'trial', createdAt: input.at };
  await manager.insert(ShopEntity, shop);
  await recordAudit(manager, { shopId: shop.id, actor: input.actor, action: 'shop.created', entity: 'shop', entityId: shop.id, changes: { name: { before: null, after: shop.name } }, at: input.at });
  return shop;
}

/** Adds a person to a shop with a role, inside a write. */
export async function insertMembership(
  manager: EntityManager,
  input: { shopId: string; userId: string; role: ShopRole; spendingLimitMinor?: number | null; at: Date; actor: AuditActor },
): Promise<void> {
  const id = randomUUID();
  await manager.insert(MembershipEntity, { id, shopId: input.shopId, userId: input.userId, role: input.role, spendingLimitMinor: input.spendingLimitMinor ?? null, isActive: true, createdAt: input.at });
  await recordAudit(manager, {
    shopId: input.shopId,
    actor: input.actor,
    action: 'membership.created',
    entity: 'membership',
    entityId: id,
    changes: { userId: { before: null, after: input.userId }, role: { before: null, after: input.role } },
    at: input.at,
  });
}

export function createShopsService(deps: { db: Database; clock: Clock }) {
  const { db, clock } = deps;
  return {
    /** The shops a person is an active member of, with their role, by name. */
    async listForUser(userId: string): Promise<ShopSummary[]> {
      return db.reader
        .createQueryBuilder()
        .select(['s.id AS id', 's.name AS name', 'm.role AS role'])
        .from(MembershipEntity, 'm')
        .innerJoin(ShopEntity.options.name, 's', 's.id = m.shop_id')
        .where('m.user_id = :userId AND m.is_active = 1', { userId })
        .orderBy('s.name', 'ASC')
        .getRawMany<ShopSummary>();
    },

    /** Renames a shop (the caller has checked permission). Audited with the changed fields. */
    async update(shop: Shop, patch: { name: string }, actor: AuditActor): Promise<Shop> {
      const changes = diffChanges(shop, patch);
      if (Object.keys(changes).length === 0) return shop;
      await db.write(async (manager) => {
        await manager.update(ShopEntity, { id: shop.id }, { name: patch.name });
        await recordAudit(manager, { shopId: shop.id, actor, action: 'shop.updated', entity: 'shop', entityId: shop.id, changes, at: clock.now() });
      });
      return { ...shop, ...patch };
    },
  };
}

export type ShopsService = ReturnType<typeof createShopsService>;
