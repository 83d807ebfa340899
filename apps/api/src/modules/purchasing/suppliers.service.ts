import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import {
  defaultPurchasingSettings,
  defaultShopSettings,
  type Listing,
  type listingInputSchema,
  type listingUpdateSchema,
  type partPurchasingSchema,
  type PurchasingSettings,
  type purchasingSettingsUpdateSchema,
  type Supplier,
  type supplierInputSchema,
  type supplierUpdateSchema,
} from '@tappet/contracts';
import { shopScoped } from '../../db/tenant-repository';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { HttpError, notFound } from '../../lib/http-error';
import { diffChanges, recordAudit, type AuditActor } from '../audit/audit.service';
import { PartEntity, type PartRow } from '../catalogue/catalogue.entity';
import { ShopSettingsEntity } from '../settings/settings.entity';
import { ListingEntity, PartPurchasingEntity, PurchasingSettingsEntity, SupplierEntity, type ListingRow, type PartPurchasingRow, type SupplierRow } from './purchasing.entity';

export type SupplierCreate = z.output<typeof supplierInputSchema>;
export type SupplierPatch = z.output<typeof supplierUpdateSchema>;
export type ListingCreate = z.output<typeof listingInputSchema>;
export type ListingPatch = z.output<typeof listingUpdateSchema>;

export const noSuchSupplier = () => notFound('No such supplier in this shop.');
export const noSuchPart = () => notFound('No such part in this shop.');
const noSuchListing = () => notFound('No such listing in this shop.');
const conflict = (message: string) => new HttpError(409, 'conflict', message);
const iso = (d: Date | string | null) => (d === null ? null : new Date(d).toISOString());
/** Supplier names compare without case and repeated spaces. */
export const nameKeyOf = (name: string) => name.trim().replace(/\s+/g, ' ').toLowerCase();

/** Audit changes of a new record: every field with a value, from null. */
export function created(fields: Record<string, unknown>) {
  return Object.fromEntries(Object.entries(fields).flatMap(([k, v]) => (v == null ? [] : [[k, { before: null, after: v }]])));
}

/** The shop's currency (settings, or the default while the shop has none). */
export async function shopCurrencyOf(manager: EntityManager, shopId: string): Promise<string> {
  const row = await manager.findOne(ShopSettingsEntity, { where: { shopId } });
  return row?.currency ?? defaultShopSettings.currency;
}

/** A supplier of the shop, or 404. */
export async function supplierOf(manager: EntityManager, shopId: string, supplierId: string): Promise<SupplierRow> {
  const row = await shopScoped(manager, SupplierEntity, shopId).findOne({ id: supplierId });
  if (!row) throw noSuchSupplier();
  return row;
}

/** A part of the shop, or 404. */
export async function partOf(manager: EntityManager, shopId: string, partId: string): Promise<PartRow> {
  const row = await shopScoped(manager, PartEntity, shopId).findOne({ id: partId });
  if (!row) throw noSuchPart();
  return row;
}

function toListing(row: ListingRow, supplier: SupplierRow, part: PartRow, preferred: boolean, shopCurrency: string): Listing {
  return {
    id: row.id,
    supplierId: row.supplierId,
    supplierName: supplier.name,
    currency: supplier.currency,
    partId: row.partId,
    partNumber: part.number,
    partDescription: part.description,
    supplierNumber: row.supplierNumber,
    priceMinor: row.priceMinor,
    packSize: row.packSize,
    minOrderQty: row.minOrderQty,
    leadTimeDays: row.leadTimeDays,
    lastPaidUnitMinor: row.lastPaidUnitMinor,
    lastPaidAt: iso(row.lastPaidAt),
    shopCurrency,
    preferred,
  };
}

/**
 * Suppliers, their listings of parts, per-part purchasing choices and the reorder list's own
 * settings. Every write is audited in its transaction; every id is looked up within the shop.
 */
