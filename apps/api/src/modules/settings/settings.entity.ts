import { EntitySchema } from 'typeorm';

/**
 * A shop's settings row (absent until first changed: defaults apply). Rates are stored as
 * integers in thousandths so that "20.125 %" survives without binary rounding.
 */
export interface ShopSettingsRow {
  shopId: string;
  address: string;
  currency: string;
  distanceUnit: string;
  pressureUnit: string;
  taxRateMilliPercent: number;
  labourRateMinorPerHour: number;
  serviceLevelMilli: number;
  orderingCostMinor: number;
  holdingCostRateMilliPercent: number;
  labelSheetFormat: string;
  updatedAt: Date;
}

export const ShopSettingsEntity = new EntitySchema<ShopSettingsRow>({
  name: 'ShopSettings',
  tableName: 'shop_settings',
  columns: {
    shopId: { type: 'varchar', length: 36, name: 'shop_id', primary: true },
    address: { type: 'varchar', length: 500 },
    currency: { type: 'varchar', length: 3 },
    distanceUnit: { type: 'varchar', length: 2, name: 'distance_unit' },
    pressureUnit: { type: 'varchar', length: 3, name: 'pressure_unit' },
    taxRateMilliPercent: { type: 'integer', name: 'tax_rate_milli_percent' },
    labourRateMinorPerHour: { type: 'integer', name: 'labour_rate_minor_per_hour' },
    serviceLevelMilli: { type: 'integer', name: 'service_level_milli' },
    orderingCostMinor: { type: 'integer', name: 'ordering_cost_minor' },
    holdingCostRateMilliPercent: { type: 'integer', name: 'holding_cost_rate_milli_percent' },
    labelSheetFormat: { type: 'varchar', length: 20, name: 'label_sheet_format' },
    updatedAt: { type: 'datetime', name: 'updated_at' },
  },
});
