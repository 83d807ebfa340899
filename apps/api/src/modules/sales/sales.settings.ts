import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { SalesSettings, TaxRate, UpdateSalesSettings } from '@tappet/contracts';
import { defaultShopSettings } from '@tappet/contracts';
import type { TaxRounding } from '@tappet/domain';
import { recordAudit, type AuditActor } from '../audit/audit.service';
import { pricingRulesFor } from './pricing.service';

// The shop's sales settings: pricing rules (JSON in sales_settings), the tax rounding policy
// (decision 015; per-line by default), and tax rates. The standard rate is the shop settings'
// taxRatePercent (edited on the shop settings screen); extra named rates (e.g. a reduced or zero
// rate) live in sales_tax_rates.

export const standardRateId = 'standard';

/** A Date as TypeORM stores datetimes in SQLite (UTC text), for raw statements. */
export const sqlTime = (d: Date) => d.toISOString().replace('T', ' ').replace('Z', '');

export interface ShopSalesBasics {
  shopName: string;
  shopAddress: string;
  currency: string;
  standardTaxRatePercent: number;
  labourRateMinorPerHour: number;
}

export async function shopBasics(manager: EntityManager, shopId: string): Promise<ShopSalesBasics> {
  const [row] = await manager.query<Array<{ name: string; address: string | null; currency: string | null; tax: number | null; labour: number | null }>>(
    `SELECT s.name, ss.address, ss.currency, ss.tax_rate_milli_percent AS tax, ss.labour_rate_minor_per_hour AS labour
     FROM shops s LEFT JOIN shop_settings ss ON ss.shop_id = s.id WHERE s.id = ?`,
    [shopId],
  );
  return {
    shopName: row?.name ?? '',
    shopAddress: row?.address ?? '',
    currency: row?.currency ?? defaultShopSettings.currency,
    standardTaxRatePercent: row?.tax === null || row?.tax === undefined ? defaultShopSettings.taxRatePercent : Number(row.tax) / 1000,
    labourRateMinorPerHour: row?.labour === null || row?.labour === undefined ? defaultShopSettings.labourRateMinorPerHour : Number(row.labour),
  };
}

export async function taxRoundingFor(manager: EntityManager, shopId: string): Promise<TaxRounding> {
  const [row] = await manager.query<Array<{ rounding: TaxRounding }>>(`SELECT tax_rounding AS rounding FROM sales_settings WHERE shop_id = ?`, [shopId]);
  return row?.rounding ?? 'per-line';
}

export async function taxRatesFor(manager: EntityManager, shopId: string, standardPercent?: number): Promise<TaxRate[]> {
  const standard = standardPercent ?? (await shopBasics(manager, shopId)).standardTaxRatePercent;
  const extra = await manager.query<Array<{ id: string; name: string; rate: number }>>(`SELECT id, name, rate_percent AS rate FROM sales_tax_rates WHERE shop_id = ? ORDER BY position`, [shopId]);
  return [{ id: standardRateId, name: 'Standard', ratePercent: standard, isDefault: true }, ...extra.map((r) => ({ id: r.id, name: r.name, ratePercent: Number(r.rate), isDefault: false }))];
}

export async function salesSettingsOf(manager: EntityManager, shopId: string): Promise<SalesSettings> {
  const basics = await shopBasics(manager, shopId);
  const [row] = await manager.query<Array<{ updatedAt: string }>>(`SELECT updated_at AS updatedAt FROM sales_settings WHERE shop_id = ?`, [shopId]);
  return {
    pricingRules: (await pricingRulesFor(manager, shopId)) as SalesSettings['pricingRules'],
    taxRounding: await taxRoundingFor(manager, shopId),
    taxRates: await taxRatesFor(manager, shopId, basics.standardTaxRatePercent),
    currency: basics.currency,
    labourRateMinorPerHour: basics.labourRateMinorPerHour,
    updatedAt: row ? new Date(row.updatedAt.includes('T') ? row.updatedAt : `${row.updatedAt.replace(' ', 'T')}Z`).toISOString() : null,
  };
}

/** Saves a change to the sales settings (inside the caller's write) with an audit event. */
export async function saveSalesSettings(manager: EntityManager, shopId: string, input: UpdateSalesSettings, actor: AuditActor, at: Date): Promise<void> {
  const before = await salesSettingsOf(manager, shopId);
  const rules = input.pricingRules ?? before.pricingRules;
  const rounding = input.taxRounding ?? before.taxRounding;
  const [exists] = await manager.query<Array<{ n: number }>>(`SELECT COUNT(*) AS n FROM sales_settings WHERE shop_id = ?`, [shopId]);
  if (Number(exists?.n ?? 0) > 0) {
    await manager.query(`UPDATE sales_settings SET pricing_rules = ?, tax_rounding = ?, updated_at = ? WHERE shop_id = ?`, [JSON.stringify(rules), rounding, sqlTime(at), shopId]);
  } else {
    await manager.query(`INSERT INTO sales_settings (shop_id, pricing_rules, tax_rounding, updated_at) VALUES (?, ?, ?, ?)`, [shopId, JSON.stringify(rules), rounding, sqlTime(at)]);
  }
  const changes: Record<string, { before: unknown; after: unknown }> = {};
  if (input.pricingRules) changes['pricingRules'] = { before: before.pricingRules, after: rules };
  if (input.taxRounding) changes['taxRounding'] = { before: before.taxRounding, after: rounding };
  if (input.extraTaxRates) {
    await manager.query(`DELETE FROM sales_tax_rates WHERE shop_id = ?`, [shopId]);
    let position = 0;
    for (const rate of input.extraTaxRates) {
      await manager.query(`INSERT INTO sales_tax_rates (id, shop_id, name, rate_percent, position) VALUES (?, ?, ?, ?, ?)`, [randomUUID(), shopId, rate.name, rate.ratePercent, position++]);
    }
    changes['extraTaxRates'] = { before: before.taxRates.filter((r) => !r.isDefault).map((r) => `${r.name} ${r.ratePercent}%`), after: input.extraTaxRates.map((r) => `${r.name} ${r.ratePercent}%`) };
  }
  await recordAudit(manager, { shopId, actor, action: 'sales.settings_updated', entity: 'sales_settings', entityId: shopId, changes, at });
}
