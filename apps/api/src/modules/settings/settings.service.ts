import { defaultShopSettings, type ShopSettings, type UpdateShopSettingsRequest } from '@tappet/contracts';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { diffChanges, recordAudit, type AuditActor } from '../audit/audit.service';
import { ShopEntity, type Shop } from '../shops/shops.entity';
import { ShopSettingsEntity, type ShopSettingsRow } from './settings.entity';

const toMilli = (n: number) => Math.round(n * 1000);
const fromMilli = (n: number) => n / 1000;

/** The API view of a settings row (or of the defaults, when the shop has none yet). */
export function toShopSettings(shop: Shop, row: ShopSettingsRow | null): ShopSettings {
  if (!row) return { name: shop.name, ...defaultShopSettings };
  return {
    name: shop.name,
    address: row.address,
    currency: row.currency,
    distanceUnit: row.distanceUnit as ShopSettings['distanceUnit'],
    pressureUnit: row.pressureUnit as ShopSettings['pressureUnit'],
    taxRatePercent: fromMilli(row.taxRateMilliPercent),
    labourRateMinorPerHour: row.labourRateMinorPerHour,
    serviceLevel: fromMilli(row.serviceLevelMilli),
    orderingCostMinor: row.orderingCostMinor,
    holdingCostRatePercent: fromMilli(row.holdingCostRateMilliPercent),
    labelSheetFormat: row.labelSheetFormat as ShopSettings['labelSheetFormat'],
  };
}

function toRow(shopId: string, s: ShopSettings, at: Date): ShopSettingsRow {
  return {
    shopId,
    address: s.address,
    currency: s.currency,
    distanceUnit: s.distanceUnit,
    pressureUnit: s.pressureUnit,
    taxRateMilliPercent: toMilli(s.taxRatePercent),
    labourRateMinorPerHour: s.labourRateMinorPerHour,
    serviceLevelMilli: toMilli(s.serviceLevel),
    orderingCostMinor: s.orderingCostMinor,
    holdingCostRateMilliPercent: toMilli(s.holdingCostRatePercent),
    labelSheetFormat: s.labelSheetFormat,
    updatedAt: at,
  };
}

/** Shop settings: read with defaults, change with an audited before/after. */
export function createSettingsService(deps: { db: Database; clock: Clock }) {
  const { db, clock } = deps;
  return {
    async get(shop: Shop): Promise<ShopSettings> {
      return toShopSettings(shop, await db.reader.findOne(ShopSettingsEntity, { where: { shopId: shop.id } }));
    },

    /**
     * Applies a partial change. The currency may change freely for now; once money is recorded
     * (purchasing, invoices) a change will be refused here.
     */
    async update(shopId: string, patch: UpdateShopSettingsRequest, actor: AuditActor): Promise<ShopSettings> {
      return db.write(async (manager) => {
        // Read under the lock, so that two changes cannot both start from the same "before".
        const shop = await manager.findOneOrFail(ShopEntity, { where: { id: shopId } });
        const row = await manager.findOne(ShopSettingsEntity, { where: { shopId } });
        const before = toShopSettings(shop, row);
        const after: ShopSettings = { ...before, ...patch };
        const changes = diffChanges(before, patch);
        if (Object.keys(changes).length === 0) return before;
        const now = clock.now();
        if (after.name !== shop.name) await manager.update(ShopEntity, { id: shopId }, { name: after.name });
        await manager.save(ShopSettingsEntity, toRow(shopId, after, now));
        await recordAudit(manager, { shopId, actor, action: 'settings.updated', entity: 'settings', entityId: shopId, changes, at: now });
        return after;
      });
    },
  };
}

export type SettingsService = ReturnType<typeof createSettingsService>;