export function createSuppliersService(deps: { db: Database; clock: Clock }) {
  const { db, clock } = deps;

  async function counts(shopId: string) {
    const listings = await db.reader.query<Array<{ id: string; n: number }>>(`SELECT supplier_id AS id, COUNT(*) AS n FROM supplier_listings WHERE shop_id = ? GROUP BY supplier_id`, [shopId]);
    const orders = await db.reader.query<Array<{ id: string; n: number }>>(
      `SELECT supplier_id AS id, COUNT(*) AS n FROM purchase_orders WHERE shop_id = ? AND status IN ('draft', 'awaiting_approval', 'approved', 'sent', 'partly_received') GROUP BY supplier_id`,
      [shopId],
    );
    return { listings: new Map(listings.map((r) => [r.id, Number(r.n)])), orders: new Map(orders.map((r) => [r.id, Number(r.n)])) };
  }

  function toSupplier(row: SupplierRow, c: Awaited<ReturnType<typeof counts>>): Supplier {
    return {
      id: row.id,
      name: row.name,
      email: row.email,
      currency: row.currency,
      leadTimeDays: row.leadTimeDays,
      leadTimeSdDays: row.leadTimeSdDays,
      minOrderValueMinor: row.minOrderValueMinor,
      notes: row.notes,
      active: Boolean(row.active),
      listingCount: c.listings.get(row.id) ?? 0,
      openOrderCount: c.orders.get(row.id) ?? 0,
      createdAt: new Date(row.createdAt).toISOString(),
      updatedAt: new Date(row.updatedAt).toISOString(),
    };
  }

  async function preferredOf(manager: EntityManager, shopId: string, partIds: string[]): Promise<Map<string, PartPurchasingRow>> {
    if (partIds.length === 0) return new Map();
    const rows = await manager.getRepository(PartPurchasingEntity).createQueryBuilder('p').where('p.shop_id = :shopId', { shopId }).andWhere('p.part_id IN (:...ids)', { ids: partIds }).getMany();
    return new Map(rows.map((r) => [r.partId, r]));
  }

  async function listingsWhere(shopId: string, where: { supplierId?: string; partId?: string; id?: string }): Promise<Listing[]> {
    const rows = await shopScoped(db.reader, ListingEntity, shopId).find(where);
    if (rows.length === 0) return [];
    const suppliers = new Map((await shopScoped(db.reader, SupplierEntity, shopId).find()).map((s) => [s.id, s]));
    const partIds = [...new Set(rows.map((r) => r.partId))];
    const parts = new Map(
      (await db.reader.getRepository(PartEntity).createQueryBuilder('p').where('p.shop_id = :shopId', { shopId }).andWhere('p.id IN (:...ids)', { ids: partIds }).getMany()).map((p) => [p.id, p]),
    );
    const preferred = await preferredOf(db.reader, shopId, partIds);
    const shopCurrency = await shopCurrencyOf(db.reader, shopId);
    return rows
      .map((r) => toListing(r, suppliers.get(r.supplierId)!, parts.get(r.partId)!, preferred.get(r.partId)?.preferredSupplierId === r.supplierId, shopCurrency))
      .sort((a, b) => a.partNumber.localeCompare(b.partNumber) || a.supplierName.localeCompare(b.supplierName));
  }

  return {
    async list(shopId: string): Promise<Supplier[]> {
      const rows = await shopScoped(db.reader, SupplierEntity, shopId).find({}, { nameKey: 'ASC' });
      const c = await counts(shopId);
      return rows.map((r) => toSupplier(r, c));
    },

    async get(shopId: string, supplierId: string): Promise<Supplier> {
      return toSupplier(await supplierOf(db.reader, shopId, supplierId), await counts(shopId));
    },

    /** Adds a supplier; a name already used in the shop (any case) is a 409. */
    async create(shopId: string, input: SupplierCreate, actor: AuditActor): Promise<Supplier> {
      const row = await db.write(async (manager) => {
        const nameKey = nameKeyOf(input.name);
        if (await shopScoped(manager, SupplierEntity, shopId).findOne({ nameKey })) throw conflict(`There is already a supplier called ${input.name}.`);
        const now = clock.now();
        const r: SupplierRow = { id: randomUUID(), shopId, nameKey, ...input, active: true, createdAt: now, updatedAt: now };
        await manager.insert(SupplierEntity, r);
        await recordAudit(manager, { shopId, actor, action: 'supplier.created', entity: 'supplier', entityId: r.id, changes: created({ ...input }), at: now });
        return r;
      });
      return this.get(shopId, row.id);
    },

    async update(shopId: string, supplierId: string, patch: SupplierPatch, actor: AuditActor): Promise<Supplier> {
      await db.write(async (manager) => {
        const before = await supplierOf(manager, shopId, supplierId);
        const next: Partial<SupplierRow> = { ...patch };
        if (patch.name !== undefined) {
          next.nameKey = nameKeyOf(patch.name);
          const clash = await shopScoped(manager, SupplierEntity, shopId).findOne({ nameKey: next.nameKey });
          if (clash && clash.id !== supplierId) throw conflict(`There is already a supplier called ${patch.name}.`);
        }
        const { nameKey: _k, ...visible } = next;
        const changes = diffChanges(before, visible);
        if (Object.keys(changes).length === 0) return;
        await manager.update(SupplierEntity, { shopId, id: supplierId }, { ...next, updatedAt: clock.now() });
        await recordAudit(manager, { shopId, actor, action: 'supplier.updated', entity: 'supplier', entityId: supplierId, changes, at: clock.now() });
      });
      return this.get(shopId, supplierId);
    },

    listings: listingsWhere,

    /** Adds a supplier's listing of a part; the same supplier and part twice is a 409. */
    async createListing(shopId: string, supplierId: string, input: ListingCreate, actor: AuditActor): Promise<Listing> {
      const id = await db.write(async (manager) => {
        await supplierOf(manager, shopId, supplierId);
        await partOf(manager, shopId, input.partId);
        if (await shopScoped(manager, ListingEntity, shopId).findOne({ supplierId, partId: input.partId })) throw conflict('This supplier already lists that part: change that listing instead.');
        const now = clock.now();
        const row: ListingRow = { id: randomUUID(), shopId, supplierId, ...input, lastPaidUnitMinor: null, lastPaidAt: null, createdAt: now, updatedAt: now };
        await manager.insert(ListingEntity, row);
        await recordAudit(manager, { shopId, actor, action: 'supplier_listing.created', entity: 'supplier_listing', entityId: row.id, changes: created({ supplier: supplierId, ...input }), at: now });
        return row.id;
      });
      return (await listingsWhere(shopId, { id }))[0]!;
    },

    async updateListing(shopId: string, listingId: string, patch: ListingPatch, actor: AuditActor): Promise<Listing> {
      await db.write(async (manager) => {
        const before = await shopScoped(manager, ListingEntity, shopId).findOne({ id: listingId });
        if (!before) throw noSuchListing();
        const changes = diffChanges(before, patch);
        if (Object.keys(changes).length === 0) return;
        await manager.update(ListingEntity, { shopId, id: listingId }, { ...patch, updatedAt: clock.now() });
        await recordAudit(manager, { shopId, actor, action: 'supplier_listing.updated', entity: 'supplier_listing', entityId: listingId, changes, at: clock.now() });
      });
      return (await listingsWhere(shopId, { id: listingId }))[0]!;
    },

    async deleteListing(shopId: string, listingId: string, actor: AuditActor): Promise<void> {
      await db.write(async (manager) => {
        const before = await shopScoped(manager, ListingEntity, shopId).findOne({ id: listingId });
        if (!before) throw noSuchListing();
        await manager.delete(ListingEntity, { shopId, id: listingId });
        await recordAudit(manager, { shopId, actor, action: 'supplier_listing.deleted', entity: 'supplier_listing', entityId: listingId, changes: { supplier: { before: before.supplierId, after: null }, part: { before: before.partId, after: null } }, at: clock.now() });
      });
    },

    /** A part's purchasing choices with every supplier's listing of it. */
    async partPurchasing(shopId: string, partId: string) {
      await partOf(db.reader, shopId, partId);
      const row = await shopScoped(db.reader, PartPurchasingEntity, shopId).findOne({ partId });
      return { partId, preferredSupplierId: row?.preferredSupplierId ?? null, minQty: row?.minQty ?? null, maxQty: row?.maxQty ?? null, listings: await listingsWhere(shopId, { partId }) };
    },

    /** Sets the preferred supplier (which must be in the shop) and the manual min/max of a part. */
    async setPartPurchasing(shopId: string, partId: string, input: z.output<typeof partPurchasingSchema>, actor: AuditActor) {
      await db.write(async (manager) => {
        await partOf(manager, shopId, partId);
        if (input.preferredSupplierId) await supplierOf(manager, shopId, input.preferredSupplierId);
        const before = await shopScoped(manager, PartPurchasingEntity, shopId).findOne({ partId });
        const now = clock.now();
        const changes = diffChanges(before ?? { preferredSupplierId: null, minQty: null, maxQty: null }, input);
        if (Object.keys(changes).length === 0) return;
        if (before) await manager.update(PartPurchasingEntity, { shopId, partId }, { ...input, updatedAt: now });
        else await manager.insert(PartPurchasingEntity, { shopId, partId, ...input, updatedAt: now });
        await recordAudit(manager, { shopId, actor, action: 'part_purchasing.updated', entity: 'part', entityId: partId, changes, at: now });
      });
      return this.partPurchasing(shopId, partId);
    },

    async settings(shopId: string): Promise<PurchasingSettings> {
      const row = await db.reader.findOne(PurchasingSettingsEntity, { where: { shopId } });
      return row ? { demandWindowDays: row.demandWindowDays, deadStockDays: row.deadStockDays } : { ...defaultPurchasingSettings };
    },

    async updateSettings(shopId: string, patch: z.output<typeof purchasingSettingsUpdateSchema>, actor: AuditActor): Promise<PurchasingSettings> {
      await db.write(async (manager) => {
        const row = await manager.findOne(PurchasingSettingsEntity, { where: { shopId } });
        const before = row ? { demandWindowDays: row.demandWindowDays, deadStockDays: row.deadStockDays } : { ...defaultPurchasingSettings };
        const changes = diffChanges(before, patch);
        if (Object.keys(changes).length === 0) return;
        const next = { ...before, ...patch, shopId, updatedAt: clock.now() };
        if (row) await manager.update(PurchasingSettingsEntity, { shopId }, next);
        else await manager.insert(PurchasingSettingsEntity, next);
        await recordAudit(manager, { shopId, actor, action: 'purchasing_settings.updated', entity: 'purchasing_settings', entityId: shopId, changes, at: clock.now() });
      });
      return this.settings(shopId);
    },
  };
}

export type SuppliersService = ReturnType<typeof createSuppliersService>;
